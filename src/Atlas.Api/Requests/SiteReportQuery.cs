using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>The query of <c>GET /point/report.pdf</c> besides the position: months, the device and the access limits of the weather windows.</summary>
public sealed record SiteReportQuery(
    [property: FromQuery(Name = "months")] string? Months,
    [property: FromQuery(Name = "device")] string? Device,
    [property: FromQuery(Name = "hs_max")] string? HsMax,
    [property: FromQuery(Name = "hours")] string? Hours)
{
    /// <summary>The report's request, or null with the faults in <paramref name="errors"/>.</summary>
    public SiteReportRequest? Request(string slug, PointPosition at, QueryErrors errors)
    {
        var position = at.Position(errors);
        var window = at.Window(errors, Months);
        if (Device is { } d && string.IsNullOrWhiteSpace(d)) errors.Add("device", "device is empty: give a stored device's name or slug (GET /api/v1/devices), or leave it out.");
        var hs = AccessLimitsQuery.Positive("hs_max", HsMax, "the Hs limit of the weather windows in metres", errors, required: false);
        var hours = AccessLimitsQuery.Positive("hours", Hours, "the length of the weather windows in hours", errors, required: false);
        if (errors.Count > 0 || position is null || window is null) return null;
        return new SiteReportRequest(slug, position.Value.Latitude, position.Value.Longitude, window, Device,
            hs ?? SiteReportRequest.DefaultHsLimitMetres, hours ?? SiteReportRequest.DefaultWindowHours);
    }
}
