using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>
/// The access limits (hs_max required, tp_max optional) and hours of <c>GET /point/windows</c> (the duration an
/// operation needs) and <c>GET /layers/accessibility.{format}</c> (an optional window length).
/// </summary>
public sealed record AccessLimitsQuery(
    [property: FromQuery(Name = "hs_max")] string? HsMax,
    [property: FromQuery(Name = "tp_max")] string? TpMax,
    [property: FromQuery(Name = "hours")] string? Hours)
{
    /// <summary>Access limits from hs_max (required) and tp_max (optional), or null with the faults in <paramref name="errors"/>.</summary>
    public AccessLimits? Limits(QueryErrors errors)
    {
        var hs = Positive("hs_max", HsMax, "the Hs limit in metres", errors, required: true);
        var tp = Positive("tp_max", TpMax, "the Tp limit in seconds", errors, required: false);
        return hs is { } h && !errors.ContainsKey("tp_max") ? new AccessLimits(h, tp) : null;
    }

    /// <summary>hours, above 0, described to the caller as <paramref name="meaning"/>.</summary>
    public double? Duration(string meaning, QueryErrors errors, bool required) => Positive("hours", Hours, meaning, errors, required);

    /// <summary>A number above 0, the one rule for limits, durations and thresholds.</summary>
    public static double? Positive(string name, string? text, string meaning, QueryErrors errors, bool required) =>
        QueryNumbers.Read(name, text, meaning, errors, required, min: 0, aboveMin: true);
}
