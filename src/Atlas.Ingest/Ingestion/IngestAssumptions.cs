using System.Text.Json.Nodes;
using System.Text.Json;
using Atlas.Hindcast;
using Atlas.Statistics;
using Atlas.Storage.Datasets;
using Atlas.WavePhysics;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// Says, per wave variable, where an ingest took it from, how it was converted and what was assumed, so that nothing is
/// assumed silently; and warns of a record too short for meaningful statistics.
/// </summary>
public static class IngestAssumptions
{
    private static readonly (WaveParameter Variable, string Symbol)[] Order =
    [
        (WaveParameter.Hs, "hs"), (WaveParameter.Te, "te"), (WaveParameter.Tp, "tp"),
        (WaveParameter.Dir, "dir"), (WaveParameter.Spread, "spread"), (WaveParameter.Depth, "depth"),
    ];

    /// <summary>
    /// One entry per wave variable, in the order hs, te, tp, dir, spread, depth. The source of each is taken from the
    /// first file that has it. <paramref name="deepWaterCells"/> counts the wet cells stored with no depth (treated as
    /// deep water by the statistics); null when the cells were not written by this ingest, in which case the depth
    /// entry of <paramref name="storedMetadataJson"/> (the dataset's first load) is kept. <paramref name="assumedSpectrum"/>
    /// is the statistics' spectrum for Te from Tp (<see cref="StatisticsOptions.AssumedSpectrum"/>), stated where Te is absent.
    /// </summary>
    public static IReadOnlyList<VariableAssumption> Build(IReadOnlyList<SourceFile> files, CellDepths? depths, int? deepWaterCells,
        string? storedMetadataJson, SpectrumShape assumedSpectrum)
    {
        var list = new List<VariableAssumption>();
        foreach (var (variable, symbol) in Order)
        {
            if (variable == WaveParameter.Depth)
            {
                list.Add(deepWaterCells is null && StoredEntry(storedMetadataJson, "depth") is { } kept ? kept : Depth(files, depths, deepWaterCells));
                continue;
            }
            var source = files.Select(f => f.Sources.GetValueOrDefault(variable)).FirstOrDefault(s => s is not null);
            if (source is not null)
            {
                list.Add(new VariableAssumption(symbol, source.Name, source.FoundBy, source.Conversion, "none"));
                continue;
            }
            list.Add(new VariableAssumption(symbol, null, null, "none", Missing(variable, files, assumedSpectrum)));
        }
        return list;
    }

    /// <summary>
    /// Warnings about the whole record after this ingest (<paramref name="firstStep"/> to <paramref name="lastStep"/>,
    /// Unix seconds, with its nominal step): a record shorter than one calendar month is loaded (files may be short) but
    /// every period's statistics will be flagged low coverage.
    /// </summary>
    public static IReadOnlyList<string> Warnings(long firstStep, long lastStep, long nominalStepSeconds)
    {
        var start = DateTimeOffset.FromUnixTimeSeconds(firstStep);
        var end = DateTimeOffset.FromUnixTimeSeconds(lastStep + nominalStepSeconds);
        if (start.AddMonths(1) <= end) return [];
        return [$"the record spans {YearTimeline.Iso(firstStep)} to {YearTimeline.Iso(lastStep)}, shorter than one month: " +
                "its statistics will be flagged low coverage"];
    }

    /// <summary>The smallest positive interval between consecutive steps, s; 0 for a single step.</summary>
    public static long NominalStep(IEnumerable<long[]> timelines)
    {
        long step = long.MaxValue;
        foreach (var line in timelines)
            for (var k = 1; k < line.Length; k++)
                if (line[k] - line[k - 1] > 0) step = Math.Min(step, line[k] - line[k - 1]);
        return step == long.MaxValue ? 0 : step;
    }

    /// <param name="deepWaterCells">Wet cells written with no depth; null when this ingest did not write the cells (an
    /// addition to a dataset loaded before the metadata kept its assumptions), whose stored depths then stand.</param>
    private static VariableAssumption Depth(IReadOnlyList<SourceFile> files, CellDepths? depths, int? deepWaterCells)
    {
        const string Kept = "the cells keep the depths stored when the dataset was first loaded (deep water where none was stored)";
        if (depths is not null)
        {
            var source = files.First(f => f.Has(WaveParameter.Depth)).Sources[WaveParameter.Depth];
            var conversion = source.Conversion == "none" ? depths.Describe() : $"{depths.Describe()}; {source.Conversion}";
            var assumed = deepWaterCells switch
            {
                null => Kept,
                > 0 => $"deep water assumed in {deepWaterCells:N0} wet cells where the depth is missing",
                _ => "none",
            };
            return new VariableAssumption("depth", source.Name, source.FoundBy, conversion, assumed);
        }
        if (deepWaterCells is null) return new VariableAssumption("depth", null, null, "none", Kept);
        // A look-alike with unusable units can be mapped (with its units); one off the wave grid cannot be a cell depth.
        var hint = files.Select(f => f.DepthLookalike).FirstOrDefault(h => h is not null) is not { } lookalike ? ""
            : !lookalike.OnTheWaveGrid
                ? $" (variable '{lookalike.Name}' looks like depth but {lookalike.Reason}, so it cannot be the cell depth)"
                : $" (variable '{lookalike.Name}' looks like depth but {lookalike.Reason}: map it with {{\"depth\": \"{lookalike.Name}\"}} " +
                  "and give its units under \"units\")";
        return new VariableAssumption("depth", null, null, "none", $"deep water assumed in {deepWaterCells:N0} cells{hint}");
    }

    /// <summary>What the statistics do without the variable, stated as they do it.</summary>
    private static string Missing(WaveParameter variable, IReadOnlyList<SourceFile> files, SpectrumShape assumedSpectrum) => variable switch
    {
        WaveParameter.Te when files.Any(f => f.Has(WaveParameter.Tp)) => AssumedEnergyPeriod(assumedSpectrum),
        WaveParameter.Te => "no Te and no power",
        WaveParameter.Tp => "no Tp statistics",
        WaveParameter.Dir => "no direction statistics and no directionality coefficient (it needs each step's direction)",
        WaveParameter.Spread => "no spread statistics and no directionality coefficient (each step's spreading is modelled from its spread)",
        _ => "none",
    };

    /// <summary>The statistics' own rule (<see cref="StatisticsOptions.AssumedSpectrum"/>), so the text follows the code.</summary>
    private static string AssumedEnergyPeriod(SpectrumShape shape)
    {
        var ratio = PeriodConversion.EnergyToPeakPeriodRatio(shape);
        var name = shape switch
        {
            SpectrumShape.JonswapGamma33 => "JONSWAP, gamma 3.3",
            SpectrumShape.PiersonMoskowitz => "Pierson-Moskowitz",
            _ => shape.ToString(),
        };
        return $"Te = {ratio:0.###} Tp assumed ({name})";
    }

    private static VariableAssumption? StoredEntry(string? metadataJson, string variable)
    {
        if (metadataJson is null) return null;
        using var document = JsonDocument.Parse(metadataJson);
        return VariableAssumption.ListFrom(document.RootElement).FirstOrDefault(a => a.Variable == variable);
    }

    /// <summary>The metadata array.</summary>
    public static JsonArray ToJson(IReadOnlyList<VariableAssumption> assumptions) => new([.. assumptions.Select(a => (JsonNode)a.ToJson())]);
}
