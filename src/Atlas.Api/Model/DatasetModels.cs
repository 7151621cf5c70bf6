namespace Atlas.Api.Model;

public sealed record Extent(double West, double South, double East, double North);

public sealed record TimeCoverage(DateTime? FirstUtc, DateTime? LastUtc, int StepCount, int? StepSeconds, IReadOnlyList<int> Years);

public sealed record DatasetLinks(string Self, string Layers, string Point, string Series, string Area, string Screen);

/// <summary>One dataset in the catalogue.</summary>
public sealed record DatasetListItem(
    string Slug,
    string Title,
    string GridKind,
    Extent? Extent,
    int PointCount,
    int WetCellCount,
    TimeCoverage Time,
    DatasetLinks Links);

public sealed record DatasetList(IReadOnlyList<DatasetListItem> Datasets, string Caution);

public sealed record SourceFileItem(string FileName, string Checksum, long SizeBytes, DateTime TimeStartUtc, DateTime TimeEndUtc, int StepCount, DateTime LoadedAtUtc);

/// <summary>Everything the store knows of one dataset.</summary>
public sealed record DatasetDetail(
    string Slug,
    string Title,
    string GridKind,
    Extent? Extent,
    int? Nx,
    int? Ny,
    int PointCount,
    int WetCellCount,
    int StatisticsCellCount,
    TimeCoverage Time,
    JsonElement? Variables,
    IReadOnlyList<ParameterItem> Parameters,
    IReadOnlyList<SourceFileItem> SourceFiles,
    string MethodNotes,
    string? Licence,
    string? Citation,
    JsonElement? Validation,
    JsonElement Metadata,
    DateTime CreatedAtUtc,
    string Caution,
    DatasetLinks Links)
{
    /// <summary>Output points of a spectral hindcast drawn with this dataset: its own, or those loaded beside it (empty when none).</summary>
    public IReadOnlyList<OutputPointItem> OutputPoints { get; init; } = [];
}

/// <summary>A served parameter: its trade symbol, what it is and its unit.</summary>
public sealed record ParameterItem(string Symbol, string Name, string Units);
