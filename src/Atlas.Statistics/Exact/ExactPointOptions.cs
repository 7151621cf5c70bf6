namespace Atlas.Statistics.Exact;

/// <summary>Settings of <see cref="ExactPointAnalysis"/>.</summary>
public sealed record ExactPointOptions
{
    /// <summary>Quantile definition of the percentiles (default Hyndman-Fan type 7, NumPy's default).</summary>
    public QuantileDefinition QuantileDefinition { get; init; } = ExactQuantile.Default;

    /// <summary>Restricts the analysis to some years and/or months; null for the whole record.</summary>
    public AnalysisWindow? Window { get; init; }

    /// <summary>Thresholds, coverage threshold and the spectrum assumed for Te from Tp (histogram settings are not used).</summary>
    public StatisticsOptions Statistics { get; init; } = new();

    /// <summary>Threshold spacing of the Hs exceedance curve, m (default 0.1).</summary>
    public double HsCurveStepMetres { get; init; } = 0.1;

    /// <summary>Threshold spacing of the power exceedance curve, kW/m (default 1).</summary>
    public double PowerCurveStepKilowattsPerMetre { get; init; } = 1.0;

    /// <summary>
    /// At most this many thresholds on the power exceedance curve: when the largest power needs more at
    /// <see cref="PowerCurveStepKilowattsPerMetre"/>, the step grows to the smallest of 1, 2 or 5 times a power of ten
    /// times that step which needs no more (null, the default: the step as given, however many thresholds it takes).
    /// Each fraction stays exact; only fewer thresholds are read.
    /// </summary>
    public int? PowerCurveMaxThresholds { get; init; }

    /// <summary>The parts to compute (default all); J's period summaries are always computed.</summary>
    public ExactParts Parts { get; init; } = ExactParts.All;

    /// <summary>Hs bin of the joint occurrence table, m (default 0.5).</summary>
    public double JointHsBinMetres { get; init; } = 0.5;

    /// <summary>Te bin of the joint occurrence table, s (default 1).</summary>
    public double JointTeBinSeconds { get; init; } = 1.0;

    /// <summary>Throws when a setting is not usable, naming it.</summary>
    public void Validate()
    {
        if (!Enum.IsDefined(QuantileDefinition))
            throw new ArgumentException($"{nameof(QuantileDefinition)} {QuantileDefinition} is not a Hyndman-Fan type 1..9.", nameof(QuantileDefinition));
        Window?.Validate();
        ArgumentNullException.ThrowIfNull(Statistics, nameof(Statistics));
        Statistics.Validate();
        Positive(HsCurveStepMetres, nameof(HsCurveStepMetres));
        Positive(PowerCurveStepKilowattsPerMetre, nameof(PowerCurveStepKilowattsPerMetre));
        Positive(JointHsBinMetres, nameof(JointHsBinMetres));
        if (PowerCurveMaxThresholds is < 2)
            throw new ArgumentException($"{nameof(PowerCurveMaxThresholds)} is {PowerCurveMaxThresholds}; a curve needs at least 2 thresholds.", nameof(PowerCurveMaxThresholds));
        Positive(JointTeBinSeconds, nameof(JointTeBinSeconds));
    }

    private static void Positive(double value, string name)
    {
        if (!(value > 0) || !double.IsFinite(value))
            throw new ArgumentException($"{name} is {value}; it must be positive and finite.", name);
    }
}

/// <summary>
/// The parts of an exact point analysis beyond J's period summaries. A part left out is not computed at all: its
/// summaries are empty (count 0), its curves, table and series empty. What is computed is the same either way.
/// </summary>
[Flags]
public enum ExactParts
{
    /// <summary>J's period summaries and exceedance fractions only.</summary>
    None = 0,

    /// <summary>The period summaries and exceedance fractions of Hs, Te, Tp and spread.</summary>
    OtherSummaries = 1,

    /// <summary>Each period's direction statistics, power rose and directionality.</summary>
    Directions = 2,

    /// <summary>The exceedance curves of Hs and J over the window.</summary>
    ExceedanceCurves = 4,

    /// <summary>The joint Hm0-Te occurrence table.</summary>
    JointOccurrence = 8,

    /// <summary>The yearly means and their coefficients of variation.</summary>
    InterAnnual = 16,

    /// <summary>Everything (the default).</summary>
    All = OtherSummaries | Directions | ExceedanceCurves | JointOccurrence | InterAnnual,
}
