namespace Atlas.Statistics.Tests;

/// <summary>
/// The quantile walks over several histograms read as one (a block summed over the parts once, then walked bin by bin)
/// against the estimators written out plainly: every rank sought from the first block in use, bin by bin, over counts
/// summed part by part at each bin, in the order of additions the estimators state. The results must carry the same bits.
/// </summary>
public class HistogramWalkTests
{
    private static readonly double[] Probabilities = [0, 0.001, 0.1, 0.25, 0.5, 0.9, 0.99, 0.999, 1];

    [Theory]
    [InlineData(1, 0.01, 30.0, 1)]
    [InlineData(3, 0.01, 30.0, 2)]
    [InlineData(12, 0.1, 4000.0, 3)]
    [InlineData(12, 0.5, 5.0, 4)]
    [InlineData(2, 0.01, 0.5, 5)]
    public void QuantilesOfSeveralHistogramsEqualThePlainEstimators(int partCount, double width, double upper, int seed)
    {
        var random = new Random(seed);
        var binning = new HistogramBinning(width, upper);
        for (int trial = 0; trial < 40; trial++)
        {
            var parts = new FixedBinHistogram[partCount];
            for (int p = 0; p < partCount; p++)
            {
                parts[p] = new FixedBinHistogram(binning);
                // Some parts empty, some a single value, ties, values beyond the bins.
                int n = random.Next(4) == 0 ? random.Next(0, 3) : random.Next(1, 900);
                double centre = upper * random.NextDouble() * 0.3, spread = random.Next(3) == 0 ? 0 : upper * 0.05;
                for (int i = 0; i < n; i++)
                    parts[p].Add(random.Next(50) == 0 ? upper * (1 + random.NextDouble()) : Math.Max(0, centre + spread * (random.NextDouble() - 0.5)));
            }
            var estimates = new double[Probabilities.Length];
            FixedBinHistogram.EstimateQuantiles(parts, Probabilities, estimates);
            Assert.Equal(PlainQuantiles(parts).Select(BitConverter.DoubleToInt64Bits), estimates.Select(BitConverter.DoubleToInt64Bits));

            double[] weights = [.. Enumerable.Range(0, partCount).Select(_ => random.Next(5) == 0 ? 0 : 0.5 + random.NextDouble())];
            FixedBinHistogram.EstimateWeightedQuantiles(parts, weights, Probabilities, estimates);
            Assert.Equal(PlainWeightedQuantiles(parts, weights).Select(BitConverter.DoubleToInt64Bits), estimates.Select(BitConverter.DoubleToInt64Bits));
        }
    }

    private static long BinCount(FixedBinHistogram[] parts, int bin) => parts.Sum(p => (long)p.Fine[bin]);

    private static long BlockCount(FixedBinHistogram[] parts, int block) => parts.Sum(p => (long)p.Coarse[block]);

    // Type 7 over the combined bins (FixedBinHistogram.EstimateQuantiles): the order statistics at floor(h) and
    // floor(h) + 1, h = (n - 1) p, each spread evenly across its bin, interpolated.
    private static double[] PlainQuantiles(FixedBinHistogram[] parts)
    {
        long n = parts.Sum(p => p.Count);
        if (n == 0) return [.. Probabilities.Select(_ => double.NaN)];
        double minimum = parts.Where(p => p.Count > 0).Min(p => p.Minimum), maximum = parts.Where(p => p.Count > 0).Max(p => p.Maximum);
        int lowBlock = parts.Where(p => p.Count > 0).Min(p => p.LowBlock), lastBin = parts[0].LastBin;
        double width = parts[0].Binning.BinWidth;
        double Rank(long rank)
        {
            if (rank == 0) return minimum;
            if (rank == n - 1) return maximum;
            long before = 0;
            int block = lowBlock;
            while (rank >= before + BlockCount(parts, block)) before += BlockCount(parts, block++);
            int bin = block << FixedBinHistogram.BlockShift;
            while (rank >= before + BinCount(parts, bin)) before += BinCount(parts, bin++);
            double low = bin * width, high = bin == lastBin ? Math.Max(maximum, low) : low + width;
            return Math.Clamp(low + (high - low) * ((rank - before) + 0.5) / BinCount(parts, bin), minimum, maximum);
        }
        return [.. Probabilities.Select(p =>
        {
            double h = (n - 1) * p;
            long k = (long)Math.Floor(h);
            double lower = Rank(k);
            return ExactQuantile.Interpolate(lower, k + 1 < n ? Rank(k + 1) : lower, h - k);
        })];
    }

