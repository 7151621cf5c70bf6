using System.Globalization;
using System.Text;
using System.Text.Json;
using Atlas.Ingest.Statistics;
using Atlas.Storage.Datasets;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;

namespace Atlas.Cli.Datasets;

/// <summary>
/// The text of <c>atlas datasets list</c> and <c>atlas datasets show</c>: one line a dataset, or one dataset in full.
/// Numbers are written with the invariant culture, so the output reads the same on every machine.
/// </summary>
public static class DatasetReport
{
    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    /// <summary>One line: slug, title, grid kind, cells, years and the state of the statistics.</summary>
    public static string Line(DatasetSummary summary)
    {
        var d = summary.Dataset;
        return $"{d.Slug}  \"{d.Title}\"  {d.GridKind}  {Count(d.PointCount)} cells ({Count(summary.WetCellCount)} wet)  " +
               $"years {Years(summary.Years)}  statistics: {StatisticsState(summary)}";
    }

    /// <summary>The whole description of one dataset, line by line.</summary>
    /// <param name="passes">The dataset's statistics passes in parts, newest first; their parts are summed up there
    /// rather than listed among the jobs.</param>
    public static string Describe(DatasetSummary summary, DatasetStorage storage, IReadOnlyList<JobRecord> jobs, IReadOnlyList<PassProgress> passes)
    {
        var d = summary.Dataset;
        using var metadata = JsonDocument.Parse(d.MetadataJson);
        var text = new StringBuilder();
        void Row(string label, string value) => text.Append("  ").Append(label.PadRight(12)).Append(value).Append('\n');

        text.Append(d.Slug).Append(": ").Append(d.Title).Append('\n');
        Row("created", Time(d.CreatedAtUtc));
        Row("grid", d.Nx is { } nx && d.Ny is { } ny ? $"{d.GridKind}, {Count(nx)} x {Count(ny)}" : d.GridKind);
        Row("extent", summary.West is { } w && summary.South is { } s && summary.East is { } e && summary.North is { } n
            ? $"longitude {Degrees(w)} to {Degrees(e)}, latitude {Degrees(s)} to {Degrees(n)} (wet cells)"
            : "none (no wet cell)");
        Row("cells", $"{Count(d.PointCount)} points, {Count(summary.WetCellCount)} wet");
        Row("years", $"{Years(summary.Years)} ({Count(summary.StepCount)} time steps" +
                     (summary.MedianStepSeconds is { } step ? $", typically {Count(step)} s apart" : "") +
                     (summary.FirstTimeUtc is { } first && summary.LastTimeUtc is { } last ? $", {Time(first)} to {Time(last)})" : ")"));
        Row("variables", Variables(metadata.RootElement));
        if (metadata.RootElement.TryGetProperty("spectra", out var spectra)) OutputPoints(spectra, Row);

        var assumptions = VariableAssumption.ListFrom(metadata.RootElement);
        text.Append("  assumed at ingest:").Append(assumptions.Count == 0 ? " not recorded (loaded before assumptions were kept)\n" : "\n");
        foreach (var a in assumptions) text.Append("    ").Append(a.Describe()).Append('\n');
        var warnings = Strings(metadata.RootElement, "warnings");
        if (warnings.Count > 0)
        {
            text.Append("  ingest warnings:\n");
            foreach (var warning in warnings) text.Append("    ").Append(warning).Append('\n');
        }

        text.Append("  stored size (sums of pg_column_size over the dataset's rows; indexes and row headers not counted):\n");
        text.Append("    series       ").Append(Count(storage.SeriesChunkCount)).Append(" chunks, ").Append(Bytes(storage.SeriesBytes)).Append('\n');
        text.Append("    statistics   ").Append(Count(storage.StatisticBlockCount)).Append(" blocks, ").Append(Bytes(storage.StatisticBytes)).Append('\n');
        if (storage.SpectralYearCount > 0)
        {
            text.Append("    spectral     ").Append(Count(storage.SpectralYearCount)).Append(" station-years of per-step values, ").Append(Bytes(storage.SpectralBytes))
                .Append("; ").Append(Count(storage.SpectrumMonthCount)).Append(" station-months of spectrum sums, ").Append(Bytes(storage.SpectrumMonthBytes)).Append('\n');
        }

        text.Append("  statistics: ").Append(StatisticsState(summary)).Append('\n');
        if (summary.StatisticsCellCount > 0)
        {
            text.Append("    ").Append(Count(summary.StatisticsCellCount)).Append(" of ").Append(Count(summary.WetCellCount)).Append(" wet cells computed\n");
            if (StatisticsService.StoredMethodVersion(d.MetadataJson) is { } version)
                text.Append("    method version ").Append(version).Append(" (this program computes version ").Append(Atlas.Statistics.MethodNotes.Version).Append(")\n");
            if (ComputedAt(metadata.RootElement) is { } computedAt) text.Append("    last pass ").Append(computedAt).Append('\n');
            text.Append("    options: ").Append(RecordedStatisticsOptions.Read(d.MetadataJson) is { } options
                ? Options(options)
                : "unknown: a pass with other options began and did not finish").Append('\n');
        }

        if (passes.Count > 0)
        {
            text.Append("  passes in parts:\n");
            foreach (var pass in passes) text.Append("    ").Append(Jobs.PassReport.Line(pass, DateTime.UtcNow)).Append('\n');
        }
        var whole = jobs.Where(j => j.PassId is null).ToList();
        text.Append("  jobs:").Append(whole.Count == 0 ? " none\n" : "\n");
        foreach (var job in whole) text.Append("    ").Append(JobLine(job)).Append('\n');
        return text.ToString();
    }

