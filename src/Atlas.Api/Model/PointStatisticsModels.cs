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
    string Caution)
{
    /// <summary>What the power per step comes from: "spectra" at an output point, "Hs and Te" for a cell of gridded fields.</summary>
    public string PowerFrom { get; init; } = "Hs and Te";

    /// <summary>
    /// Exact spectral values: of this output point (a dataset of output points), or of the nearest output point of the same
    /// hindcast (a gridded dataset whose output points were loaded naming it), with its distance; null when there is none.
    /// </summary>
    public Atlas.Ingest.Spectra.SpectralPointAnswer? Spectral { get; init; }
}

public sealed record PointExceedance(ExceedanceCurve Hs, ExceedanceCurve J);

/// <summary>Share of the energy flux from each direction sector over the whole window (sector 0 centred on north, clockwise).</summary>
public sealed record PowerRose(int Sectors, double SectorWidthDegrees, IReadOnlyList<double> SectorCentresDegrees,
    [property: System.Text.Json.Serialization.JsonConverter(typeof(DataPrecisionListJsonConverter))] IReadOnlyList<double> Fractions);
