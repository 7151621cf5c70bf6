namespace Atlas.Statistics.Benchmarks;

/// <summary>
/// Invented hourly cell series shaped like the shared benchmark fixture (tests/../shared/bench/make_hindcast.py): a
/// seasonal Hs cycle scaled per cell with a faster modulation, Te = 5.5 + 1.6 sqrt(Hs), plus optional Tp, direction
/// and spread. A small pool of distinct cells is generated up front and cycled, so generation is not timed.
/// </summary>
internal sealed class SyntheticCells
{
    public SyntheticCells(int steps, int distinctCells, bool allParameters, int firstYear = 2001)
    {
        Times = new long[steps];
        long start = new DateTimeOffset(firstYear, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        for (int k = 0; k < steps; k++) Times[k] = start + 3600L * k;

        var random = new Random(1);
        Hs = new float[distinctCells][];
        Te = new float[distinctCells][];
        Tp = new float[distinctCells][];
        Dir = new float[distinctCells][];
        Spread = new float[distinctCells][];
        Depth = new double[distinctCells];
        for (int c = 0; c < distinctCells; c++)
        {
            double scale = 0.7 + 0.6 * random.NextDouble();
            Hs[c] = new float[steps];
            Te[c] = new float[steps];
            Tp[c] = allParameters ? new float[steps] : [];
            Dir[c] = allParameters ? new float[steps] : [];
            Spread[c] = allParameters ? new float[steps] : [];
            Depth[c] = allParameters ? 15 + 200 * random.NextDouble() : double.NaN;
            for (int k = 0; k < steps; k++)
            {
                double s = 2.5 + 1.2 * Math.Cos(2 * Math.PI * k / 8766.0);
                float h = (float)(s * scale * (1 + 0.3 * Math.Sin(k / 37.0)));
                Hs[c][k] = h;
                Te[c][k] = (float)(5.5 + 1.6 * Math.Sqrt(h));
                if (!allParameters) continue;
                Tp[c][k] = Te[c][k] / 0.9f;
                Dir[c][k] = (float)(250 + 40 * Math.Sin(k / 91.0) + 10 * random.NextDouble());
                Spread[c][k] = (float)(25 + 10 * Math.Cos(k / 53.0));
            }
            // A few gaps, as in real records.
            for (int g = 0; g < steps / 200; g++) Hs[c][random.Next(steps)] = float.NaN;
        }
    }

    public long[] Times { get; }
    public float[][] Hs { get; }
    public float[][] Te { get; }
    public float[][] Tp { get; }
    public float[][] Dir { get; }
    public float[][] Spread { get; }
    public double[] Depth { get; }

    public CellSeries Cell(int index)
    {
        int c = index % Hs.Length;
        return new CellSeries { Times = Times, Hs = Hs[c], Te = Te[c], Tp = Tp[c], Dir = Dir[c], Spread = Spread[c], DepthMetres = Depth[c] };
    }
}
