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
        Positive(JointTeBinSeconds, nameof(JointTeBinSeconds));
    }

    private static void Positive(double value, string name)
    {
        if (!(value > 0) || !double.IsFinite(value))
            throw new ArgumentException($"{name} is {value}; it must be positive and finite.", name);
    }
}
