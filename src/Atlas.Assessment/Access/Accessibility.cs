namespace Atlas.Assessment.Access;

/// <summary>Share of time within access limits, the per-cell quantity behind accessibility layers.</summary>
public static class Accessibility
{
    /// <summary>
    /// Fraction of non-missing steps within the limits. A step is missing when Hs is NaN or, with a
    /// Tp limit, when Tp is NaN; missing steps are left out of both counts.
    /// </summary>
    /// <param name="hsMetres">Hs per step.</param>
    /// <param name="tpSeconds">Tp per step, the same length as Hs; may be empty when the limits have no Tp limit.</param>
    /// <param name="limits">The limits.</param>
    /// <exception cref="ArgumentException">A Tp limit is set but Tp is missing or of another length.</exception>
    public static AccessibilityFraction Of(ReadOnlySpan<double> hsMetres, ReadOnlySpan<double> tpSeconds, AccessLimits limits)
    {
        ArgumentNullException.ThrowIfNull(limits);
        RequireTp(hsMetres.Length, tpSeconds.Length, limits);
        int calm = 0, valid = 0;
        for (int i = 0; i < hsMetres.Length; i++)
        {
            var state = Classify(hsMetres[i], tpSeconds.IsEmpty ? double.NaN : tpSeconds[i], limits);
            if (state == SeaStateClass.Missing) continue;
            valid++;
            if (state == SeaStateClass.Calm) calm++;
        }
        return new AccessibilityFraction(calm, valid);
    }

    internal static SeaStateClass Classify(double hs, double tp, AccessLimits limits)
    {
        if (double.IsNaN(hs))
            return SeaStateClass.Missing;
        if (limits.TpLimitSeconds is { } tpLimit)
        {
            if (double.IsNaN(tp))
                return SeaStateClass.Missing;
            if (tp > tpLimit)
                return SeaStateClass.Storm;
        }
        return hs <= limits.HsLimitMetres ? SeaStateClass.Calm : SeaStateClass.Storm;
    }

    internal static void RequireTp(int hsLength, int tpLength, AccessLimits limits)
    {
        if (limits.TpLimitSeconds is not null && tpLength != hsLength)
            throw new ArgumentException(
                tpLength == 0 ? "A Tp limit is set but no Tp series was given." : $"{hsLength} Hs steps but {tpLength} Tp steps.",
                "tpSeconds");
        if (tpLength != 0 && tpLength != hsLength)
            throw new ArgumentException($"{hsLength} Hs steps but {tpLength} Tp steps.", "tpSeconds");
    }
}
