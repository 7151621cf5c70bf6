using Atlas.WavePhysics;

namespace Atlas.Api.Apis;

/// <summary><c>GET /api/v1/datasets/{slug}/point/series</c>: the time series of the nearest wet cell, streamed.</summary>
public static class PointSeriesApi
{
    public static RouteHandlerBuilder MapPointSeries(this RouteGroupBuilder group) =>
        group.MapGet("/point/series", SeriesAsync)
            .ProducesFile("text/csv", "application/json", "application/x-netcdf", CsvwMetadataWriter.MediaType)
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();

    [EndpointName("PointSeries")]
    [EndpointSummary("The time series (time, hs, te, tp, dir, spread, j) of the wet cell nearest a position")]
    [EndpointDescription(
        "lat, lon: degrees. from, to: calendar years, inclusive (default: the whole record when it is within the per-request " +
        "limit of AtlasApiOptions:SeriesMaxYearsPerRequest years). format: csv (default; plain RFC 4180, one header row, no comment " +
        "lines; its units, provenance and the caution are in its W3C CSV on the Web metadata, format=csvw with the same query, " +
        "application/csvm+json, named by the CSV answer's Link header with rel=describedby), json, nc (CF-1.8 NetCDF-4, featureType " +
        "timeSeries) or csvw. Missing steps are empty (csv), null (json) or NaN (nc). j is computed per step at the cell depth from " +
        "Hm0 and Te; at an output point of a spectral hindcast it is the power integrated from the spectrum, followed by " +
        "j_parametric, directionality, max_power_from_deg and spectral_width.")]
    public static async Task<Results<PushStreamHttpResult, ProblemHttpResult, ValidationProblem>> SeriesAsync(
        string slug, [AsParameters] PointPosition at, [AsParameters] PointSeriesQuery query,
        PointLocator locator, DatasetCatalog catalog, SeriesStore series, ProvenanceBuilder provenance,
        IOptions<AtlasApiOptions> options, StatisticsOptions statistics, StationSpectraAnswers stationSpectra, HttpContext http, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var position = at.Position(errors);
        var window = at.Window(errors);
        var form = query.Form(errors);
        if (errors.Count > 0 || position is null || window is null)
            return TypedResults.ValidationProblem(errors, title: "The series request has invalid query values");

        var (point, problem) = await locator.LocateAsync(slug, position.Value.Latitude, position.Value.Longitude, cancel);
        if (point is null) return problem!;
        var timelines = await catalog.TimelinesAsync(point.Dataset, cancel);
        if (timelines.Count == 0)
            return ApiProblems.Unprocessable("No series stored", $"Dataset '{slug}' has no time line yet; ingest its files first.");
        var limit = options.Value.SeriesMaxYearsPerRequest;
        var first = window.FromYear ?? timelines.Keys.First();
        var last = window.ToYear ?? (window.FromYear is { } f ? Math.Min(timelines.Keys.Last(), f + limit - 1) : timelines.Keys.Last());
        if (last < first)
            return TypedResults.ValidationProblem(new Dictionary<string, string[]> { ["from"] = [$"from={first} is after the last stored year {last}."] });
        if (last - first + 1 > limit)
            return ApiProblems.Unprocessable("The time range is too long",
                $"{first}..{last} is {last - first + 1} years; one request may cover at most {limit}. Ask for from and to in several requests " +
                $"(stored years: {timelines.Keys.First()}..{timelines.Keys.Last()}).");

        var chunks = await series.ReadCellAsync(point.Dataset.Id, point.Nearest.Cell.CellId, first, last, cancel);
        var depth = point.Nearest.Cell.DepthMetres is { } d ? d : double.NaN;
        var decoded = PointSeriesReader.Decode(chunks, timelines, depth);
        // At an output point of a spectral hindcast the spectral values per step join the series.
        var atOutputPoint = point.Dataset.GridKind == StationSpectraAnswers.StationsKind;
        var spectral = atOutputPoint ? await stationSpectra.AlignedStepsAsync(point.Dataset.Id, point.Nearest.Cell.CellId, chunks, timelines, cancel) : null;
        var (columns, teFromTp) = SeriesColumns.Of(decoded, statistics.AssumedSpectrum, spectral);
        var source = await provenance.ForAsync(point.Dataset, cancel);
        var cell = point.Cell;
        var fileName = $"{slug}_series_{cell.Id}_{first}-{last}";
        if (form == TableFormat.NetCdf)
        {
            var name = atOutputPoint ? StationSpectraAnswers.StationName(point.Dataset, cell.Id) : $"cell {cell.Id}";
            var bytes = SeriesNetCdfWriter.Write(decoded, columns, cell, name, source);
            return TypedResults.Stream(stream => stream.WriteAsync(bytes, cancel).AsTask(), "application/x-netcdf", fileName + ".nc");
        }
        var table = CsvTableOf(cell, source, first, last, columns, teFromTp, statistics.AssumedSpectrum, atOutputPoint);
        if (form == TableFormat.CsvMetadata)
        {
            var metadata = CsvwMetadataWriter.Write(table, CsvMetadataLinks.FormatForm(http.Request, "csv"));
            return TypedResults.Stream(stream => stream.WriteAsync(metadata, cancel).AsTask(), CsvwMetadataWriter.MediaType, fileName + ".csv-metadata.json");
        }
        var csv = form == TableFormat.Csv;
        if (csv) CsvMetadataLinks.Describe(http.Response, CsvMetadataLinks.FormatForm(http.Request, CsvMetadataLinks.FormatValue));
        return TypedResults.Stream(
            stream => csv ? WriteCsvAsync(stream, decoded, columns, table, cancel)
                          : WriteJsonAsync(stream, decoded, columns, teFromTp, cell, source, first, last, cancel),
            csv ? CsvTable.ContentType : "application/json", fileName + (csv ? ".csv" : ".json"));
    }

