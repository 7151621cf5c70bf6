using System.Text.Json.Nodes;
using Atlas.Ingest.Ingestion;
using Atlas.Storage.Datasets;
using Atlas.Storage.Spectra;
using Npgsql;

namespace Atlas.Ingest.Spectra;

/// <summary>
/// The last stage of an ingest of output points, after their series: stores what only the spectra give, each station-year's
/// per-step values aligned with its merged time line (<see cref="StationStepRecord"/>) and the monthly sums of the frequency
/// spectrum and direction-bin powers (<see cref="StationMonthSums"/>), inside the ingest's transaction; and records the
/// spectral axes, the integration rule and the gridded dataset the points belong to in the dataset metadata.
/// </summary>
/// <remarks>
/// A step already stored before this ingest, or given by an earlier file of it (monthly files sharing their boundary step),
/// is added to the monthly sums once. Steps stored before cannot be replaced by other values here: the sums would keep the
/// old spectra, so such a load is refused (remove the dataset and load it again).
/// </remarks>
public static class SpectralProductWriter
{
    public static async Task<IReadOnlyList<string>> WriteAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, IngestPlan plan, int datasetId,
        CancellationToken cancel)
    {
        var files = plan.Fresh;
        var axes = files[0].Spectra!.Axes;
        foreach (var file in files)
        {
            var other = file.Spectra ?? throw new IngestException($"{file.Name}: a file of fields cannot join a dataset of spectral output points.");
            if (!other.Axes.Frequencies.SequenceEqual(axes.Frequencies) || !other.Axes.DirectionsFrom.SequenceEqual(axes.DirectionsFrom))
                throw new IngestException($"{file.Name}: its frequencies or directions differ from those of {files[0].Name}; files of one dataset of output " +
                    "points must share their spectral axes.");
        }
        var metadata = await MetadataAsync(connection, transaction, plan, axes, cancel);
        if (plan.Request.ReplaceOverlap && files.Any(f => f.Times.Any(t => plan.StoredTimelines.TryGetValue(YearTimeline.YearOf(t), out var line) && Array.BinarySearch(line, t) >= 0)))
            throw new IngestException("--replace cannot change steps already stored for spectral output points: their monthly spectra would keep the old " +
                "values. Remove the dataset (atlas datasets remove) and load every file again.");

        int stations = plan.Grid.PointCount;
        var stored = plan.CreatesDataset ? [] : await StationSpectraStore.ReadStepsAsync(connection, transaction, datasetId, plan.Years, null, cancel);
        int nf = axes.FrequencyCount, nd = axes.DirectionCount;

        // Per station-year, the products on the year's merged time line: what was stored before, then each file's steps.
        var values = new Dictionary<(int Station, int Year), float[][]>();
        foreach (int year in plan.Years)
        {
            var line = plan.MergedTimelines[year];
            var before = plan.StoredTimelines.GetValueOrDefault(year, []);
            for (int s = 0; s < stations; s++)
            {
                var products = new float[SpectralProducts.Count][];
                for (int k = 0; k < products.Length; k++) { products[k] = new float[line.Length]; Array.Fill(products[k], float.NaN); }
                if (stored.TryGetValue((s, year), out var old))
                {
                    float[][] previous = [old.PowerSpectral, old.PowerParametric, old.Directionality, old.MaximumPowerFrom, old.SpectralWidth];
                    for (int t = 0; t < before.Length && t < previous[0].Length; t++)
                    {
                        int at = Array.BinarySearch(line, before[t]);
                        for (int k = 0; k < products.Length; k++) products[k][at] = previous[k][t];
                    }
                }
                values[(s, year)] = products;
            }
        }

        // Monthly sums count each step once: not when stored before, nor when an earlier file (or step) gave it already.
        // Each file summed its months as it was integrated; the spectra of a step counted elsewhere are taken out again.
        var counted = new HashSet<long>(plan.StoredTimelines.Values.SelectMany(line => line));
        var sums = new Dictionary<(int Station, int Year, int Month), (double[] Frequency, double[] Direction, int[] Steps)>();
        foreach (var file in files)
        {
            var spectra = file.Spectra!;
            int steps = file.Times.Length;
            var repeated = new List<int>();
            // Each step's year and place on that year's merged time line, found once for every station.
            var yearOf = new int[steps];
            var at = new int[steps];
            for (int t = 0; t < steps; t++)
            {
                long time = file.Times[t];
                yearOf[t] = YearTimeline.YearOf(time);
                at[t] = Array.BinarySearch(plan.MergedTimelines[yearOf[t]], time);
                if (!counted.Add(time)) repeated.Add(t);
            }
            for (int s = 0; s < stations; s++)
            {
                foreach (var product in SpectralProducts.All)
                {
                    var from = spectra.Product(product, s);
                    float[]? into = null;
                    for (int t = 0, year = -1; t < steps; t++)
                    {
                        if (yearOf[t] != year) into = values[(s, year = yearOf[t])][(int)product];
                        into![at[t]] = from[t];
                    }
                }
                for (int m = 0; m < spectra.Months.Count; m++)
                {
                    var (year, month) = spectra.Months[m];
                    var (frequency, direction, count) = spectra.MonthSum(m, s);
                    if (!sums.TryGetValue((s, year, month), out var sum))
                        sums[(s, year, month)] = sum = (new double[nf], new double[nd], new int[1]);
                    Add(sum.Frequency, frequency.Span, 1);
                    Add(sum.Direction, direction.Span, 1);
                    sum.Steps[0] += count;
                }
                var hs = spectra.Series(WaveParameter.Hs, s);
                var again = new List<int>();
                foreach (int t in repeated) if (!float.IsNaN(hs[t])) again.Add(t);
                if (again.Count == 0) continue;
                var twice = spectra.SpectraOf(s, again);
                for (int k = 0; k < again.Count; k++)
                {
                    var (year, month) = spectra.Months[spectra.MonthOf(again[k])];
                    var sum = sums[(s, year, month)];
                    Add(sum.Frequency, twice[k].Frequency, -1);
                    Add(sum.Direction, twice[k].Direction, -1);
                    sum.Steps[0]--;
                }
            }
        }
        var records = values.Select(v => new StationStepRecord(v.Key.Station, v.Key.Year, v.Value[0], v.Value[1], v.Value[2], v.Value[3], v.Value[4])).ToList();
        var monthSums = sums.Select(m => new StationMonthSums(m.Key.Station, m.Key.Year, m.Key.Month, m.Value.Steps[0], m.Value.Frequency, m.Value.Direction)).ToList();
        await StationSpectraStore.UpsertStepsAsync(connection, transaction, datasetId, plan.CreatesDataset, records, cancel);
        await StationSpectraStore.AddMonthSumsAsync(connection, transaction, datasetId, plan.CreatesDataset, monthSums, cancel);
        await DatasetStore.MergeMetadataAsync(connection, transaction, datasetId, metadata.ToJsonString(), cancel);
        return files.SelectMany(f => f.Spectra!.Notes).Distinct().ToList();
    }

    private static void Add(double[] into, ReadOnlySpan<double> values, int sign)
    {
        for (int i = 0; i < values.Length; i++) into[i] += sign * values[i];
    }

    /// <summary>The metadata under "spectra"; the axes must equal those stored by an earlier ingest of the dataset.</summary>
    private static async Task<JsonObject> MetadataAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, IngestPlan plan,
        WavePhysics.SpectralAxes axes, CancellationToken cancel)
    {
        var frequencies = axes.Frequencies.ToArray();
        var directions = axes.DirectionsFrom.ToArray();
        if (plan.Dataset is { } dataset && JsonNode.Parse(dataset.MetadataJson)?["spectra"] is JsonObject stored)
        {
            var storedFrequencies = stored["frequencies_hz"]!.AsArray().Select(v => v!.GetValue<double>()).ToArray();
            var storedDirections = stored["directions_from_deg"]!.AsArray().Select(v => v!.GetValue<double>()).ToArray();
            if (!storedFrequencies.SequenceEqual(frequencies) || !storedDirections.SequenceEqual(directions))
                throw new IngestException($"{plan.Fresh[0].Name}: its frequencies or directions differ from those already stored in dataset '{dataset.Slug}'.");
        }
        string? grid = plan.Request.GridDataset;
        if (grid is not null && await DatasetStore.FindAsync(connection, transaction, grid, cancel) is not { } gridDataset)
            throw new IngestException($"--grid-dataset names '{grid}', which is not a stored dataset.");
        var station = plan.Fresh[0].Spectra!;
        var spectra = new JsonObject
        {
            ["kind"] = axes.IsDirectional ? "directional" : "frequency",
            ["frequencies_hz"] = new JsonArray([.. frequencies.Select(f => (JsonNode)JsonValue.Create(f))]),
            ["directions_from_deg"] = new JsonArray([.. directions.Select(d => (JsonNode)JsonValue.Create(d))]),
            ["stations"] = new JsonArray([.. station.Stations.Select(s => (JsonNode)new JsonObject
            {
                ["name"] = s.Name,
                ["depth_m"] = double.IsNaN(s.DepthMetres) ? null : s.DepthMetres,
            })]),
            ["integration"] = "trapezoidal rule over the given frequencies (no tail added); direction integrals are bin sums times the bin width",
            ["per_step_storage"] = "Hs, Te, Tp, mean direction and spread in the series; J from the spectrum, J from Hm0 and Te, directionality, " +
                "direction of the largest resolved power and spectral width as float32 per step (20 bytes per step); monthly sums of S(f) and of each " +
                "direction bin's power; the spectra themselves are not stored",
            ["notes"] = new JsonArray([.. plan.Fresh.SelectMany(f => f.Spectra!.Notes).Distinct().Select(n => (JsonNode)JsonValue.Create(n))]),
        };
        if (grid is not null) spectra["grid_dataset"] = grid;
        else if (plan.Dataset is not null && JsonNode.Parse(plan.Dataset.MetadataJson)?["spectra"]?["grid_dataset"] is { } kept) spectra["grid_dataset"] = kept.DeepClone();
        return new JsonObject { ["spectra"] = spectra };
    }
}
