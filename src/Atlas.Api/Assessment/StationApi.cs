using Atlas.Hindcast.Stations;

namespace Atlas.Api.Assessment;

/// <summary><c>/api/v1/stations</c>: the measuring stations whose records validate the hindcasts.</summary>
public static class StationApi
{
    public static IEndpointRouteBuilder MapStationApi(this IEndpointRouteBuilder routes) =>
        routes.MapReferenceRegistry<StationRegistered>("/api/v1/stations", "Stations", "station", ListAsync, DescribeAsync, AddAsync, DeleteAsync, "text/csv", "application/x-netcdf");

    [EndpointName("ListStations")]
    [EndpointSummary("The registered measuring stations")]
    public static async Task<Ok<StationList>> ListAsync(NpgsqlDataSource dataSource, CancellationToken cancel) =>
        TypedResults.Ok(new StationList([.. (await new StationStore(dataSource).ListAsync(cancel)).Select(StationItem.From)], AtlasCaution.Text));

    [EndpointName("DescribeStation")]
    [EndpointSummary("One station, by name or slug")]
    public static async Task<Results<Ok<StationItem>, ProblemHttpResult>> DescribeAsync(string station, NpgsqlDataSource dataSource, CancellationToken cancel) =>
        await new StationStore(dataSource).FindAsync(station, cancel) is { } found ? TypedResults.Ok(StationItem.From(found)) : ApiProblems.UnknownStation(station);

    [EndpointName("AddStation")]
    [EndpointSummary("Register a station with its record (needs X-Api-Key)")]
    [EndpointDescription(
        "multipart/form-data with the record in the part 'file', or the record as a text/csv body; the description in form fields or " +
        "query values: name, lat, lon (degrees), depth_m (optional), instrument, role (calibration or validation), file_name (body uploads). " +
        "The record is CSV with the header time,hs_m[,tp_s][,te_s][,dir_deg][,qc] in any order: time ISO 8601 UTC (2021-01-01T03:00:00Z), " +
        "Hs in m, periods in s, the direction waves come from in degrees true, qc 0 for a good row (other values are kept and counted " +
        "as flagged); or a CF-NetCDF point time series (featureType timeSeries), whose stated position may replace lat and lon. " +
        "Every bad row is reported with its line number (or variable and index) and nothing is stored. Loading the same file under the same name " +
        "again changes nothing (200); a new station answers 201.")]
    public static async Task<IResult> AddAsync(HttpRequest request, [FromKeyedServices(AtlasDataSources.Writer)] NpgsqlDataSource dataSource, CancellationToken cancel)
    {
        var (upload, problem) = await UploadReader.ReadAsync(request, "station.csv", cancel);
        if (upload is null) return problem!;

        var errors = new QueryErrors();
        var name = upload.Name("station's", errors);
        // A CF-NetCDF record may state the station position itself; a CSV record cannot.
        var positionRequired = !StationFileReader.IsNetCdf(upload.Content);
        var latitude = upload.Number("lat", -90, 90, "the latitude in degrees north, -90..90", errors, required: positionRequired);
        var longitude = upload.Number("lon", -180, 180, "the longitude in degrees east, -180..180", errors, required: positionRequired);
        var depth = upload.Number("depth_m", 0, StationLoader.MaximumDepthMetres, "the water depth in metres, above 0", errors, required: false);
        if (depth is 0) errors.Add("depth_m", "depth_m must be above 0 m; leave it out when unknown.");
        var instrument = upload.Field("instrument")?.Trim();
        if (instrument is null) errors.Add("instrument", "instrument is required: the kind of instrument (e.g. directional wave buoy).");
        if (!StationStore.TryParseRole(upload.Field("role"), out var role))
            errors["role"] = [$"role {(upload.Field("role") is { } r ? $"'{r}' " : "")}must be calibration (used to tune the hindcast) or validation (kept aside)."];
        if (errors.Count > 0) return TypedResults.ValidationProblem(errors, title: "The station description has invalid fields");

        // The one registration path (the command line's too): same formats, same checks, one transaction.
        var described = new StationLoadRequest(name!, latitude, longitude, depth, instrument!, role, upload.FileName);
        try
        {
            var loaded = await new StationLoader(dataSource).LoadAsync(described, upload.Content, cancel);
            var result = new StationRegistered(StationItem.From(loaded.Station), loaded.AlreadyRegistered, loaded.Content.MissingHsCount, AtlasCaution.Text);
            return Upload.Registered(loaded.AlreadyRegistered, $"/api/v1/stations/{loaded.Station.Slug}", result);
        }
        catch (CsvInputException e)
        {
            return upload.Refused("station record", [.. e.Errors.Select(x => x.ToString())], "error");
        }
        catch (StationFileException e)
        {
            return upload.Refused("station record", e.Problems, "problem");
        }
        catch (ArgumentException e)
        {
            // The loader names the description field at fault; the message goes under its query name.
            var field = e.ParamName switch
            {
                nameof(StationLoadRequest.Latitude) => "lat",
                nameof(StationLoadRequest.Longitude) => "lon",
                nameof(StationLoadRequest.DepthMetres) => "depth_m",
                nameof(StationLoadRequest.Instrument) => "instrument",
                nameof(StationLoadRequest.Name) => "name",
                _ => "file",
            };
            return TypedResults.ValidationProblem(new Dictionary<string, string[]> { [field] = [e.Message.Split(" (Parameter")[0]] },
                title: "The station description does not fit its record; nothing was stored");
        }
        catch (DuplicateStationException e)
        {
            return ApiProblems.Conflict("The station conflicts with a registered one", e.Message);
        }
    }

    [EndpointName("DeleteStation")]
    [EndpointSummary("Remove a station and its record (needs X-Api-Key)")]
    public static async Task<Results<NoContent, ProblemHttpResult>> DeleteAsync(string station, [FromKeyedServices(AtlasDataSources.Writer)] NpgsqlDataSource dataSource, CancellationToken cancel) =>
        await new StationStore(dataSource).DeleteAsync(station, cancel) ? TypedResults.NoContent() : ApiProblems.UnknownStation(station);

}
