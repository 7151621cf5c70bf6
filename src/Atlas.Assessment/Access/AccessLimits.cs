namespace Atlas.Assessment.Access;

/// <summary>
/// Sea-state limits for an operation: a step is within limits ("calm") when Hs is at or below
/// <see cref="HsLimitMetres"/> and, if a Tp limit is set, Tp is at or below it too.
/// </summary>
public sealed record AccessLimits
{
    /// <summary>Creates limits.</summary>
    /// <exception cref="ArgumentOutOfRangeException">A limit is not a positive finite number.</exception>
    public AccessLimits(double hsLimitMetres, double? tpLimitSeconds = null)
    {
        if (!double.IsFinite(hsLimitMetres) || hsLimitMetres <= 0)
            throw new ArgumentOutOfRangeException(nameof(hsLimitMetres), hsLimitMetres, "The Hs limit must be a positive number of metres.");
        if (tpLimitSeconds is { } tp && (!double.IsFinite(tp) || tp <= 0))
            throw new ArgumentOutOfRangeException(nameof(tpLimitSeconds), tp, "The Tp limit must be a positive number of seconds.");
        HsLimitMetres = hsLimitMetres;
        TpLimitSeconds = tpLimitSeconds;
    }

    /// <summary>Largest Hs at which the operation can proceed, m.</summary>
    public double HsLimitMetres { get; }

    /// <summary>Largest Tp at which the operation can proceed, s; null for no period limit.</summary>
    public double? TpLimitSeconds { get; }
}
