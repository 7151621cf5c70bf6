namespace Atlas.Vocabulary;

/// <summary>What an <see cref="AtlasPeriod"/> gathers.</summary>
public enum PeriodKind
{
    /// <summary>Every step of the record.</summary>
    Annual,

    /// <summary>One calendar month, across all years.</summary>
    Month,

    /// <summary>Three calendar months (DJF, MAM, JJA, SON), across all years.</summary>
    Season,

    /// <summary>One calendar year.</summary>
    Year,
}
