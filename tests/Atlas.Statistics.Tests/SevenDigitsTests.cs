using System.Globalization;
using System.Text;
using Atlas.Statistics.Serialization;

namespace Atlas.Statistics.Tests;

/// <summary>
/// The seven-digit text of a number is the one .NET's own "G7" format gives (the reference: the runtime's correctly
/// rounded general format), over every magnitude an answer holds and its edges: powers of ten, rounding ties, values
/// just beside them, float data widened to double, and the values outside the plain range.
/// </summary>
public class SevenDigitsTests
{
    private static void AssertSameAsG7(double value)
    {
        Span<byte> buffer = stackalloc byte[32];
        Assert.True(SevenDigits.TryFormat(value, buffer, out int written));
        Assert.Equal(value.ToString("G7", CultureInfo.InvariantCulture), Encoding.UTF8.GetString(buffer[..written]));
    }

    [Fact]
    public void EdgesAndTiesGiveTheTextOfG7()
    {
        var values = new List<double> { 0, -0.0, double.NaN, double.PositiveInfinity, double.NegativeInfinity, double.Epsilon, double.MaxValue,
            1e-4, 1.0001e-4, 9.9999995e-5, 9.99999949e-5, 0.001, 0.1, 1, 10, 9999999, 9999999.4, 9999999.5, 9_999_999.499999, 1e7, 12345675,
            1234567.5, 1234568.5, 0.12345675, 2.5e-4, 123.45650, 0.3, 0.7, 1.023f, 3.7811184595989924, float.MaxValue, float.Epsilon };
        for (int p = -6; p <= 8; p++)
            foreach (double m in new[] { 1.0, 9.9999995, 9.999999, 9.9999994999, 9.99999950001, 1.0000005, 5.0000005 })
            {
                values.Add(m * Math.Pow(10, p));
                values.Add(Math.BitIncrement(m * Math.Pow(10, p)));
                values.Add(Math.BitDecrement(m * Math.Pow(10, p)));
            }
        foreach (double v in values)
        {
            AssertSameAsG7(v);
            AssertSameAsG7(-v);
        }
    }

    [Fact]
    public void RandomValuesOfEveryMagnitudeGiveTheTextOfG7()
    {
        var random = new Random(11);
        for (int k = 0; k < 400_000; k++)
        {
            double v = random.NextDouble() * Math.Pow(10, random.Next(-7, 10));
            AssertSameAsG7(v);
            AssertSameAsG7((float)v); // float data widened, as the stored series are
            AssertSameAsG7(Math.Round(v * 1e3) / 1e3); // decimal steps (thresholds) and their ties at the eighth digit
        }
    }
}
