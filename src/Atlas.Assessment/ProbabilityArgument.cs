namespace Atlas.Assessment;

/// <summary>The check every probability argument of the assessment methods gets before any work is done.</summary>
internal static class ProbabilityArgument
{
    /// <exception cref="ArgumentOutOfRangeException">The probability is outside 0..1 or NaN.</exception>
    public static void Require(double probability, string name = "probability")
    {
        if (!(probability >= 0 && probability <= 1))
            throw new ArgumentOutOfRangeException(name, probability, "A probability must lie in 0..1.");
    }
}
