namespace Atlas.Statistics.Tests;

/// <summary>
/// The vector kernels of the layer pass against the plain loop over a run that they replace (the loop of the layer pass
/// before them, written out below step by step): every count, extreme, bin, offset and sum must carry the same bits.
/// </summary>
public class RunScanTests
{
    private static readonly float[] Thresholds = [1f, 2f, 3f, 4f, 5f];

    [Theory]
    [InlineData(0.0f, 0.01, 30.0, 1)]
    [InlineData(0.0f, 0.1, 4000.0, 2)]
    [InlineData(float.Epsilon, 0.01, 40.0, 3)]
    [InlineData(0.0f, 0.5, 5.0, 4)]
    public void VectorScanEqualsThePlainLoopStepByStep(float lowest, double width, double upper, int seed)
    {
        var random = new Random(seed);
        var binning = new HistogramBinning(width, upper);
        int lastBin = binning.EqualBinCount;
        double inverseWidth = 1.0 / width;
        foreach (int length in Enumerable.Range(0, 41).Concat([672, 731, 744, 5000]))
        {
            float[] values = Odd(random, length, width, upper);
            double shift = values.FirstOrDefault(v => v >= lowest && v <= float.MaxValue);
            var bins = new int[length];
            var offsets = new double[length];
            var exceeding = new long[Thresholds.Length];
            RunExtent extent = RunScan.Scan(values, lowest, shift, inverseWidth, lastBin, Thresholds, exceeding, bins, offsets);

            var expected = PlainLoop(values, lowest, shift, inverseWidth, lastBin);
            Assert.Equal(expected.Count, extent.Count);
            Assert.Equal(BitConverter.SingleToInt32Bits(expected.Minimum), BitConverter.SingleToInt32Bits(extent.Minimum));
            Assert.Equal(BitConverter.SingleToInt32Bits(expected.Maximum), BitConverter.SingleToInt32Bits(extent.Maximum));
            Assert.Equal(expected.Bins, bins);
            Assert.Equal(expected.Offsets.Select(BitConverter.DoubleToInt64Bits), offsets.Select(BitConverter.DoubleToInt64Bits));
            Assert.Equal(expected.Exceeding, exceeding);
        }
    }

    // +0 and -0 compare equal, and the plain loop keeps the first of them: a zero extreme keeps its sign.
    [Theory]
    [InlineData(new[] { 0f, -0f, 1f }, false)]
    [InlineData(new[] { -0f, 0f, 1f }, true)]
    [InlineData(new[] { 3f, 2f, 1f, 1f, 1f, 1f, 1f, 1f, -0f, 0f, 5f }, true)]
    [InlineData(new[] { 3f, 2f, 1f, 1f, 1f, 1f, 1f, 1f, 0f, -0f, 5f, -0f }, false)]
    public void ZeroExtremeKeepsTheSignOfTheFirstZero(float[] values, bool negative)
    {
        RunExtent extent = RunScan.Scan(values, 0f, 0, 100, 3000, [], [], new int[values.Length], new double[values.Length]);
        Assert.Equal(negative, float.IsNegative(extent.Minimum));
        float[] zeros = [.. values.Where(v => v == 0)];
        RunExtent allZero = RunScan.Scan(zeros, 0f, 0, 100, 3000, [], [], new int[zeros.Length], new double[zeros.Length]);
        Assert.Equal(float.IsNegative(zeros[0]), float.IsNegative(allZero.Maximum));
    }

