using System.Runtime.CompilerServices;

namespace Atlas.Statistics.Calendar;

/// <summary>
/// Month-balanced weights of a climatological season or annual period: each calendar month weighs by its share of
/// the calendar (the steps it expects over the record's years), whatever share of the record's steps it holds.
/// </summary>
/// <remarks>
/// A record from July of one year to December of the next holds two Julys but one June; pooled, the calm months
/// would weigh more than their share of a year. Each valid value of calendar month m carries the weight
/// E_m / V_m (expected over valid steps of m in the period), so every month's values together weigh E_m. Months with
/// no valid value drop out (they cannot be balanced; the coverage shows them missing). When every month's ratio is
/// the same (a record of whole years, or gaps spread evenly), the weights are equal and the pooled statistics are
/// used unchanged, to the bit.
/// </remarks>
internal static class MonthBalance
{
    /// <summary>True when the period kind is balanced: seasons and the annual period (and a point window's whole span).</summary>
    public static bool Applies(AtlasPeriod period) => period.Kind is PeriodKind.Season or PeriodKind.Annual;

    /// <summary>
    /// The month weights of a set of slots from their valid counts (<paramref name="countsBySlot"/>, indexed by slot),
    /// or false when they are equal or <paramref name="balanced"/> is false; <paramref name="valid"/> receives the total.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static bool TryWeightsOfSlots(ReadOnlySpan<int> slots, ReadOnlySpan<long> countsBySlot, ReadOnlySpan<long> expectedByMonth,
        bool balanced, Span<double> weights, out long valid)
    {
        Span<long> byMonth = stackalloc long[12];
        valid = 0;
        foreach (int slot in slots)
        {
            valid += countsBySlot[slot];
            byMonth[slot % 12] += countsBySlot[slot];
        }
        return balanced && TryWeights(expectedByMonth, byMonth, weights);
    }

    /// <summary>
    /// The weight per value of each calendar month (index 0 = January; 0 where the month has no valid value); false
    /// when the weights are all equal, so that the pooled statistics apply as they are.
    /// </summary>
    /// <param name="expected">Steps each calendar month expects in the period.</param>
    /// <param name="valid">Valid steps of each calendar month in the period.</param>
    /// <param name="weights">Receives 12 weights.</param>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static bool TryWeights(ReadOnlySpan<long> expected, ReadOnlySpan<long> valid, Span<double> weights)
    {
        weights[..12].Clear();
        int reference = -1;
        bool uniform = true;
        for (int m = 0; m < 12; m++)
        {
            if (valid[m] <= 0) continue;
            long e = Math.Max(expected[m], valid[m]);
            weights[m] = (double)e / valid[m];
            if (reference < 0) reference = m;
            else if ((Int128)e * valid[reference] != (Int128)Math.Max(expected[reference], valid[reference]) * valid[m]) uniform = false;
        }
        return !uniform;
    }
}
