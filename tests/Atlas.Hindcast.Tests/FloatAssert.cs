namespace Atlas.Hindcast.Tests;

internal static class FloatAssert
{
    /// <summary>Equal lengths, NaN exactly where expected is NaN, and |actual - expected| within tolerance elsewhere.</summary>
    public static void Close(ReadOnlySpan<float> expected, ReadOnlySpan<float> actual, double tolerance, string what)
    {
        Assert.True(expected.Length == actual.Length, $"{what}: {actual.Length} values, expected {expected.Length}");
        for (int k = 0; k < expected.Length; k++)
        {
            if (float.IsNaN(expected[k]))
            {
                Assert.True(float.IsNaN(actual[k]), $"{what}[{k}]: expected missing (NaN), got {actual[k]}");
                continue;
            }
            Assert.False(float.IsNaN(actual[k]), $"{what}[{k}]: expected {expected[k]}, got NaN");
            Assert.True(Math.Abs(actual[k] - expected[k]) <= tolerance,
                $"{what}[{k}]: expected {expected[k]}, got {actual[k]} (tolerance {tolerance})");
        }
    }

    public static float[] Map(float[] values, Func<float, float> f) => values.Select(v => float.IsNaN(v) ? float.NaN : f(v)).ToArray();
}
