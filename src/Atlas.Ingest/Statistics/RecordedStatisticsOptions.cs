using System.Text.Json.Nodes;
using Atlas.Statistics;
using Atlas.WavePhysics;

namespace Atlas.Ingest.Statistics;

/// <summary>
/// The statistics options a pass used, recorded with the dataset's statistics (metadata member
/// <c>statistics.options</c>) so that layers and downloads report the bin widths and thresholds their values came
/// from, and so that a pass with other options recomputes every cell instead of mixing the two.
/// </summary>
public static class RecordedStatisticsOptions
{
    /// <summary>The member of the metadata's <c>statistics</c> object.</summary>
    public const string Member = "options";

    /// <summary>The options as recorded.</summary>
    public static JsonObject ToJson(StatisticsOptions options) => new()
    {
        ["hs_thresholds_m"] = Numbers(options.HsThresholdsMetres),
        ["j_thresholds_kw_per_m"] = Numbers(options.PowerThresholdsKilowattsPerMetre),
        ["low_coverage_threshold"] = options.LowCoverageThreshold,
        ["assumed_spectrum"] = options.AssumedSpectrum.ToString(),
        ["histograms"] = new JsonObject
        {
            ["hs"] = Binning(options.HsBinning),
            ["te_tp"] = Binning(options.PeriodBinning),
            ["j"] = Binning(options.PowerBinning),
            ["spread"] = Binning(options.SpreadBinning),
        },
    };

    /// <summary>
    /// The options of the dataset's stored statistics, or null when they are unknown: a pass with other options began
    /// and did not finish, so its statistics are partly of either options. Statistics stored before the options were
    /// recorded (or written without a pass's record) used the defaults, the only options there were.
    /// </summary>
    public static StatisticsOptions? Read(string metadataJson)
    {
        if (JsonNode.Parse(metadataJson) is not JsonObject root || root["statistics"] is not JsonObject notes) return new StatisticsOptions();
        if (!notes.TryGetPropertyValue(Member, out var recorded)) return new StatisticsOptions();
        if (recorded is not JsonObject o || o["histograms"] is not JsonObject h) return null;
        return new StatisticsOptions
        {
            HsThresholdsMetres = o["hs_thresholds_m"]!.AsArray().Select(v => v!.GetValue<double>()).ToArray(),
            PowerThresholdsKilowattsPerMetre = o["j_thresholds_kw_per_m"]!.AsArray().Select(v => v!.GetValue<double>()).ToArray(),
            LowCoverageThreshold = o["low_coverage_threshold"]!.GetValue<double>(),
            AssumedSpectrum = Enum.Parse<SpectrumShape>(o["assumed_spectrum"]!.GetValue<string>()),
            HsBinning = BinningOf(h["hs"]!),
            PeriodBinning = BinningOf(h["te_tp"]!),
            PowerBinning = BinningOf(h["j"]!),
            SpreadBinning = BinningOf(h["spread"]!),
        };
    }

    /// <summary>
    /// True when the dataset has stored statistics whose options differ from <paramref name="options"/>, or are unknown
    /// (a pass with other options began and did not finish): a pass must then recompute every cell.
    /// </summary>
    public static bool Differ(string metadataJson, StatisticsOptions options)
    {
        if (JsonNode.Parse(metadataJson) is not JsonObject root || root["statistics"] is not JsonObject) return false;
        return Read(metadataJson) is not { } recorded || ToJson(recorded).ToJsonString() != ToJson(options).ToJsonString();
    }

    /// <summary>
    /// The metadata to merge when a pass with other options begins: the recorded options become unknown until it
    /// finishes, so that a pass that fails half-way is followed by one that recomputes every cell.
    /// </summary>
    public static string Unsettled(string metadataJson)
    {
        var notes = (JsonNode.Parse(metadataJson) as JsonObject)?["statistics"] as JsonObject;
        var copy = notes is null ? new JsonObject() : (JsonObject)notes.DeepClone();
        copy[Member] = null;
        return new JsonObject { ["statistics"] = copy }.ToJsonString();
    }

    private static JsonArray Numbers(IReadOnlyList<double> values) => new([.. values.Select(v => (JsonNode)JsonValue.Create(v))]);

    private static JsonObject Binning(HistogramBinning binning) => new() { ["bin_width"] = binning.BinWidth, ["upper_bound"] = binning.UpperBound };

    private static HistogramBinning BinningOf(JsonNode node) => new(node["bin_width"]!.GetValue<double>(), node["upper_bound"]!.GetValue<double>());
}