    /// <summary>
    /// The description of the series CSV, from which its header and its CSVW metadata are written: time, then the
    /// columns of <see cref="SeriesColumns"/> with their units.
    /// </summary>
    private static CsvTable CsvTableOf(PointCell cell, Provenance source, int first, int last, IReadOnlyList<SeriesColumn> columns, bool teFromTp,
        SpectrumShape spectrum, bool atOutputPoint)
    {
        var depth = cell.DepthM is { } d ? F(d) + " m" : "unknown (deep water assumed)";
        var where = atOutputPoint ? "output point" : "cell";
        List<string> notes = [$"Units: {SeriesColumns.UnitsLine(columns)}.", "Missing steps are empty fields."];
        if (teFromTp) notes.Add($"te is derived from tp for the {MethodNotes.AssumedSpectrum(spectrum)}: the dataset has no energy period.");
        return new CsvTable(
            string.Create(CultureInfo.InvariantCulture, $"Time series of {where} {cell.Id} of dataset {source.Dataset}, {first} to {last}"),
            string.Create(CultureInfo.InvariantCulture,
                $"One row per stored time step of {where} {cell.Id} (lat {F(cell.Lat)}, lon {F(cell.Lon)}, depth {depth}), {cell.DistanceM:0.#} m from the requested position; years {first} to {last}."),
            [
                CsvColumn.Time("time", "time of the step"),
                .. columns.Select(c => CsvColumn.Double(c.Name, c.LongName, c.Units == "kW m-1" ? "kW/m" : c.Units,
                    c.Name == "te" && teFromTp ? $"derived from tp ({MethodNotes.AssumedSpectrum(spectrum)})" : c.StandardName is { } cf ? $"CF standard name {cf}" : null)),
            ],
            source, notes);
    }

    private static async Task WriteCsvAsync(Stream stream, PointSeries s, IReadOnlyList<SeriesColumn> columns, CsvTable table, CancellationToken cancel)
    {
        await using var rows = CsvTableWriter.Open(stream, table);
        for (var i = 0; i < s.Times.Length; i++)
        {
            rows.Time(DateTimeOffset.FromUnixTimeSeconds(s.Times[i]).UtcDateTime);
            foreach (var column in columns) rows.Number(column.Values[i], column.CsvPattern);
            await rows.EndRowAsync(cancel);
        }
    }

    private static async Task WriteJsonAsync(Stream stream, PointSeries s, IReadOnlyList<SeriesColumn> columns, bool teFromTp, PointCell cell,
        Provenance source, int first, int last, CancellationToken cancel)
    {
        // The writer fills a buffer that is copied to the response asynchronously (the server forbids synchronous writes).
        var buffer = new System.Buffers.ArrayBufferWriter<byte>(64 * 1024);
        await using var json = new Utf8JsonWriter(buffer);
        json.WriteStartObject();
        json.WritePropertyName("cell");
        JsonSerializer.Serialize(json, cell, GeoJsonWriter.Options);
        json.WriteNumber("from_year", first);
        json.WriteNumber("to_year", last);
        json.WriteString("units", SeriesColumns.UnitsLine(columns));
        json.WriteBoolean("te_from_tp", teFromTp);
        json.WritePropertyName("provenance");
        JsonSerializer.Serialize(json, source, GeoJsonWriter.Options);
        json.WriteString("caution", AtlasCaution.Text);
        json.WriteStartArray("steps");
        for (var i = 0; i < s.Times.Length; i++)
        {
            json.WriteStartObject();
            json.WriteString("time", DateTimeOffset.FromUnixTimeSeconds(s.Times[i]).UtcDateTime);
            foreach (var column in columns) Write(json, column.Name, column.Values[i], column.JsonDigits);
            json.WriteEndObject();
            if (json.BytesPending + buffer.WrittenCount > 32 * 1024) await DrainAsync(json, buffer, stream, cancel);
        }
        json.WriteEndArray();
        json.WriteEndObject();
        await DrainAsync(json, buffer, stream, cancel);
    }

    private static async Task DrainAsync(Utf8JsonWriter json, System.Buffers.ArrayBufferWriter<byte> buffer, Stream stream, CancellationToken cancel)
    {
        json.Flush();
        await stream.WriteAsync(buffer.WrittenMemory, cancel);
        buffer.ResetWrittenCount();
    }

    private static void Write(Utf8JsonWriter json, string name, float value, int digits)
    {
        if (float.IsNaN(value)) json.WriteNull(name);
        else json.WriteNumber(name, Math.Round((double)value, digits));
    }

    private static string F(double v) => v.ToString("0.#####", CultureInfo.InvariantCulture);
}
