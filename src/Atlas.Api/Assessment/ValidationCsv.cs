namespace Atlas.Api.Assessment;

/// <summary>The validation skill table and a station's matched pairs as CSV downloads, with their CSVW descriptions.</summary>
public static class ValidationCsv
{
    /// <summary>
    /// The skill table as CSV: one row per station, variable and group (overall, each season, each Hs class).
    /// Directions fill bias and rmse with the circular bias and circular RMSE and leave the scalar-only columns empty.
    /// </summary>
    public static byte[] Csv(ValidationTable table) => Table(table).ToBytes(rows =>
    {
        foreach (var station in table.Stations)
            foreach (var v in station.Variables)
            {
                Row(rows, station, v, "overall", v.Overall, v.Directional);
                foreach (var g in v.BySeason) Row(rows, station, v, g.Season!, g.Skill, g.DirectionalSkill);
                foreach (var g in v.ByHsClass) Row(rows, station, v, ClassName(g), g.Skill, g.DirectionalSkill);
            }
    });

    /// <summary>The description of the skill table's CSV: its columns, what they mean, the matching and the stations not covered.</summary>
    public static CsvTable Table(ValidationTable table)
    {
        List<string> notes =
        [
            "Matching: " + ValidationReporting.MatchingMethod,
            "Units: hs m; tp and te s; dir degree. bias = mean(model - observed); rmse; scatter_index = rmse / mean observed; pearson_r; " +
            "symmetric_slope = sqrt(sum model^2 / sum observed^2). dir: bias and rmse are the circular bias and RMSE.",
            "Role: calibration stations were used to tune the hindcast; validation stations were kept aside (independent).",
        ];
        notes.AddRange(table.NotCovered.Select(m => $"Not covered: {m.Station}: {m.Reason}"));
        const string unit = "unit of the row's variable";
        return new CsvTable(
            $"Validation of dataset {table.Dataset} against measuring stations",
            "One row per station, variable and group (overall, each season, each Hs class) with the skill of the hindcast against the station's record.",
            [
                CsvColumn.Text("station", "station name"),
                CsvColumn.Text("role", "calibration or validation"),
                CsvColumn.Boolean("independent", "kept aside from calibration"),
                CsvColumn.Integer("cell_id", "cell paired with the station"),
                CsvColumn.Double("distance_m", "distance from the station to the cell centre", "m"),
                CsvColumn.Text("variable", "variable compared", "hs, tp, te or dir"),
                CsvColumn.Text("group", "group of pairs", "overall, a season (djf, mam, jja, son) or an Hs class hs_LOWER-UPPER in metres"),
                CsvColumn.Integer("n", "matched pairs", "1"),
                CsvColumn.Double("mean_observed", "mean observed", unit, "circular mean for dir"),
                CsvColumn.Double("mean_modelled", "mean modelled", unit, "circular mean for dir"),
                CsvColumn.Double("bias", "bias, mean(model - observed)", unit, "circular bias for dir"),
                CsvColumn.Double("rmse", "root-mean-square error", unit, "circular RMSE for dir"),
                CsvColumn.Double("scatter_index", "scatter index, rmse / mean observed", "1"),
                CsvColumn.Double("pearson_r", "Pearson correlation coefficient", "1"),
                CsvColumn.Double("symmetric_slope", "symmetric slope, sqrt(sum model^2 / sum observed^2)", "1"),
            ],
            table.Provenance, notes);
    }

    /// <summary>The description of a station's matched pairs of one variable.</summary>
    public static CsvTable PairsTable(string slug, StationSkill skill, WaveParameter variable, Provenance source) => new(
        $"Matched {variable.Symbol()} pairs of dataset {slug} at station {skill.Station.Name}",
        string.Create(CultureInfo.InvariantCulture,
            $"One row per observation of station {skill.Station.Name} ({skill.Station.Role}) matched with cell {skill.Cell.Id}, {skill.Cell.DistanceM:0.#} m away."),
        [
            CsvColumn.Time("time", "time of the observation"),
            CsvColumn.Double("observed", $"observed {variable.Symbol()}", variable.Unit()),
            CsvColumn.Double("modelled", $"modelled {variable.Symbol()}", variable.Unit(), "interpolated in time between the bracketing model steps"),
        ],
        source,
        ["Matching: " + ValidationReporting.MatchingMethod]);

    /// <summary>The matched pairs as CSV.</summary>
    public static byte[] PairsCsv(CsvTable table, IReadOnlyList<ValidationPair> pairs) => table.ToBytes(rows =>
    {
        foreach (var p in pairs)
        {
            rows.Time(p.Time).Number(p.Observed).Number(p.Modelled);
            rows.EndRow();
        }
    });

    public static string ClassName(SkillGroup g) =>
        string.Create(CultureInfo.InvariantCulture, $"hs_{g.HsLowerM:0.##}-{(g.HsUpperM is { } u ? u.ToString("0.##", CultureInfo.InvariantCulture) : "")}");

    private static void Row(CsvTableWriter rows, StationSkill station, VariableSkill v, string group, SkillRow? skill, DirectionalSkillRow? directional)
    {
        rows.Text(station.Station.Name).Text(station.Station.Role).Boolean(station.Station.Independent)
            .Integer(station.Cell.Id).Number(station.Cell.DistanceM, "0.#").Text(v.Variable).Text(group);
        if (skill is not null)
        {
            rows.Integer(skill.N);
            foreach (var value in new[] { skill.MeanObserved, skill.MeanModelled, skill.Bias, skill.Rmse, skill.ScatterIndex, skill.PearsonR, skill.SymmetricSlope })
                rows.Number(value);
        }
        else if (directional is not null)
        {
            rows.Integer(directional.N);
            foreach (var value in new[] { directional.CircularMeanObserved, directional.CircularMeanModelled, directional.CircularBias, directional.CircularRmse, null, null, null })
                rows.Number(value);
        }
        else
            for (var k = 0; k < 8; k++) rows.Text(null);
        rows.EndRow();
    }
}