    // The weighted type 7 of MethodNotes.WeightedPercentiles (FixedBinHistogram.EstimateWeightedQuantiles): the weighted
    // rank p (W - w) sought over blocks and then bins, each bin's values evenly spread and carrying its mean weight.
    private static double[] PlainWeightedQuantiles(FixedBinHistogram[] parts, double[] weights)
    {
        var used = Enumerable.Range(0, parts.Length).Where(i => parts[i].Count > 0 && weights[i] > 0).ToArray();
        double total = 0, minimum = double.PositiveInfinity, maximum = double.NegativeInfinity, lastWeight = 0;
        foreach (int i in used)
        {
            total += weights[i] * parts[i].Count;
            minimum = Math.Min(minimum, parts[i].Minimum);
            if (parts[i].Maximum > maximum) (maximum, lastWeight) = (parts[i].Maximum, weights[i]);
        }
        if (!(total > 0)) return [.. Probabilities.Select(_ => double.NaN)];
        long count = used.Sum(i => parts[i].Count);
        int lowBlock = used.Min(i => parts[i].LowBlock), highBlock = used.Max(i => parts[i].HighBlock), lastBin = parts[0].LastBin;
        double width = parts[0].Binning.BinWidth;
        double Mass(int index, bool coarse)
        {
            double mass = 0;
            for (int i = 0; i < parts.Length; i++) mass += weights[i] * (coarse ? parts[i].Coarse : parts[i].Fine)[index];
            return mass;
        }
        double ValueAt(int bin, long index, long binCount) => bin * width + width * (index + 0.5) / Math.Max(binCount, 1);
        return [.. Probabilities.Select(p =>
        {
            if (p == 0) return minimum;
            if (p == 1 || count == 1) return maximum;
            double target = p * (total - lastWeight), beforeBlock = 0;
            int block = lowBlock;
            while (target >= beforeBlock + Mass(block, true) && block < highBlock) beforeBlock += Mass(block++, true);
            int bin = block << FixedBinHistogram.BlockShift, end = Math.Min((block + 1) << FixedBinHistogram.BlockShift, lastBin + 1) - 1;
            double beforeBin = beforeBlock;
            while ((target >= beforeBin + Mass(bin, false) || BinCount(parts, bin) == 0) && bin < end) beforeBin += Mass(bin++, false);
            long binCount = BinCount(parts, bin);
            double each = Mass(bin, false) / Math.Max(binCount, 1);
            double position = each > 0 ? (target - beforeBin) / each : 0;
            int index = (int)Math.Clamp(Math.Floor(position), 0, Math.Max(binCount - 1, 0));
            double lower = ValueAt(bin, index, binCount), upper = ValueAt(bin, index, binCount);
            if (index + 1 < binCount) upper = ValueAt(bin, index + 1, binCount);
            else
                for (int next = bin + 1; next <= Math.Min(((highBlock + 1) << FixedBinHistogram.BlockShift) - 1, lastBin); next++)
                    if (BinCount(parts, next) is > 0 and var c) { upper = ValueAt(next, 0, c); break; }
            return Math.Clamp(ExactQuantile.Interpolate(lower, upper, Math.Clamp(position - index, 0, 1)), minimum, maximum);
        })];
    }
}
