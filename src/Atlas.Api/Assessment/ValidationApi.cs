namespace Atlas.Api.Assessment;

/// <summary>
/// <c>/api/v1/datasets/{slug}/validation</c> and <c>/api/v1/validation/compare</c>: how well a hindcast matches the
/// registered measuring stations, computed from the stored records on each request.
/// </summary>
public static class ValidationApi
{
    public static IEndpointRouteBuilder MapValidationApi(this IEndpointRouteBuilder routes)
    {
        var dataset = routes.MapGroup("/api/v1/datasets/{slug}/validation").WithTags("Validation");
        dataset.MapGet("/", TableAsync)
            .Produces<ValidationTable>(StatusCodes.Status200OK, "application/json", "text/csv", CsvwMetadataWriter.MediaType)
            .ProducesProblems(StatusCodes.Status404NotFound)
            .RequireExpensiveLimit();
        dataset.MapGet("/{station}/pairs", PairsAsync)
            .Produces<ValidationPlotData>(StatusCodes.Status200OK, "application/json", "text/csv", CsvwMetadataWriter.MediaType)
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();
        routes.MapGet("/api/v1/validation/compare", CompareAsync).WithTags("Validation")
            .ProducesProblems(StatusCodes.Status404NotFound)
            .RequireExpensiveLimit();
        return routes;
    }

