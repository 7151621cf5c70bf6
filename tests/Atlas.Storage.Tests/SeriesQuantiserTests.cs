using Atlas.Storage.Series;

namespace Atlas.Storage.Tests;

public class SeriesQuantiserTests
{
    private const int Length = 10_003;   // whole vectors of 8 and of 4, and a tail of 3

    // The quantisation of a run in vector registers gives, value for value, the codes of NumPy's
    // numpy.round(numpy.float64(v) / step) (round half to even; numpy.fmod into 0..360 first for directions, 36000
    // wrapping to 0; NaN to the missing code 65535), and those of the one-value quantiser: random values over the
    // range, every value a float can hold near a tie (code + 0.5) * step, exact codes, zero and -0, the largest
    // storable value, NaN, and directions below 0 and at or above 360.
    [Theory]
    [InlineData(WaveParameter.Hs)]
    [InlineData(WaveParameter.Te)]
    [InlineData(WaveParameter.Tp)]
    [InlineData(WaveParameter.Dir)]
    [InlineData(WaveParameter.Spread)]
    public void RunsQuantiseAsNumPyRoundsAndAsTheOneValueQuantiser(WaveParameter variable)
    {
        var values = Values(variable);
        var quantiser = new SeriesQuantiser(variable);
        var codes = new ushort[Length];
        Assert.True(quantiser.TryQuantise(values, codes));
        for (var i = 0; i < Length; i++) Assert.Equal(quantiser.Quantise(values[i]), codes[i]);

        var step = SeriesCodec.StepOf(variable);
        var numpy = Atlas.TestSupport.ExternalTool.Run(Atlas.TestSupport.ExternalTool.Python, ["-c",
            "import sys, numpy as np\n" +
            "v = np.frombuffer(sys.stdin.buffer.read(), dtype='<f4').astype(np.float64)\n" +
            (variable == WaveParameter.Dir ? "v = np.fmod(v, 360.0); v = np.where(v < 0, v + 360.0, v)\n" : "") +
            $"q = np.round(v / {step.ToString("R", System.Globalization.CultureInfo.InvariantCulture)})\n" +
            (variable == WaveParameter.Dir ? "q = np.where(q >= 36000, 0, q)\n" : "") +
            "q = np.where(np.isnan(v), 65535, q).astype(np.int64)\n" +
            "print(' '.join(map(str, q)))"], values.SelectMany(BitConverter.GetBytes).ToArray());
        Assert.Equal(numpy.Trim(), string.Join(' ', codes));
    }

    // A value out of range (negative, infinite, above the largest code) anywhere in a run, in a whole vector or in the
    // tail, makes the run's quantisation give up, so that the caller names it value by value.
    [Theory]
    [InlineData(WaveParameter.Hs, -0.5f, 17)]
    [InlineData(WaveParameter.Hs, float.PositiveInfinity, 9_000)]
    [InlineData(WaveParameter.Te, 700f, Length - 1)]
    [InlineData(WaveParameter.Dir, float.NegativeInfinity, 5)]
    [InlineData(WaveParameter.Spread, float.NegativeInfinity, Length - 2)]
    public void AValueOutOfRangeAnywhereIsGivenUpOn(WaveParameter variable, float value, int at)
    {
        var values = Values(variable);
        values[at] = value;
        var quantiser = new SeriesQuantiser(variable);
        Assert.Equal(SeriesQuantiser.OutOfRange, quantiser.Quantise(value));
        Assert.False(quantiser.TryQuantise(values, new ushort[Length]));
    }

    private static float[] Values(WaveParameter variable)
    {
        var step = SeriesCodec.StepOf(variable);
        var top = variable == WaveParameter.Dir ? 359.9f : (float)SeriesCodec.MaximumOf(variable);
        var random = new Random(11);
        var values = new float[Length];
        for (var i = 0; i < Length; i++)
        {
            var code = random.Next(0, 20_000);
            values[i] = (i % 4) switch
            {
                0 => (float)(random.NextDouble() * top),
                1 => (float)((code + 0.5) * step),                              // near a tie, as a float holds it
                2 => BitConverter.Int32BitsToSingle(BitConverter.SingleToInt32Bits((float)((code + 0.5) * step)) + (i % 8 < 4 ? 1 : -1)),
                _ => (float)(code * step),
            };
        }
        float[] edges = [0f, -0f, float.NaN, (float)SeriesCodec.MaximumOf(variable), float.NaN];
        edges.CopyTo(values, 40);
        edges.CopyTo(values, Length - edges.Length);
        if (variable == WaveParameter.Dir)
        {
            float[] around = [-10.3f, 360f, 365.25f, 720f, -0.04f, 359.996f, -359.99f];
            around.CopyTo(values, 100);
            around.CopyTo(values, Length - 10);
        }
        return values;
    }
}