    /// <summary>The output points of a dataset of spectra: their names and depths, the spectral axes, the gridded dataset they belong to.</summary>
    private static void OutputPoints(JsonElement spectra, Action<string, string> row)
    {
        var stations = spectra.TryGetProperty("stations", out var list) ? list.EnumerateArray().ToList() : [];
        row("points", string.Join(", ", stations.Select(s => s.GetProperty("name").GetString() +
            (s.TryGetProperty("depth_m", out var depth) && depth.ValueKind == JsonValueKind.Number ? $" ({depth.GetDouble():0.#} m)" : " (no depth: deep water)"))));
        var frequencies = spectra.GetProperty("frequencies_hz").EnumerateArray().Select(f => f.GetDouble()).ToArray();
        var directions = spectra.GetProperty("directions_from_deg").GetArrayLength();
        row("spectra", $"{spectra.GetProperty("kind").GetString()}, {frequencies.Length} frequencies {frequencies[0]:0.####} to {frequencies[^1]:0.####} Hz" +
            (directions > 0 ? $", {directions} directions of {360.0 / directions:0.##} degrees" : ""));
        if (spectra.TryGetProperty("grid_dataset", out var grid) && grid.ValueKind == JsonValueKind.String)
            row("beside", $"gridded dataset '{grid.GetString()}' (its point answers add the nearest of these points)");
    }

    /// <summary>What a removal takes away, in a phrase: cells, series chunks and their size, statistic blocks.</summary>
    public static string Contents(DatasetSummary summary, DatasetStorage storage) =>
        $"{Count(summary.Dataset.PointCount)} cells; {Count(storage.SeriesChunkCount)} series chunks, {Bytes(storage.SeriesBytes)}; " +
        $"{Count(storage.StatisticBlockCount)} statistic blocks, {Bytes(storage.StatisticBytes)}";

    /// <summary>
    /// "none", "complete" (every wet cell computed by this program's method), or what is missing: cells not computed,
    /// an older method, or options left unknown by an unfinished pass.
    /// </summary>
    public static string StatisticsState(DatasetSummary summary)
    {
        if (summary.StatisticsCellCount == 0) return "none";
        var metadata = summary.Dataset.MetadataJson;
        var problems = new List<string>();
        if (summary.StatisticsCellCount < summary.WetCellCount)
            problems.Add($"{Count(summary.StatisticsCellCount)} of {Count(summary.WetCellCount)} wet cells");
        if (StatisticsService.StoredMethodVersion(metadata) is { } version && version != Atlas.Statistics.MethodNotes.Version)
            problems.Add($"method version {version}, not {Atlas.Statistics.MethodNotes.Version}");
        if (RecordedStatisticsOptions.Read(metadata) is null) problems.Add("options unknown");
        return problems.Count == 0 ? "complete" : "partial (" + string.Join("; ", problems) + ")";
    }

