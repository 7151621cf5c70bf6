using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>The query of <c>GET /point</c> besides the position: the months, one period or all, the parts and the format.</summary>
public sealed record PointStatisticsQuery(
    [property: FromQuery(Name = "period")] string? Period,
    [property: FromQuery(Name = "months")] string? Months,
    [property: FromQuery(Name = "include")] string? Include,
    [property: FromQuery(Name = "format")] string? Format)
{
    public static readonly string[] Parts = ["exceedance", "joint", "rose", "interannual"];

    /// <summary>The one period asked for, or null for all (the default).</summary>
    public AtlasPeriod? OnePeriod(QueryErrors errors)
    {
        if (Period is null || Period == "all") return null;
        if (AtlasPeriod.TryParse(Period, out var p)) return p;
        errors.Add("period", VocabularyMessages.UnknownPeriod(Period) + " all gives every period.");
        return null;
    }

    /// <summary>The parts asked for (all by default, none for summaries only), or null with the fault.</summary>
    public HashSet<string>? IncludedParts(QueryErrors errors)
    {
        if (Include is null || Include == "all") return [.. Parts];
        if (Include == "none") return [];
        var parts = new HashSet<string>();
        foreach (var part in Include.Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries))
        {
            if (!Parts.Contains(part))
            {
                errors.Add("include", $"'{part}' is not a part: include takes {string.Join(", ", Parts)} (comma separated), all, or none.");
                return null;
            }
            parts.Add(part);
        }
        return parts;
    }

    /// <summary>JSON (the default), CSV, or the CSV's CSVW metadata.</summary>
    public TableFormat Form(QueryErrors errors) => TableFormats.Read(errors, Format, "point format", TableFormat.Json);
}
