namespace Atlas.Api.Reports;

/// <summary>What a site report is asked for: a position, a window, optionally a device, and the access limits of its weather windows.</summary>
public sealed record SiteReportRequest(string Slug, double Latitude, double Longitude, YearWindow Window, string? Device,
    double HsLimitMetres = SiteReportRequest.DefaultHsLimitMetres, double WindowHours = SiteReportRequest.DefaultWindowHours)
{
    /// <summary>The report's access limit when none is asked: Hs at or below 2 m (stated in the report).</summary>
    public const double DefaultHsLimitMetres = 2.0;

    /// <summary>The report's window length when none is asked: 12 hours (stated in the report).</summary>
    public const double DefaultWindowHours = 12;
}
