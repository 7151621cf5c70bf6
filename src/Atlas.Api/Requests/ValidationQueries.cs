using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>The query of <c>GET /validation</c>: one station (default every one) and the format.</summary>
public sealed record ValidationTableQuery(
    [property: FromQuery(Name = "station")] string? Station,
    [property: FromQuery(Name = "format")] string? Format)
{
    public TableFormat Form(QueryErrors errors) => TableFormats.Read(errors, Format, "validation format", TableFormat.Json);
}

/// <summary>The query of <c>GET /validation/{station}/pairs</c>: the variable (hs by default) and the format.</summary>
public sealed record ValidationPairsQuery(
    [property: FromQuery(Name = "variable")] string? Variable,
    [property: FromQuery(Name = "format")] string? Format)
{
    public WaveParameter Compared(QueryErrors errors)
    {
        var wanted = WaveParameter.Hs;
        if (Variable is not null && !StationValidator.TryParse(Variable, out wanted))
            errors.Add("variable", $"'{Variable}' is not a station variable: use hs, tp, te or dir.");
        return wanted;
    }

    public TableFormat Form(QueryErrors errors) => TableFormats.Read(errors, Format, "pairs format", TableFormat.Json);
}

/// <summary>The query of <c>GET /validation/compare</c>: two or more dataset slugs and the variable ranked.</summary>
public sealed record ValidationCompareQuery(
    [property: FromQuery(Name = "datasets")] string? Datasets,
    [property: FromQuery(Name = "variable")] string? Variable)
{
    public string[] Slugs(QueryErrors errors)
    {
        var slugs = (Datasets ?? "").Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries).Distinct().ToArray();
        if (slugs.Length < 2) errors.Add("datasets", "datasets needs two or more dataset slugs, comma separated (datasets=run-a,run-b).");
        return slugs;
    }

    public WaveParameter Ranked(QueryErrors errors)
    {
        var wanted = WaveParameter.Hs;
        if (Variable is not null && (!StationValidator.TryParse(Variable, out wanted) || wanted == WaveParameter.Dir))
            errors.Add("variable", $"'{Variable}' cannot be ranked by scatter index: use hs, tp or te.");
        return wanted;
    }
}
