namespace Atlas.Assessment.Extremes;

/// <summary>What an <see cref="ExtremeCaution"/> warns about.</summary>
public enum ExtremeCautionKind
{
    /// <summary>The caution attached to every extreme-value result.</summary>
    General,
    /// <summary>A return period well beyond the record length (strong caution).</summary>
    LongExtrapolation,
    /// <summary>Too few annual maxima or storm peaks for a stable fit.</summary>
    SmallSample,
    /// <summary>A requested return level is undefined by the method used.</summary>
    UndefinedLevel,
    /// <summary>A confidence interval is unbounded above.</summary>
    OpenInterval,
}