    [Fact]
    public void SideBySideSumsEqualSequentialSumsBitForBit()
    {
        var random = new Random(5);
        for (int trial = 0; trial < 50; trial++)
        {
            int[] lengths = [.. Enumerable.Range(0, RunTally.Lanes).Select(_ => random.Next(0, 800))];
            int stride = lengths.Max();
            var offsets = new double[RunTally.Lanes * stride];
            var bins = new int[RunTally.Lanes * stride];
            Array.Fill(bins, RunScan.MissingBin);
            int[][] fine = [.. Enumerable.Range(0, RunTally.Lanes).Select(_ => new int[64])];
            int[][] also = [.. Enumerable.Range(0, RunTally.Lanes).Select(_ => new int[64])];
            var expectedCounts = new int[RunTally.Lanes, 64];
            var expectedSums = new double[2 * RunTally.Lanes];
            for (int r = 0; r < RunTally.Lanes; r++)
            {
                double sum = 0, squares = 0;
                for (int i = 0; i < lengths[r]; i++)
                {
                    bool missing = random.Next(20) == 0;
                    // Offsets of single-precision values from a shift: a few magnitudes, so that sums round.
                    double d = missing ? 0 : (double)(float)(random.NextDouble() * Math.Pow(10, random.Next(-3, 4))) - 1.7;
                    offsets[r * stride + i] = d;
                    bins[r * stride + i] = missing ? RunScan.MissingBin : random.Next(64);
                    if (missing) continue;
                    sum += d;
                    squares += d * d;
                    expectedCounts[r, bins[r * stride + i]]++;
                }
                (expectedSums[2 * r], expectedSums[2 * r + 1]) = (sum, squares);
            }
            var sums = new double[2 * RunTally.Lanes];
            RunTally.Tally(offsets, bins, stride, fine, also, sums);
            Assert.Equal(expectedSums.Select(BitConverter.DoubleToInt64Bits), sums.Select(BitConverter.DoubleToInt64Bits));
            for (int r = 0; r < RunTally.Lanes; r++)
                for (int b = 0; b < 64; b++)
                {
                    Assert.Equal(expectedCounts[r, b], fine[r][b]);
                    Assert.Equal(expectedCounts[r, b], also[r][b]);
                }
        }
    }

    /// <summary>Runs with every kind of value the pass meets: gaps, zeros of both signs, negatives, infinities, values on bin edges and thresholds, beyond the bins, codec steps.</summary>
    private static float[] Odd(Random random, int length, double width, double upper)
    {
        var values = new float[length];
        for (int i = 0; i < length; i++)
            values[i] = random.Next(16) switch
            {
                0 => float.NaN,
                1 => 0f,
                2 => -0f,
                3 => -(float)random.NextDouble(),
                4 => float.PositiveInfinity,
                5 => float.NegativeInfinity,
                6 => (float)(random.Next((int)(upper / width)) * width),
                7 => Thresholds[random.Next(Thresholds.Length)],
                8 => (float)(upper * (1 + random.NextDouble())),
                9 => float.Epsilon,
                10 => float.MaxValue,
                11 => random.Next(65535) * 0.001f,
                _ => (float)(random.NextDouble() * upper * 0.2),
            };
        return values;
    }

    private static (int Count, float Minimum, float Maximum, int[] Bins, double[] Offsets, long[] Exceeding) PlainLoop(float[] values, float lowest,
        double shift, double inverseWidth, int lastBin)
    {
        int count = 0;
        float minimum = float.PositiveInfinity, maximum = float.NegativeInfinity;
        var bins = new int[values.Length];
        var offsets = new double[values.Length];
        var exceeding = new long[Thresholds.Length];
        for (int i = 0; i < values.Length; i++)
        {
            float x = values[i];
            bins[i] = RunScan.MissingBin;
            if (!(x >= lowest && x <= float.MaxValue)) continue;
            count++;
            if (x < minimum) minimum = x;
            if (x > maximum) maximum = x;
            double position = x * inverseWidth;
            bins[i] = position >= lastBin ? lastBin : (int)position;
            offsets[i] = x - shift;
            for (int t = 0; t < Thresholds.Length; t++)
                if (x > Thresholds[t]) exceeding[t]++;
        }
        return (count, minimum, maximum, bins, offsets, exceeding);
    }
}
