namespace Atlas.Api.Model;

/// <summary>The exact statistics at the wet cell nearest a position.</summary>
public sealed record PointStatistics(
    string Dataset,
    PointCell Cell,
    PointWindow Window,
    long StepsInWindow,
    bool DeepWaterAssumed,
    EnergyPeriodSource EnergyPeriodSource,
    QuantileDefinition QuantileDefinition,
    IReadOnlyDictionary<string, string> Units,
    IReadOnlyList<PeriodStatistics> Periods,
    PointExceedance? Exceedance,
    JointOccurrenceTable? JointOccurrence,
    PowerRose? PowerRose,
    IReadOnlyList<InterAnnualSeries>? InterAnnual,
    Provenance Provenance,
    string Caution);

public sealed record PointExceedance(ExceedanceCurve Hs, ExceedanceCurve J);

/// <summary>Share of the energy flux from each direction sector over the whole window (sector 0 centred on north, clockwise).</summary>
public sealed record PowerRose(int Sectors, double SectorWidthDegrees, IReadOnlyList<double> SectorCentresDegrees,
    [property: System.Text.Json.Serialization.JsonConverter(typeof(DataPrecisionListJsonConverter))] IReadOnlyList<double> Fractions);
