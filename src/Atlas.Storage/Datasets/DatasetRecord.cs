namespace Atlas.Storage.Datasets;

/// <summary>A dataset row. <see cref="GridJson"/> and <see cref="MetadataJson"/> are the stored jsonb documents.</summary>
public sealed record DatasetRecord(
    int Id,
    string Slug,
    string Title,
    string GridKind,
    int? Nx,
    int? Ny,
    int PointCount,
    string GridJson,
    string MetadataJson,
    DateTime CreatedAtUtc);

/// <summary>What a dataset holds, for the catalog: counts, extent and time coverage.</summary>
public sealed record DatasetSummary(
    DatasetRecord Dataset,
    int WetCellCount,
    double? West,
    double? South,
    double? East,
    double? North,
    DateTime? FirstTimeUtc,
    DateTime? LastTimeUtc,
    int StepCount,
    int? MedianStepSeconds,
    IReadOnlyList<int> Years,
    int StatisticsCellCount);

public sealed record SourceFileRecord(
    string FileName,
    string Checksum,
    long SizeBytes,
    DateTime TimeStartUtc,
    DateTime TimeEndUtc,
    int StepCount,
    long? JobId,
    DateTime LoadedAtUtc);
