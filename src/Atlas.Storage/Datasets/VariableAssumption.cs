using System.Text.Json;
using System.Text.Json.Nodes;

namespace Atlas.Storage.Datasets;

/// <summary>
/// What an ingest took for one wave variable (hs, te, tp, dir, spread, depth): the file variable it came from, how it
/// was found, the conversion applied and what was assumed. The dataset metadata keeps the list under
/// <c>assumptions</c> as objects { variable, source, found_by, conversion, assumed }; the ingest writes it and the API's
/// provenance reads it back.
/// </summary>
/// <param name="Variable">The atlas symbol: hs, te, tp, dir, spread or depth.</param>
/// <param name="Source">The file variable, or null when none was found.</param>
/// <param name="FoundBy">How the file variable was found ("standard_name '...'", "the mapping file", "its name ..."), or null.</param>
/// <param name="Conversion">The conversion applied, or "none".</param>
/// <param name="Assumed">What was assumed in its place or beside it, or "none".</param>
public sealed record VariableAssumption(string Variable, string? Source, string? FoundBy, string Conversion, string Assumed)
{
    /// <summary>The metadata member that holds the list.</summary>
    public const string MetadataKey = "assumptions";

    /// <summary>One line, e.g. "tp: from 'fp' (standard_name '...'), converted Tp = 1/fp (...)" or "depth: none found; ...".</summary>
    public string Describe()
    {
        var text = Source is null ? $"{Variable}: none found" : $"{Variable}: from '{Source}' ({FoundBy})";
        if (Conversion != "none") text += ", " + Conversion;
        if (Assumed != "none") text += "; " + Assumed;
        return text;
    }

    /// <summary>The metadata form: { variable, source, found_by, conversion, assumed }.</summary>
    public JsonObject ToJson() => new()
    {
        ["variable"] = Variable,
        ["source"] = Source,
        ["found_by"] = FoundBy,
        ["conversion"] = Conversion,
        ["assumed"] = Assumed,
    };

    /// <summary>The list kept in a dataset's metadata; empty when the dataset was loaded before it was kept.</summary>
    public static IReadOnlyList<VariableAssumption> ListFrom(JsonElement metadata)
    {
        if (metadata.ValueKind != JsonValueKind.Object || !metadata.TryGetProperty(MetadataKey, out var list) || list.ValueKind != JsonValueKind.Array)
            return [];
        return list.EnumerateArray()
            .Where(e => Text(e, "variable") is not null)
            .Select(e => new VariableAssumption(Text(e, "variable")!, Text(e, "source"), Text(e, "found_by"),
                Text(e, "conversion") ?? "none", Text(e, "assumed") ?? "none"))
            .ToArray();
    }

    private static string? Text(JsonElement element, string name) =>
        element.ValueKind == JsonValueKind.Object && element.TryGetProperty(name, out var value) && value.ValueKind == JsonValueKind.String
            ? value.GetString()
            : null;
}
