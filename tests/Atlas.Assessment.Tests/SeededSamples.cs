using MathNet.Numerics.Distributions;

namespace Atlas.Assessment.Tests;

/// <summary>Reproducible synthetic samples (System.Random with a fixed seed).</summary>
internal static class SeededSamples
{
    public static double[] Normal(int seed, int count, double mean, double standardDeviation)
    {
        var random = new Random(seed);
        return [.. Enumerable.Range(0, count).Select(_ => MathNet.Numerics.Distributions.Normal.Sample(random, mean, standardDeviation))];
    }

    public static double[] Uniform(int seed, int count, double lower, double upper)
    {
        var random = new Random(seed);
        return [.. Enumerable.Range(0, count).Select(_ => lower + (upper - lower) * random.NextDouble())];
    }

    /// <summary>Weibull-like positive values, as a stand-in for an observed Hs record.</summary>
    public static double[] WaveHeights(int seed, int count) =>
        [.. Uniform(seed, count, 0, 1).Select(u => 1.8 * Math.Pow(-Math.Log(1 - u), 1 / 1.6) + 0.1)];
}