    public static string JobLine(JobRecord job)
    {
        var line = $"job {job.Id}  {JobQueue.KindName(job.Kind)}  {job.State}  queued {Time(job.CreatedAtUtc)}";
        if (job.FinishedAtUtc is { } finished) line += $", finished {Time(finished)}";
        if (job.ClaimedBy is { } worker && job.State == "running") line += $", by {worker}";
        // An error is shown whole, its further lines indented under the job; of a summary only the first line, since
        // an ingest's further lines repeat the assumptions listed above.
        if (job.Error is { } error) line += ": " + error.ReplaceLineEndings("\n      ");
        else if (job.Summary is { } summary) line += ": " + summary.ReplaceLineEndings("\n").Split('\n')[0];
        return line;
    }

    private static string Options(Atlas.Statistics.StatisticsOptions o) =>
        $"Hs thresholds {Numbers(o.HsThresholdsMetres)} m; J thresholds {Numbers(o.PowerThresholdsKilowattsPerMetre)} kW/m; " +
        $"low coverage below {o.LowCoverageThreshold.ToString(Invariant)}; Te from Tp where Te is absent: {Atlas.Statistics.MethodNotes.AssumedSpectrum(o.AssumedSpectrum)}; " +
        $"histogram bins Hs {o.HsBinning.BinWidth.ToString(Invariant)} m, Te/Tp {o.PeriodBinning.BinWidth.ToString(Invariant)} s, " +
        $"J {o.PowerBinning.BinWidth.ToString(Invariant)} kW/m, spread {o.SpreadBinning.BinWidth.ToString(Invariant)} degree";

    private static string Variables(JsonElement metadata)
    {
        if (metadata.ValueKind != JsonValueKind.Object || !metadata.TryGetProperty("variables", out var variables) || variables.ValueKind != JsonValueKind.Object)
            return "not recorded";
        var names = variables.EnumerateObject()
            .Select(v => v.Value.ValueKind == JsonValueKind.Object && v.Value.TryGetProperty("units", out var u) && u.ValueKind == JsonValueKind.String
                ? $"{v.Name} ({u.GetString()})"
                : v.Name)
            .ToArray();
        return names.Length == 0 ? "none" : string.Join(", ", names);
    }

    private static string? ComputedAt(JsonElement metadata) =>
        metadata.ValueKind == JsonValueKind.Object && metadata.TryGetProperty("statistics", out var notes) && notes.ValueKind == JsonValueKind.Object
        && notes.TryGetProperty("computed_at", out var at) && at.ValueKind == JsonValueKind.String
        && DateTime.TryParse(at.GetString(), Invariant, DateTimeStyles.AdjustToUniversal | DateTimeStyles.AssumeUniversal, out var time)
            ? Time(time)
            : null;

    private static IReadOnlyList<string> Strings(JsonElement metadata, string member) =>
        metadata.ValueKind == JsonValueKind.Object && metadata.TryGetProperty(member, out var list) && list.ValueKind == JsonValueKind.Array
            ? list.EnumerateArray().Where(e => e.ValueKind == JsonValueKind.String).Select(e => e.GetString()!).ToArray()
            : [];

    /// <summary>Years as runs: "2019-2021, 2023"; "none" when no year is stored.</summary>
    public static string Years(IReadOnlyList<int> years)
    {
        if (years.Count == 0) return "none";
        var runs = new List<string>();
        var start = years[0];
        for (var i = 1; i <= years.Count; i++)
        {
            if (i < years.Count && years[i] == years[i - 1] + 1) continue;
            var end = years[i - 1];
            runs.Add(end == start ? start.ToString(Invariant) : $"{start}-{end}");
            if (i < years.Count) start = years[i];
        }
        return string.Join(", ", runs);
    }

    /// <summary>A byte count in binary units with the exact count beside it: "1.5 MiB (1,572,864 bytes)".</summary>
    public static string Bytes(long bytes)
    {
        string[] units = ["KiB", "MiB", "GiB", "TiB"];
        if (bytes < 1024) return $"{Count(bytes)} bytes";
        double value = bytes;
        var unit = -1;
        while (value >= 1024 && unit < units.Length - 1)
        {
            value /= 1024;
            unit++;
        }
        return $"{value.ToString("0.0", Invariant)} {units[unit]} ({Count(bytes)} bytes)";
    }

    private static string Count(long value) => value.ToString("N0", Invariant);

    private static string Numbers(IEnumerable<double> values) => string.Join(", ", values.Select(v => v.ToString(Invariant)));

    private static string Degrees(double value) => value.ToString("0.000", Invariant);

    private static string Time(DateTime utc) => utc.ToString("yyyy-MM-dd HH:mm 'UTC'", Invariant);
}
