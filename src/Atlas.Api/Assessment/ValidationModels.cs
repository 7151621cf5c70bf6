namespace Atlas.Api.Assessment;

public sealed record StationList(IReadOnlyList<StationItem> Stations, string Caution);

/// <summary>The answer to a station upload: the station, and whether it was registered already (nothing changed).</summary>
public sealed record StationRegistered(StationItem Station, bool AlreadyRegistered, int MissingHsCount, string Caution);

public sealed record ValidationTable(
    string Dataset, IReadOnlyList<StationSkill> Stations, IReadOnlyList<StationNotCovered> NotCovered, Provenance Provenance, string Caution);

/// <summary>One matched pair: the observation time, the observed value and the modelled value there.</summary>
public sealed record ValidationPair(DateTime Time, double Observed, double Modelled);

public sealed record QuantileRow(double Probability, double? Observed, double? Modelled);

public sealed record ModelStep(DateTime Time, double? Value);

/// <summary>Plot data: the pairs (a scatter and a time series), the 1:1 line's span, quantile pairs, and the model series.</summary>
public sealed record ValidationPlotData(
    string Dataset, StationItem Station, ValidatedCell Cell, string Variable, string Unit, MatchCountsRow Counts,
    double[] OneToOneLine, IReadOnlyList<ValidationPair> Pairs, IReadOnlyList<QuantileRow> Quantiles, IReadOnlyList<ModelStep> ModelSeries,
    Provenance Provenance, string Caution);

/// <summary>One dataset's Hs skill at a station, with its rank among the compared datasets (1 = smallest scatter index).</summary>
public sealed record RunSkill(string Dataset, int? Rank, SkillRow? Skill, string? NotCovered);

public sealed record StationComparison(string Station, string Role, bool Independent, IReadOnlyList<RunSkill> Runs);

/// <summary>A dataset over all compared stations: mean scatter index and bias of the stations it covers.</summary>
public sealed record RunSummary(string Dataset, int Rank, int StationsCovered, double? MeanScatterIndex, double? MeanBias, double? IndependentMeanScatterIndex);

public sealed record ValidationComparison(
    string Variable, IReadOnlyList<RunSummary> Ranking, IReadOnlyList<StationComparison> Stations, IReadOnlyList<Provenance> Provenance, string Caution);
