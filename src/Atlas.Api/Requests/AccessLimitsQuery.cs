using Atlas.Assessment.Access;

namespace Atlas.Api.Requests;

/// <summary>The access limits (hs_max required, tp_max optional) and the hours that weather-window requests name.</summary>
public interface IAccessLimitsQuery
{
    string? HsMax { get; }
    string? TpMax { get; }
    string? Hours { get; }
}

public static class AccessLimitsQueries
{
    /// <summary>Access limits from hs_max (required) and tp_max (optional), or null with the faults in <paramref name="errors"/>.</summary>
    public static AccessLimits? Limits(this IAccessLimitsQuery query, QueryErrors errors)
    {
        var hs = Positive("hs_max", query.HsMax, "the Hs limit in metres", errors, required: true);
        var tp = Positive("tp_max", query.TpMax, "the Tp limit in seconds", errors, required: false);
        return hs is { } h && !errors.ContainsKey("tp_max") ? new AccessLimits(h, tp) : null;
    }

    /// <summary>hours, above 0: the duration an operation needs (a window length).</summary>
    public static double? Duration(this IAccessLimitsQuery query, string meaning, QueryErrors errors, bool required) =>
        Positive("hours", query.Hours, meaning, errors, required);

    /// <summary>A number above 0, the one rule for limits, durations and thresholds.</summary>
    public static double? Positive(string name, string? text, string meaning, QueryErrors errors, bool required) =>
        QueryNumbers.Read(name, text, meaning, errors, required, min: 0, aboveMin: true);
}
