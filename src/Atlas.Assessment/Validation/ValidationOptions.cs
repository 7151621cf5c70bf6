namespace Atlas.Assessment.Validation;

/// <summary>Choices for a validation report.</summary>
public sealed record ValidationOptions
{
    /// <summary>
    /// Lower bounds of the observed-value classes, ascending; each class runs up to the next bound
    /// and the last is open-ended. Default 0, 1, 2, 3, 4 (m of Hs: 0-1, 1-2, 2-3, 3-4, 4+).
    /// </summary>
    public IReadOnlyList<double> ObservedClassLowerBounds { get; init; } = [0, 1, 2, 3, 4];

    /// <summary>Probabilities of the quantile-quantile comparison; default 0.01..0.99 by 0.01.</summary>
    public IReadOnlyList<double> QuantileProbabilities { get; init; } = QuantileComparison.DefaultProbabilities;
}
