namespace Atlas.Statistics.Tests;

/// <summary>
/// Invented sea-state series for the tests: a seasonal Hs cycle with storms and noise, periods tied to Hs, a
/// direction veering through north, spread, and missing steps of every kind (random NaN, a three-week gap, a
/// negative Hs, a zero Te). Deterministic for a seed.
/// </summary>
internal sealed class InventedSeries
{
    public InventedSeries(int firstYear = 2001, int years = 3, int stepHours = 3, int seed = 7, double depthMetres = 25)
    {
        long start = new DateTimeOffset(firstYear, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        long end = new DateTimeOffset(firstYear + years, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        int n = (int)((end - start) / (3600L * stepHours));
        var random = new Random(seed);
        Times = new long[n];
        Hs = new float[n];
        Te = new float[n];
        Tp = new float[n];
        Dir = new float[n];
        Spread = new float[n];
        DepthMetres = depthMetres;
        for (int k = 0; k < n; k++)
        {
            Times[k] = start + 3600L * stepHours * k;
            double day = k * stepHours / 24.0;
            double storm = Math.Max(0, Math.Sin(2 * Math.PI * day / 9.3)) * 2.5 * random.NextDouble();
            double hs = 1.8 + 1.1 * Math.Cos(2 * Math.PI * day / 365.25) + storm + 0.3 * random.NextDouble();
            Hs[k] = (float)hs;
            Te[k] = (float)(4.2 + 1.7 * Math.Sqrt(hs) + 0.8 * random.NextDouble());
            Tp[k] = (float)(Te[k] / 0.9 + 0.5 * (random.NextDouble() - 0.5));
            Dir[k] = (float)((330 + 70 * Math.Sin(2 * Math.PI * day / 23.0) + 25 * random.NextDouble() + 360) % 360);
            Spread[k] = (float)(18 + 30 * random.NextDouble());
            if (random.NextDouble() < 0.02) Hs[k] = float.NaN;
            if (random.NextDouble() < 0.01) Te[k] = float.NaN;
            if (random.NextDouble() < 0.01) Dir[k] = float.NaN;
        }
        // A three-week gap in March (of the second year when there is one), and two invalid values.
        int gapStart = Array.FindIndex(Times, t => t >= new DateTimeOffset(firstYear + (years > 1 ? 1 : 0), 3, 3, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds());
        for (int k = gapStart; k < gapStart + 21 * 24 / stepHours; k++) Hs[k] = float.NaN;
        Hs[n / 3] = -1f;
        Te[n / 2] = 0f;
    }

    public long[] Times { get; }
    public float[] Hs { get; }
    public float[] Te { get; set; }
    public float[] Tp { get; }
    public float[] Dir { get; }
    public float[] Spread { get; }
    public double DepthMetres { get; set; }

    public CellSeries Series(bool withTe = true) => new()
    {
        Times = Times, Hs = Hs, Te = withTe ? Te : [], Tp = Tp, Dir = Dir, Spread = Spread, DepthMetres = DepthMetres,
    };

    /// <summary>Runs reference_statistics.py on this series.</summary>
    public System.Text.Json.Nodes.JsonNode Reference(StatisticsOptions options, bool withTe = true, string method = "linear",
        AnalysisWindow? window = null, double hsCurveStep = 0.1, double powerCurveStep = 1.0)
    {
        using var python = new NumPyReference();
        python.Write<long>("times.i64", Times).Write<float>("hs.f32", Hs).Write<float>("te.f32", withTe ? Te : [])
              .Write<float>("tp.f32", Tp).Write<float>("dir.f32", Dir).Write<float>("spread.f32", Spread)
              .WriteJson("settings.json", new Dictionary<string, object?>
              {
                  ["depth"] = double.IsNaN(DepthMetres) ? null : DepthMetres,
                  ["method"] = method,
                  ["hsThresholds"] = options.HsThresholdsMetres,
                  ["powerThresholds"] = options.PowerThresholdsKilowattsPerMetre,
                  ["lowCoverage"] = options.LowCoverageThreshold,
                  ["hsCurveStep"] = hsCurveStep,
                  ["powerCurveStep"] = powerCurveStep,
                  ["window"] = window is null ? null : new Dictionary<string, object?>
                  {
                      ["firstYear"] = window.FirstYear, ["lastYear"] = window.LastYear, ["months"] = window.Months,
                  },
              });
        return python.Run("reference_statistics.py");
    }
}
