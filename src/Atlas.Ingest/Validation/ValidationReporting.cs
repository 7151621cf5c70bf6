using System.Globalization;
using System.Text.Json.Nodes;
using System.Text.Json;
using Atlas.Assessment;
using Atlas.Statistics;

namespace Atlas.Ingest.Validation;

/// <summary>Turns station validations into skill tables (the API's and the command line's) and the dataset metadata summary.</summary>
public static class ValidationReporting
{
    public const string MatchingMethod =
        "nearest wet cell to the station (no spatial interpolation); in time, linear interpolation between the two model steps " +
        "bracketing each observation, both within the tolerance (directions along the shorter arc); flagged rows, observation " +
        "gaps, model gaps and missing values are counted and never paired";

    public static StationSkill Skill(StationValidation validation)
    {
        var c = validation.Cell;
        var cell = new ValidatedCell(c.Cell.CellId, c.Cell.Latitude, c.Cell.Longitude, c.Cell.DepthMetres, Math.Round(c.DistanceMetres, 1));
        var variables = validation.Variables.Select(VariableOf).ToArray();
        return new StationSkill(StationItem.From(validation.Station), cell, new MatchingNote(MatchingMethod, validation.ToleranceHours), variables, validation.Notes);
    }

    private static VariableSkill VariableOf(VariableValidation v)
    {
        var symbol = v.Variable.Symbol();
        var byClass = v.ByHsClass.Select(k => new SkillGroup(null, k.LowerMetres, double.IsFinite(k.UpperMetres) ? k.UpperMetres : null,
            k.Scalar is { } s ? SkillRow.From(s) : null, k.Directional is { } d ? DirectionalSkillRow.From(d) : null)).ToArray();
        if (v.Scalar is { } scalar)
            return new VariableSkill(symbol, v.Variable.Unit(), MatchCountsRow.From(scalar.Counts), SkillRow.From(scalar.Overall), null,
                scalar.BySeason.Select(s => new SkillGroup(SeasonName(s.Season), null, null, SkillRow.From(s.Scores), null)).ToArray(), byClass);
        var direction = v.Directional!;
        return new VariableSkill(symbol, v.Variable.Unit(), MatchCountsRow.From(direction.Counts), null, DirectionalSkillRow.From(direction.Overall),
            direction.BySeason.Select(s => new SkillGroup(SeasonName(s.Season), null, null, null, DirectionalSkillRow.From(s.Scores))).ToArray(), byClass);
    }

    public static string SeasonName(AtlasPeriod season) => season.Name;

    /// <summary>
    /// One line per validated station from the <c>validation</c> member of a dataset's metadata (what <c>atlas validate</c>
    /// stored), for the head of a download: "Name (role): hs N=..., bias=... m, RMSE=... m, SI=..., r=...". Empty when
    /// the dataset has not been validated.
    /// </summary>
    public static IReadOnlyList<string> SummaryLines(string metadataJson)
    {
        using var document = JsonDocument.Parse(metadataJson);
        if (!document.RootElement.TryGetProperty("validation", out var validation) || validation.ValueKind != JsonValueKind.Object
            || !validation.TryGetProperty("stations", out var stations) || stations.ValueKind != JsonValueKind.Array)
            return [];
        var c = CultureInfo.InvariantCulture;
        var lines = new List<string>();
        foreach (var station in stations.EnumerateArray())
        {
            if (!station.TryGetProperty("variables", out var variables) || !variables.TryGetProperty("hs", out var hs)) continue;
            string Number(string name, string format) => hs.TryGetProperty(name, out var v) && v.ValueKind == JsonValueKind.Number ? v.GetDouble().ToString(format, c) : "n/a";
            lines.Add($"{Text(station, "station")} ({Text(station, "role")}): hs N={Number("n", "0")}, bias={Number("bias", "0.###")} m, " +
                      $"RMSE={Number("rmse", "0.###")} m, SI={Number("scatter_index", "0.###")}, r={Number("pearson_r", "0.###")}");
        }
        if (lines.Count > 0 && validation.TryGetProperty("computed_at", out var at) && at.ValueKind == JsonValueKind.String)
            lines.Add($"validated {at.GetString()} against the registered stations; details at /api/v1/datasets/{{slug}}/validation");
        return lines;

        static string Text(JsonElement e, string name) => e.TryGetProperty(name, out var v) && v.ValueKind == JsonValueKind.String ? v.GetString()! : "?";
    }

    /// <summary>
    /// The <c>validation</c> member of the dataset metadata: when and how the dataset was validated, and the overall skill
    /// of each variable at each covered station (per-season and per-class tables stay with the validation endpoint).
    /// </summary>
    public static string MetadataJson(IReadOnlyList<StationSkill> stations, IReadOnlyList<StationNotCovered> notCovered, DateTime computedAtUtc)
    {
        var list = new JsonArray();
        foreach (var s in stations)
        {
            var variables = new JsonObject();
            foreach (var v in s.Variables)
                variables[v.Variable] = v.Overall is { } o
                    ? new JsonObject
                    {
                        ["n"] = o.N, ["mean_observed"] = o.MeanObserved, ["bias"] = o.Bias, ["rmse"] = o.Rmse,
                        ["scatter_index"] = o.ScatterIndex, ["pearson_r"] = o.PearsonR, ["symmetric_slope"] = o.SymmetricSlope,
                    }
                    : new JsonObject { ["n"] = v.Directional!.N, ["circular_bias"] = v.Directional.CircularBias, ["circular_rmse"] = v.Directional.CircularRmse };
            list.Add(new JsonObject
            {
                ["station"] = s.Station.Name, ["slug"] = s.Station.Slug, ["role"] = s.Station.Role, ["independent"] = s.Station.Independent,
                ["lat"] = s.Station.Lat, ["lon"] = s.Station.Lon, ["cell_id"] = s.Cell.Id, ["distance_m"] = s.Cell.DistanceM,
                ["time_start"] = s.Station.TimeStartUtc, ["time_end"] = s.Station.TimeEndUtc, ["variables"] = variables,
            });
        }
        var validation = new JsonObject
        {
            ["computed_at"] = computedAtUtc,
            ["method"] = MatchingMethod,
            ["stations"] = list,
            ["not_covered"] = new JsonArray([.. notCovered.Select(n => (JsonNode)new JsonObject { ["station"] = n.Station, ["reason"] = n.Reason })]),
            ["details"] = "/api/v1/datasets/{slug}/validation",
        };
        return new JsonObject { ["validation"] = validation }.ToJsonString(new JsonSerializerOptions { WriteIndented = false });
    }
}
