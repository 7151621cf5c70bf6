using System.Globalization;
using Atlas.Storage.Stations;
using Npgsql;

namespace Atlas.Ingest.Assessment;

/// <summary>What to register: the station's description and the file holding its record.</summary>
/// <param name="Latitude">Degrees north; null to take the position the NetCDF file states.</param>
/// <param name="Longitude">Degrees east; null to take the position the NetCDF file states.</param>
/// <param name="DepthMetres">Water depth at the mooring, m; null when unknown.</param>
/// <param name="FilePath">The record file; for an upload (<see cref="StationLoader.LoadAsync(StationLoadRequest, byte[], CancellationToken)"/>) its name only.</param>
public sealed record StationLoadRequest(
    string Name,
    double? Latitude,
    double? Longitude,
    double? DepthMetres,
    string Instrument,
    StationRole Role,
    string FilePath);

/// <summary>The outcome of a station load.</summary>
public sealed record StationLoadResult(StoredStation Station, bool AlreadyRegistered, StationFileContent Content)
{
    public string Describe()
    {
        var s = Station;
        var c = CultureInfo.InvariantCulture;
        return AlreadyRegistered
            ? string.Create(c, $"station {s.Name}: already registered from {s.SourceFile} (unchanged)")
            : string.Create(c, $"station {s.Name} ({StationStore.RoleName(s.Role)}): {s.ObservationCount:N0} observations {s.TimeStartUtc:yyyy-MM-dd}..{s.TimeEndUtc:yyyy-MM-dd} from {s.SourceFile}, ") +
              string.Create(c, $"{s.FlaggedCount:N0} flagged, {Content.MissingHsCount:N0} without Hs; variables hs{(s.HasTp ? ", tp" : "")}{(s.HasTe ? ", te" : "")}{(s.HasDirection ? ", dir" : "")}");
    }
}

/// <summary>
/// Reads a station file, checks it whole, and registers the station with its record in one transaction: a bad file
/// stores nothing, and loading the same file under the same name again changes nothing. The one registration path:
/// <c>atlas stations add</c> and <c>POST /api/v1/stations</c> both come here, with the same formats (CSV and CF-NetCDF)
/// and the same checks.
/// </summary>
public sealed class StationLoader(NpgsqlDataSource dataSource)
{
    /// <summary>
    /// Positions given and stated by a file may differ by this much (about 1 km) before they are taken for two places:
    /// files often round the position of the mooring.
    /// </summary>
    public const double PositionToleranceDegrees = 0.01;

    /// <summary>The deepest mooring accepted, m: below the deepest ocean trench (about 11 km), so a larger value is a mistake.</summary>
    public const double MaximumDepthMetres = 12_000;

    /// <exception cref="ArgumentException">A description field is unusable (names the field).</exception>
    /// <exception cref="FormatException">The file is not a valid record (<see cref="Atlas.Assessment.CsvInputException"/>, <see cref="StationFileException"/>).</exception>
    /// <exception cref="DuplicateStationException">The name or the record is registered differently.</exception>
    public async Task<StationLoadResult> LoadAsync(StationLoadRequest request, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(request);
        Describe(request);
        return await RegisterAsync(request, StationFileReader.Read(request.FilePath), cancel);
    }

    /// <summary>As <see cref="LoadAsync(StationLoadRequest, CancellationToken)"/>, from the file's bytes (an upload named by <see cref="StationLoadRequest.FilePath"/>).</summary>
    public async Task<StationLoadResult> LoadAsync(StationLoadRequest request, byte[] content, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(request);
        Describe(request);
        return await RegisterAsync(request, StationFileReader.Read(content, Path.GetFileName(request.FilePath)), cancel);
    }

    /// <summary>Checks the description before any file is read.</summary>
    private static void Describe(StationLoadRequest request)
    {
        if (ReferenceSlug.From(request.Name.Trim()) is null) throw new ArgumentException($"Station name '{request.Name}' needs at least one letter or digit.", nameof(request.Name));
        if (string.IsNullOrWhiteSpace(request.Instrument)) throw new ArgumentException("The instrument kind is required (e.g. \"directional wave buoy\").", nameof(request.Instrument));
        if (request.DepthMetres is { } depth && !(depth > 0 && depth <= MaximumDepthMetres))
            throw new ArgumentException($"Depth {depth} m must be a positive number of metres, at most {MaximumDepthMetres:0}.", nameof(request.DepthMetres));
    }

    private async Task<StationLoadResult> RegisterAsync(StationLoadRequest request, StationFileContent content, CancellationToken cancel)
    {
        var name = request.Name.Trim();
        var slug = ReferenceSlug.From(name)!;
        var latitude = Coordinate("latitude", request.Latitude, content.Latitude, 90, content.SourceFile);
        var longitude = Coordinate("longitude", request.Longitude, content.Longitude, 180, content.SourceFile);
        var definition = new StationDefinition(slug, name, latitude, longitude, request.DepthMetres, request.Instrument.Trim(), request.Role,
            content.SourceFile, content.Sha256, content.Format, content.HasTp, content.HasTe, content.HasDirection);
        var registration = await new StationStore(dataSource).RegisterAsync(definition, content.Observations, cancel);
        return new StationLoadResult(registration.Station, registration.AlreadyRegistered, content);
    }

    private static double Coordinate(string what, double? given, double? inFile, double bound, string file)
    {
        if (given is { } g && (!double.IsFinite(g) || Math.Abs(g) > bound))
            throw new ArgumentException($"The {what} {g} is outside -{bound}..{bound} degrees.", Parameter(what));
        if (given is { } a && inFile is { } b && Math.Abs(a - b) > PositionToleranceDegrees)
            throw new ArgumentException(string.Create(CultureInfo.InvariantCulture,
                $"{file} places the station at {what} {b:0.#####} but {a:0.#####} was given; they differ by more than {PositionToleranceDegrees} degrees. Give the file's position or correct the file."),
                Parameter(what));
        return given ?? inFile ?? throw new ArgumentException(
            $"The station's {what} is required: {file} does not state the station position (only CF-NetCDF files can).", Parameter(what));
    }

    private static string Parameter(string what) => what == "latitude" ? nameof(StationLoadRequest.Latitude) : nameof(StationLoadRequest.Longitude);
}
