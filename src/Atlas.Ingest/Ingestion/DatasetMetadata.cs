using System.Text.Json.Nodes;
using Atlas.Storage.Datasets;
using Atlas.Storage.Series;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// The metadata an ingest records on its dataset: variables and units, storage scheme, source notes, and what was
/// assumed: <c>assumptions</c> is an array of { variable, source, found_by, conversion, assumed } (one per hs, te, tp,
/// dir, spread, depth; source and found_by null when none was found), <c>warnings</c> an array of sentences.
/// </summary>
public static class DatasetMetadata
{
    public static string Describe(IReadOnlyList<SourceFile> files, int mask, bool hasDepth,
        IReadOnlyList<VariableAssumption>? assumptions = null, IReadOnlyList<string>? warnings = null)
    {
        var variables = new JsonObject();
        foreach (WaveParameter v in WaveParameterGroups.SeriesFields)
        {
            if ((mask & SeriesCodec.BitOf(v)) == 0) continue;
            variables[v.Symbol()] = new JsonObject
            {
                ["units"] = v.Unit(),
                ["quantisation_step"] = SeriesCodec.StepOf(v),
            };
        }
        if (hasDepth) variables["depth"] = new JsonObject { ["units"] = "m" };
        var first = files[0];
        var json = new JsonObject
        {
            ["variables"] = variables,
            ["stored_variable_mask"] = mask,
            ["storage"] = "16-bit fixed-step packing per value (Hs 1 mm; Te, Tp 0.01 s; direction and spread 0.01 degree), one row per cell and year",
            ["source_title"] = first.Attribute("title"),
            ["source_institution"] = first.Attribute("institution"),
            ["source_description"] = first.Attribute("source"),
            ["source_comment"] = first.Attribute("comment"),
            ["licence"] = first.Attribute("license") ?? first.Attribute("licence") ?? "not stated in the source files",
            ["citation"] = first.Attribute("references") ?? first.Attribute("citation"),
            ["depth_note"] = first.Spectra is not null
                ? hasDepth ? "finite-depth power from each output point's depth" : "the source gives no depth at the output points: power is computed for deep water"
                : hasDepth
                ? "finite-depth power from the cell depth"
                : "the source has no depth: power is computed for deep water",
            ["assumptions"] = IngestAssumptions.ToJson(assumptions ?? []),
            ["warnings"] = new JsonArray([.. (warnings ?? []).Select(w => (JsonNode)JsonValue.Create(w))]),
        };
        return json.ToJsonString();
    }
}
