namespace Atlas.Statistics.Exact;

/// <summary>Count and double sum of a parameter's valid steps per (year, month) slot, inside a point analysis window.</summary>
internal sealed class SlotSums(int slots)
{
    private readonly long[] _counts = new long[slots];
    private readonly double[] _sums = new double[slots];

    public void Add(int slot, float value)
    {
        _counts[slot]++;
        _sums[slot] += value;
    }

    public (double Mean, long Count) Mean(List<int> slots)
    {
        long n = 0;
        double sum = 0;
        foreach (int s in slots) { n += _counts[s]; sum += _sums[s]; }
        return (n > 0 ? sum / n : double.NaN, n);
    }
}
