using System.Text.Json.Nodes;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// What the atlas took for one wave variable (hs, te, tp, dir, spread, depth): the file variable it came from, the
/// conversion applied and what was assumed. Kept in the dataset metadata as one element of <c>assumptions</c>.
/// </summary>
/// <param name="Variable">The atlas symbol: hs, te, tp, dir, spread or depth.</param>
/// <param name="Source">The file variable, or null when none was found.</param>
/// <param name="FoundBy">How the file variable was found ("standard_name '...'", "the mapping file", "its name"), or null.</param>
/// <param name="Conversion">The conversion applied, or "none".</param>
/// <param name="Assumed">What was assumed in its place or beside it, or "none".</param>
public sealed record VariableAssumption(string Variable, string? Source, string? FoundBy, string Conversion, string Assumed)
{
    /// <summary>One line of the ingest summary, e.g. "tp: from 'fp' (standard_name '...'), converted Tp = 1/fp (...)".</summary>
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
}
