using SkiaSharp;
using static Atlas.Api.Reports.ReportNumbers;

namespace Atlas.Api.Reports;

/// <summary>
/// The first page of a site report: title, the asked position and its cell (depth, distances, window), the location
/// map and the summary table of the annual and seasonal statistics.
/// </summary>
public sealed class SiteOverviewSection(SiteReportContent content) : IReportSection
{
    public int Pages => 1;

    private static readonly AtlasPeriod[] Periods = [AtlasPeriod.Annual, AtlasPeriod.Djf, AtlasPeriod.Mam, AtlasPeriod.Jja, AtlasPeriod.Son];

    public void Draw(ReportPage page, int index)
    {
        var s = content.Statistics;
        var request = content.Request;
        var cell = s.Cell;
        page.Text("Site report", ReportPage.Margin, page.Y + 16, page.Fonts.Title, ReportPage.Ink);
        page.Y += 24;
        page.Paragraph($"{s.Provenance.Title} (dataset {s.Dataset}), generated {content.GeneratedAtUtc:yyyy-MM-dd HH:mm} UTC", page.Fonts.Body, colour: ReportPage.Faint);

        var mapTop = page.Y + 4;
        var frame = new SKRect(ReportPage.Margin + 26, mapTop, ReportPage.Margin + 290, mapTop + 250);
        LocationMap.Draw(page, frame, content.Land, content.Extent, [],
            [(request.Latitude, request.Longitude, "asked point", true), (cell.Lat, cell.Lon, $"cell {cell.Id}", false)]);

        var factsLeft = ReportPage.Margin + 310;
        page.Y = mapTop;
        Fact(page, factsLeft, "Asked position", Position(request.Latitude, request.Longitude, 5));
        Fact(page, factsLeft, "Nearest wet cell", $"cell {cell.Id} at {Position(cell.Lat, cell.Lon, 5)}");
        Fact(page, factsLeft, "Distance to the cell", Distance(cell.DistanceM));
        Fact(page, factsLeft, "Depth", cell.DepthM is { } d ? Fixed(d, 1) + " m" : "unknown: deep water assumed");
        Fact(page, factsLeft, "Distance to the coast", cell.CoastDistanceM is { } c ? Distance(c) : "not recorded");
        Fact(page, factsLeft, "Window", WindowText(s.Window, s.InterAnnual));
        Fact(page, factsLeft, "Time steps in the window", s.StepsInWindow.ToString("N0", CultureInfo.InvariantCulture));
        Fact(page, factsLeft, "Energy period", s.EnergyPeriodSource == EnergyPeriodSource.Provided ? "as stored" : "derived from the peak period (see method notes)");
        page.Paragraph("Map: the dataset's land mask (its dry cells, hatched), the extent of its grid (dashed), the nearest wet cell (dot) and the asked point (cross).",
            page.Fonts.Tiny, factsLeft, ReportPage.Width - ReportPage.Margin - factsLeft, ReportPage.Faint);

        page.Y = Math.Max(page.Y, mapTop + 272);
        page.Heading("Summary: annual and seasonal statistics");
        var rows = Periods.Select(p => s.Periods.FirstOrDefault(x => x.Period == p)).Where(p => p is not null).Select(p => (IReadOnlyList<string>)
        [
            PeriodName(p!.Period) + (p.LowCoverage ? " *" : ""),
            Metric(p.Hs.Mean), Metric(p.Hs.P90), Metric(p.Te.Mean), Metric(p.Tp.Mean), Power(p.J.Mean), Power(p.J.P90),
            Fixed(p.Direction.DirectionalityCoefficient, 2), Degrees(p.Direction.Mean), Degrees(p.Direction.MaxPowerFromDeg), Percent(p.J.Coverage, 0),
        ]).ToArray();
        page.Table(["period", "Hs mean\nm", "Hs p90\nm", "Te mean\ns", "Tp mean\ns", "J mean\nkW/m", "J p90\nkW/m", "d\n", "dir\n°", "max J\nfrom °", "coverage\n"],
            rows, [72, 44, 42, 44, 44, 50, 48, 30, 34, 52, 51]);
        page.Paragraph("Hs: significant wave height (Hm0); Te: energy period; Tp: peak period; J: wave power per metre of crest, computed at every " +
            "time step and then averaged; p90: 90th percentile; d: directionality coefficient (the largest directionally resolved power over the " +
            "mean power); dir: power-weighted mean direction waves come from, degrees true; max J from: the direction of the largest directionally " +
            "resolved power. Seasons: December-February, March-May, June-August, September-November. * marks a period below the coverage threshold.",
            page.Fonts.Small, colour: ReportPage.Faint);
    }

    private static void Fact(ReportPage page, float left, string name, string value)
    {
        page.Text(name, left, page.Y + 8, page.Fonts.Small, ReportPage.Faint);
        page.Text(value, left, page.Y + 19, page.Fonts.Bold, ReportPage.Ink);
        page.Y += 27;
    }

    public static string PeriodName(AtlasPeriod period) => period.Name switch
    {
        "annual" => "annual",
        "djf" => "winter (DJF)",
        "mam" => "spring (MAM)",
        "jja" => "summer (JJA)",
        "son" => "autumn (SON)",
        var other => other,
    };

    /// <summary>The window in words, its open ends filled with the first and last year the statistics hold.</summary>
    public static string WindowText(PointWindow w, IReadOnlyList<InterAnnualSeries>? interAnnual)
    {
        var years = interAnnual?.FirstOrDefault(x => x.Period == AtlasPeriod.Annual)?.Years;
        var first = w.FromYear ?? years?.FirstOrDefault()?.Year;
        var last = w.ToYear ?? years?.LastOrDefault()?.Year;
        return $"{first?.ToString(CultureInfo.InvariantCulture) ?? "first year"} to {last?.ToString(CultureInfo.InvariantCulture) ?? "last year"}" +
            (w.Months is { } m ? ", months " + string.Join(", ", m) : ", all months");
    }
}