    [EndpointName("ValidationTable")]
    [EndpointSummary("Skill of the dataset at each registered station: overall, by season and by Hs class")]
    [EndpointDescription(
        "station: a station's name or slug (default: every station). format: json (default), csv (plain RFC 4180 CSV; its units, " +
        "provenance and the caution are in its W3C CSV on the Web metadata, format=csvw with the same query, application/csvm+json, " +
        "named by the CSV answer's Link header with rel=describedby) or csvw. For Hs, Tp, Te: N, mean observed " +
        "and modelled, bias = mean(model - observed), RMSE, scatter index = RMSE / mean observed, bias-corrected scatter index, Pearson r, " +
        "symmetric slope and the least-squares line; for direction the circular bias, circular RMSE and mean absolute difference. " +
        "Each observation is paired with the nearest wet cell, linearly interpolated in time between the bracketing model steps within " +
        "the tolerance (the larger of 1.5 h and the model step). role calibration/validation and independent say whether a station was " +
        "used to tune the hindcast or kept aside. Stations outside the dataset are listed under not_covered.")]
    public static async Task<Results<Ok<ValidationTable>, FileContentHttpResult, ProblemHttpResult, ValidationProblem>> TableAsync(
        string slug, [AsParameters] ValidationTableQuery query, DatasetCatalog catalog, ValidationService service,
        ProvenanceBuilder provenance, HttpContext http, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var form = query.Form(errors);
        if (errors.Count > 0) return TypedResults.ValidationProblem(errors);
        var station = query.Station;
        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);
        IReadOnlyList<StoredStation> stations;
        if (station is not null)
        {
            if (await service.Stations.FindAsync(station, cancel) is not { } found) return ApiProblems.UnknownStation(station);
            stations = [found];
        }
        else stations = await service.Stations.ListAsync(cancel);
        var (covered, notCovered) = await service.AtStationsAsync(dataset, stations, cancel);
        var table = new ValidationTable(slug, covered, notCovered, await provenance.ForAsync(dataset, cancel), AtlasCaution.Text);
        if (form == TableFormat.CsvMetadata)
            return TypedResults.File(CsvwMetadataWriter.Write(ValidationCsv.Table(table), CsvMetadataLinks.FormatForm(http.Request, "csv")),
                CsvwMetadataWriter.MediaType, $"{slug}_validation.csv-metadata.json");
        if (form == TableFormat.Csv)
        {
            CsvMetadataLinks.Describe(http.Response, CsvMetadataLinks.FormatForm(http.Request, CsvMetadataLinks.FormatValue));
            return TypedResults.File(ValidationCsv.Csv(table), CsvTable.ContentType, $"{slug}_validation.csv");
        }
        return TypedResults.Ok(table);
    }

    [EndpointName("ValidationPairs")]
    [EndpointSummary("Plot data at one station: matched pairs (scatter and time series), the 1:1 line, quantile pairs and the model series")]
    [EndpointDescription(
        "variable: hs (default), tp, te or dir. format: json (default), csv (the pairs only, plain RFC 4180 CSV; provenance, units " +
        "and the caution in its W3C CSV on the Web metadata, format=csvw with the same query, named by the Link header with rel=describedby) or csvw. " +
        "Quantiles are matched at probabilities 0.01..0.99 (Hyndman-Fan type 7, observed and modelled sorted separately).")]
    public static async Task<Results<Ok<ValidationPlotData>, FileContentHttpResult, ProblemHttpResult, ValidationProblem>> PairsAsync(
        string slug, string station, [AsParameters] ValidationPairsQuery query, DatasetCatalog catalog, ValidationService service,
        ProvenanceBuilder provenance, HttpContext http, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var wanted = query.Compared(errors);
        var form = query.Form(errors);
        if (errors.Count > 0) return TypedResults.ValidationProblem(errors, title: "The pairs request has invalid query values");

        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);
        if (await service.Stations.FindAsync(station, cancel) is not { } found) return ApiProblems.UnknownStation(station);
        var (validation, reason) = await service.AtStationAsync(dataset, found, cancel);
        if (validation is null) return ApiProblems.Unprocessable("The dataset does not cover this station", reason!);
        if (validation.Find(wanted) is not { } compared)
            return ApiProblems.Unprocessable("Variable not compared",
                $"{wanted.Symbol()} is not compared at '{found.Name}': {string.Join(" ", validation.Notes)}");

        var pairs = compared.Pairs;
        var list = new ValidationPair[pairs.Count];
        for (var i = 0; i < pairs.Count; i++) list[i] = new ValidationPair(DateTime.UnixEpoch.AddSeconds(pairs.TimesUnixSeconds[i]), pairs.Observed[i], pairs.Modelled[i]);
        var skill = ValidationReporting.Skill(validation);
        var source = await provenance.ForAsync(dataset, cancel);
        var symbol = wanted.Symbol();
        var fileName = $"{slug}_{found.Slug}_{symbol}_pairs.csv";
        if (form == TableFormat.CsvMetadata)
            return TypedResults.File(CsvwMetadataWriter.Write(ValidationCsv.PairsTable(slug, skill, wanted, source), CsvMetadataLinks.FormatForm(http.Request, "csv")),
                CsvwMetadataWriter.MediaType, fileName + CsvMetadataLinks.PathSuffix);
        if (form == TableFormat.Csv)
        {
            CsvMetadataLinks.Describe(http.Response, CsvMetadataLinks.FormatForm(http.Request, CsvMetadataLinks.FormatValue));
            return TypedResults.File(ValidationCsv.PairsCsv(ValidationCsv.PairsTable(slug, skill, wanted, source), list), CsvTable.ContentType, fileName);
        }

        var quantiles = compared.Scalar is { } scalar
            ? scalar.Quantiles.Select(q => new QuantileRow(q.Probability, SkillRow.Finite(q.ObservedQuantile), SkillRow.Finite(q.ModelledQuantile))).ToArray()
            : [];
        return TypedResults.Ok(new ValidationPlotData(slug, skill.Station, skill.Cell, symbol, wanted.Unit(), MatchCountsRow.From(compared.Counts),
            OneToOne(pairs, wanted), list, quantiles, ModelSeries(validation, wanted), source, AtlasCaution.Text));
    }

    [EndpointName("ValidationComparison")]
    [EndpointSummary("Several hindcast runs compared station by station, ranked by scatter index with bias shown")]
    [EndpointDescription(
        "datasets: two or more dataset slugs, comma separated. variable: hs (default), tp or te. Per station the runs are ranked " +
        "by scatter index (1 = smallest); the ranking over all stations uses the mean scatter index of the stations each run covers.")]
    public static async Task<Results<Ok<ValidationComparison>, ProblemHttpResult, ValidationProblem>> CompareAsync(
        [AsParameters] ValidationCompareQuery query, DatasetCatalog catalog, ValidationService service,
        ProvenanceBuilder provenance, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var slugs = query.Slugs(errors);
        var wanted = query.Ranked(errors);
        if (errors.Count > 0) return TypedResults.ValidationProblem(errors, title: "The comparison request has invalid query values");

        var records = new List<DatasetRecord>();
        foreach (var s in slugs)
        {
            if (await catalog.FindAsync(s, cancel) is not { } record) return ApiProblems.UnknownDataset(s);
            records.Add(record);
        }
        var stations = await service.Stations.ListAsync(cancel);
        var symbol = wanted.Symbol();
        var results = new Dictionary<(string Dataset, string Station), (SkillRow? Skill, string? Missing)>();
        foreach (var record in records)
        {
            var (covered, notCovered) = await service.AtStationsAsync(record, stations, cancel);
            foreach (var c in covered)
                results[(record.Slug, c.Station.Name)] = c.Find(symbol)?.Overall is { } o ? (o, null) : (null, $"{symbol} is not compared: {string.Join(" ", c.Notes)}");
            foreach (var n in notCovered) results[(record.Slug, n.Station)] = (null, n.Reason);
        }

        var byStation = stations.Select(st =>
        {
            var runs = records.Select(r => (Dataset: r.Slug, Result: results[(r.Slug, st.Name)])).ToArray();
            var ranked = runs.Where(r => r.Result.Skill?.ScatterIndex is not null).OrderBy(r => r.Result.Skill!.ScatterIndex).Select(r => r.Dataset).ToList();
            int? RankOf(string dataset) => ranked.IndexOf(dataset) is var k and >= 0 ? k + 1 : null;
            return new StationComparison(st.Name, StationStore.RoleName(st.Role), st.Role == StationRole.Validation,
                [.. runs.OrderBy(r => RankOf(r.Dataset) ?? int.MaxValue).Select(r => new RunSkill(r.Dataset, RankOf(r.Dataset), r.Result.Skill, r.Result.Missing))]);
        }).ToArray();

        static double? MeanOf(IEnumerable<double?> values)
        {
            var known = values.Where(v => v is not null).Select(v => v!.Value).ToArray();
            return known.Length == 0 ? null : known.Average();
        }
        var ranking = records
            .Select(r =>
            {
                var skills = stations.Select(st => (Station: st, results[(r.Slug, st.Name)].Skill)).Where(x => x.Skill?.ScatterIndex is not null).ToArray();
                return (Dataset: r.Slug, Covered: skills.Length, MeanSi: MeanOf(skills.Select(x => x.Skill!.ScatterIndex)), MeanBias: MeanOf(skills.Select(x => x.Skill!.Bias)),
                    IndependentSi: MeanOf(skills.Where(x => x.Station.Role == StationRole.Validation).Select(x => x.Skill!.ScatterIndex)));
            })
            .OrderBy(x => x.MeanSi ?? double.PositiveInfinity)
            .Select((x, i) => new RunSummary(x.Dataset, i + 1, x.Covered, x.MeanSi, x.MeanBias, x.IndependentSi))
            .ToArray();

        var sources = new List<Provenance>();
        foreach (var record in records) sources.Add(await provenance.ForAsync(record, cancel));
        return TypedResults.Ok(new ValidationComparison(symbol, ranking, byStation, sources, AtlasCaution.Text));
    }


    /// <summary>Ends of the 1:1 line spanning the pairs (0 to the largest value; 0 to 360 for directions).</summary>
    private static double[] OneToOne(MatchedSeries pairs, WaveParameter variable)
    {
        if (variable == WaveParameter.Dir) return [0, 360];
        double top = 0;
        for (var i = 0; i < pairs.Count; i++) top = Math.Max(top, Math.Max(pairs.Observed[i], pairs.Modelled[i]));
        return [0, top];
    }

    private static IReadOnlyList<ModelStep> ModelSeries(StationValidation validation, WaveParameter variable)
    {
        var model = validation.Model;
        var values = variable switch
        {
            WaveParameter.Hs => model.Hs,
            WaveParameter.Tp => model.Tp,
            WaveParameter.Te => model.Te,
            _ => model.Dir,
        };
        long start = ToUnix(validation.Station.TimeStartUtc), end = ToUnix(validation.Station.TimeEndUtc);
        var steps = new List<ModelStep>();
        for (var i = 0; i < model.Times.Length; i++)
            if (model.Times[i] >= start && model.Times[i] <= end)
                steps.Add(new ModelStep(DateTime.UnixEpoch.AddSeconds(model.Times[i]), float.IsNaN(values[i]) ? null : values[i]));
        return steps;
    }

    private static long ToUnix(DateTime utc) => (long)(utc - DateTime.UnixEpoch).TotalSeconds;
}
