namespace Atlas.Assessment.Validation;

/// <summary>One point of a quantile-quantile comparison.</summary>
/// <param name="Probability">Non-exceedance probability, 0..1.</param>
/// <param name="ObservedQuantile">Quantile of the observed values at that probability.</param>
/// <param name="ModelledQuantile">Quantile of the modelled values at that probability.</param>
public sealed record QuantilePair(double Probability, double ObservedQuantile, double ModelledQuantile);
