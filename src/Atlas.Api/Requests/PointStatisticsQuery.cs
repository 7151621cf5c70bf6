using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>
/// The query of <c>GET /point</c> besides the position: the months, one period or all, the parts, the step of the J
/// exceedance curve and the format.
/// </summary>
public sealed record PointStatisticsQuery(
    [property: FromQuery(Name = "period")] string? Period,
    [property: FromQuery(Name = "months")] string? Months,
    [property: FromQuery(Name = "include")] string? Include,
    [property: FromQuery(Name = "format")] string? Format,
    [property: FromQuery(Name = "j_step")] string? JStep = null)
{
    public static readonly string[] Parts = ["exceedance", "joint", "rose", "interannual", "spectra"];

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

    /// <summary>
    /// The step of the J exceedance curve in kW/m (at least 0.1, so that a curve stays a few thousand thresholds at most),
    /// or null for the default: 1 kW/m, coarsened to keep the curve to
    /// <see cref="PointStatisticsService.DefaultPowerCurveThresholds"/> thresholds.
    /// </summary>
    public double? PowerCurveStep(QueryErrors errors) =>
        QueryNumbers.Read("j_step", JStep, "the threshold step of the J exceedance curve in kW/m, 0.1 or more (1 for the fine curve)",
            errors, required: false, min: 0.1, max: 1000);

    /// <summary>The parts of the exact analysis that the asked parts read (the period summaries are always made).</summary>
    public static ExactParts AnalysisParts(IReadOnlySet<string> parts) =>
        (parts.Contains("exceedance") ? ExactParts.ExceedanceCurves : ExactParts.None)
        | (parts.Contains("joint") ? ExactParts.JointOccurrence : ExactParts.None)
        | (parts.Contains("interannual") ? ExactParts.InterAnnual : ExactParts.None);

    /// <summary>JSON (the default), CSV, or the CSV's CSVW metadata.</summary>
    public TableFormat Form(QueryErrors errors) => TableFormats.Read(errors, Format, "point format", TableFormat.Json);
}
