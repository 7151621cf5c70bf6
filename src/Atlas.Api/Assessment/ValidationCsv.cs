namespace Atlas.Api.Assessment;

/// <summary>The validation skill table as a CSV download.</summary>
public static class ValidationCsv
{
    /// <summary>
    /// The skill table as CSV: '#' lines (what the columns mean, the provenance, the caution), then one row per station,
    /// variable and group (overall, each season, each Hs class). Directions fill bias and rmse with the circular bias
    /// and circular RMSE and leave the scalar-only columns empty.
    /// </summary>
    public static byte[] Csv(ValidationTable table)
    {
        var text = new StringBuilder();
        text.Append("# validation of dataset ").Append(table.Dataset).Append(" against measuring stations\n");
        text.Append("# matching: ").Append(ValidationReporting.MatchingMethod).Append('\n');
        text.Append("# units: hs m; tp and te s; dir degree. bias = mean(model - observed); rmse; scatter_index = rmse / mean observed; ")
            .Append("pearson_r; symmetric_slope = sqrt(sum model^2 / sum observed^2). dir: bias and rmse are the circular bias and RMSE.\n");
        text.Append("# role: calibration stations were used to tune the hindcast; validation stations were kept aside (independent).\n");
        foreach (var line in table.Provenance.HeaderLines()) text.Append(line).Append('\n');
        foreach (var missing in table.NotCovered) text.Append("# not covered: ").Append(missing.Station).Append(": ").Append(missing.Reason).Append('\n');
        text.Append("station,role,independent,cell_id,distance_m,variable,group,n,mean_observed,mean_modelled,bias,rmse,scatter_index,pearson_r,symmetric_slope\n");
        foreach (var station in table.Stations)
            foreach (var v in station.Variables)
            {
                Row(text, station, v, "overall", v.Overall, v.Directional);
                foreach (var g in v.BySeason) Row(text, station, v, g.Season!, g.Skill, g.DirectionalSkill);
                foreach (var g in v.ByHsClass) Row(text, station, v, ClassName(g), g.Skill, g.DirectionalSkill);
            }
        return new UTF8Encoding(false).GetBytes(text.ToString());
    }

    public static string ClassName(SkillGroup g) =>
        string.Create(CultureInfo.InvariantCulture, $"hs_{g.HsLowerM:0.##}-{(g.HsUpperM is { } u ? u.ToString("0.##", CultureInfo.InvariantCulture) : "")}");

    private static void Row(StringBuilder text, StationSkill station, VariableSkill v, string group, SkillRow? skill, DirectionalSkillRow? directional)
    {
        var c = CultureInfo.InvariantCulture;
        text.Append(Field(station.Station.Name)).Append(',').Append(station.Station.Role).Append(',').Append(station.Station.Independent ? "true" : "false")
            .Append(',').Append(station.Cell.Id.ToString(c)).Append(',').Append(station.Cell.DistanceM.ToString("0.#", c))
            .Append(',').Append(v.Variable).Append(',').Append(group).Append(',');
        if (skill is not null)
        {
            text.Append(skill.N.ToString(c));
            foreach (var value in new[] { skill.MeanObserved, skill.MeanModelled, skill.Bias, skill.Rmse, skill.ScatterIndex, skill.PearsonR, skill.SymmetricSlope })
                text.Append(',').Append(value?.ToString("R", c));
        }
        else if (directional is not null)
        {
            text.Append(directional.N.ToString(c));
            foreach (var value in new[] { directional.CircularMeanObserved, directional.CircularMeanModelled, directional.CircularBias, directional.CircularRmse, null, null, null })
                text.Append(',').Append(value?.ToString("R", c));
        }
        text.Append('\n');
    }

    private static string Field(string value) => value.Contains(',') || value.Contains('"') ? "\"" + value.Replace("\"", "\"\"") + "\"" : value;
}
