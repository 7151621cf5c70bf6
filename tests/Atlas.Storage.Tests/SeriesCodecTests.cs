using Atlas.Storage.Series;

namespace Atlas.Storage.Tests;

public class SeriesCodecTests
{
    // Quantisation targets of the ingest contract: Hs below 1 mm, periods below 0.01 s, directions below 0.1 degree.
    [Fact]
    public void RoundTripStaysWithinTheStatedQuantisation()
    {
        var random = new Random(7);
        const int n = 5000;
        float[] hs = new float[n], te = new float[n], tp = new float[n], dir = new float[n], spread = new float[n];
        for (var i = 0; i < n; i++)
        {
            hs[i] = (float)(random.NextDouble() * 20);
            te[i] = (float)(2 + random.NextDouble() * 20);
            tp[i] = (float)(2 + random.NextDouble() * 25);
            dir[i] = (float)(random.NextDouble() * 360);
            spread[i] = (float)(random.NextDouble() * 80);
        }
        hs[3] = float.NaN;
        var payload = SeriesCodec.Encode(n, hs, te, tp, dir, spread);
        Assert.Equal(SeriesCodec.HeaderBytes + 2 * 5 * n, payload.Length);
        var back = new float[n];
        Check(WaveParameter.Hs, hs, 0.0005 + 1e-6);
        Check(WaveParameter.Te, te, 0.005 + 1e-5);
        Check(WaveParameter.Tp, tp, 0.005 + 1e-5);
        Check(WaveParameter.Spread, spread, 0.005 + 1e-5);
        SeriesCodec.Decode(payload, WaveParameter.Dir, back);
        for (var i = 0; i < n; i++)
        {
            var d = Math.Abs(back[i] - dir[i]);
            Assert.True(Math.Min(d, 360 - d) <= 0.005 + 1e-4, $"direction {dir[i]} came back as {back[i]}");
        }

        void Check(WaveParameter variable, float[] expected, double tolerance)
        {
            SeriesCodec.Decode(payload, variable, back);
            for (var i = 0; i < n; i++)
            {
                if (float.IsNaN(expected[i])) { Assert.True(float.IsNaN(back[i])); continue; }
                Assert.True(Math.Abs(back[i] - expected[i]) <= tolerance, $"{variable} {expected[i]} came back as {back[i]}");
            }
        }
    }

    // Every one of the 65,536 codes of every variable, at lengths that leave a tail after the whole vectors, decodes
    // to the bits of the plain formula: the code times the variable's float step in double, rounded to float; NaN for
    // the missing code.
    [Fact]
    public void EveryCodeDecodesToTheBitsOfThePlainFormula()
    {
        WaveParameter[] variables = [WaveParameter.Hs, WaveParameter.Te, WaveParameter.Tp, WaveParameter.Dir, WaveParameter.Spread];
        foreach (int steps in new[] { 65_536, 65_536 - 5, 17, 3 })
        {
            var payload = SeriesCodec.CreateEmpty(steps, variables.Aggregate(0, (m, v) => m | SeriesCodec.BitOf(v)));
            for (int v = 0; v < variables.Length; v++)
            {
                var offset = SeriesCodec.OffsetOf(payload[1], steps, variables[v]);
                for (int i = 0; i < steps; i++)
                    System.Buffers.Binary.BinaryPrimitives.WriteUInt16LittleEndian(payload.AsSpan(offset + 2 * i), (ushort)((i * 7919 + v) & 0xFFFF));
            }
            var decoded = new float[steps];
            for (int v = 0; v < variables.Length; v++)
            {
                Assert.True(SeriesCodec.Decode(payload, variables[v], decoded));
                float step = (float)SeriesCodec.StepOf(variables[v]);
                for (int i = 0; i < steps; i++)
                {
                    var q = (ushort)((i * 7919 + v) & 0xFFFF);
                    float expected = q == SeriesCodec.Missing ? float.NaN : (float)(q * (double)step);
                    Assert.Equal(BitConverter.SingleToInt32Bits(expected), BitConverter.SingleToInt32Bits(decoded[i]));
                }
            }
        }
    }

    [Fact]
    public void AbsentVariablesDecodeAsMissingAndTakeNoSpace()
    {
        var payload = SeriesCodec.Encode(3, [1f, 2f, 3f], [], [], [], []);
        Assert.Equal(SeriesCodec.HeaderBytes + 6, payload.Length);
        var te = new float[3];
        Assert.False(SeriesCodec.Decode(payload, WaveParameter.Te, te));
        Assert.All(te, v => Assert.True(float.IsNaN(v)));
    }

    [Fact]
    public void ValuesOutsideTheStorableRangeAreRefusedByName()
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => SeriesCodec.Encode(1, [-0.5f], [], [], [], []));
        Assert.Contains("Hs", error.Message);
        Assert.Throws<ArgumentOutOfRangeException>(() => SeriesCodec.Encode(1, [], [700f], [], [], []));
    }

    [Fact]
    public void DirectionsWrapIntoZeroToThreeSixty()
    {
        var payload = SeriesCodec.Encode(3, [], [], [], [-10f, 370f, 359.999f], []);
        var back = new float[3];
        SeriesCodec.Decode(payload, WaveParameter.Dir, back);
        Assert.Equal(350f, back[0], 2);
        Assert.Equal(10f, back[1], 2);
        Assert.Equal(0f, back[2], 2);
    }
}
