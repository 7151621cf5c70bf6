namespace Atlas.Demo.Tests;

[Collection(FullModelCollection.Name)]
public class BuoyRecordTests(FullModelFixture full)
{
    [Fact]
    public void BuoyBiasAndScatterMatchWhatTheManifestStates()
    {
        // A year of hourly records against the model's truth at each buoy cell. The mean log ratio
        // is ln(1 + bias): the red local departures (0.07, 18 h memory) leave about 240 independent
        // values, a standard error of 0.005, tolerance 0.015. The spread of the log ratio is
        // sqrt(0.06^2 + 0.07^2) = 0.092, tolerance 0.015.
        var start = full.Options.Start;
        foreach (var (buoy, cell, stream) in DemoStations.Place(full.Grid, 60))
        {
            var rows = BuoyRecordSimulator.Simulate(full.Model, cell, buoy, start, start.AddYears(1), new Xoshiro256StarStar(full.Options.Seed, stream));
            var logRatios = new List<double>();
            var pairs = new List<(double Model, double Observed)>();
            foreach (var row in rows.Where(r => r.Quality == 0))
            {
                double truth = full.Model.Evaluate(cell, row.Time).Hs;
                pairs.Add((truth, row.Hs));
                if (truth >= 0.5) logRatios.Add(Math.Log(row.Hs / truth)); // 0.01 m logging would dominate below
            }
            double mean = logRatios.Average();
            double sd = Math.Sqrt(logRatios.Sum(x => (x - mean) * (x - mean)) / (logRatios.Count - 1));
            Assert.Equal(Math.Log(1 + buoy.HsBiasFraction), mean, 0.015);
            Assert.Equal(Math.Sqrt(Math.Pow(BuoyRecordSimulator.HsNoise, 2) + Math.Pow(BuoyRecordSimulator.HsLocalVariability, 2)), sd, 0.015);

            // Scatter index SI = RMSE / mean(observed) (common practice): about 0.1-0.15 for a
            // well-calibrated regional model, which the demo imitates.
            double rmse = Math.Sqrt(pairs.Average(p => (p.Model - p.Observed) * (p.Model - p.Observed)));
            double scatterIndex = rmse / pairs.Average(p => p.Observed);
            Assert.InRange(scatterIndex, 0.08, 0.18);
        }
    }

    [Fact]
    public void PeakPeriodsSitOnTheSpectralFrequencyBins()
    {
        // Tp = 1 / (n * 0.005 Hz): a buoy reports the peak of a spectrum with that resolution.
        foreach (double tp in new[] { 3.3, 7.9, 12.4, 17.0 })
        {
            double q = BuoyRecordSimulator.QuantisePeakPeriod(tp);
            double bins = 1.0 / (q * BuoyRecordSimulator.FrequencyResolutionHertz);
            Assert.Equal(Math.Round(bins), bins, 1e-9);
            Assert.True(Math.Abs(1 / q - 1 / tp) <= BuoyRecordSimulator.FrequencyResolutionHertz / 2 + 1e-12);
        }
    }
}
