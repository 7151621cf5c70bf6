using SkiaSharp;

namespace Atlas.Api.Reports;

/// <summary>
/// The time series page of a site report: Hs through the record with the nearest measuring station's matched Hs over
/// it, and wave power J below, on one time axis (ScottPlot thins each line to what a printed width can show).
/// </summary>
public sealed class TimeSeriesSection(SiteReportContent content) : IReportSection
{
    public int Pages => content.Series.Times.Count > 1 ? 1 : 0;

    public void Draw(ReportPage page, int index)
    {
        var series = content.Series;
        page.Heading("Time series at the cell");
        var xs = series.Times.Select(t => DateTime.UnixEpoch.AddSeconds(t).ToOADate()).ToArray();
        var buoy = content.Station?.HsPairs;

        var hs = ReportCharts.New(page.Fonts, "Hs", "", "Hs (m)");
        var (hsTimes, hsValues) = Valid(xs, series.Hs);
        var modelled = hs.Add.SignalXY(hsTimes, hsValues);
        modelled.Color = ReportCharts.Scale(0.3);
        modelled.LegendText = "hindcast";
        if (buoy is { Times.Count: > 0 })
        {
            // A thin line like the hindcast's, thinned the same way: thousands of markers would make the page megabytes.
            var measured = hs.Add.SignalXY(buoy.Times.Select(t => DateTime.UnixEpoch.AddSeconds(t).ToOADate()).ToArray(), buoy.Observed.ToArray());
            measured.Color = ReportPage.Ink.ToScottPlot().WithAlpha(0.45);
            measured.LineWidth = 0.8f;
            measured.LegendText = $"measured at {content.Station!.Skill.Station.Name}, {ReportNumbers.Distance(content.Station.DistanceFromCellMetres)} away";
            hs.ShowLegend(ScottPlot.Alignment.UpperRight);
        }
        DateAxis(hs);
        hs.Axes.SetLimitsX(xs[0], xs[^1]);
        hs.Axes.Margins(bottom: 0);

        var j = ReportCharts.New(page.Fonts, "Wave power J", "", "J (kW/m)");
        var (jTimes, jValues) = Valid(xs, series.PowerKilowattsPerMetre);
        var power = j.Add.SignalXY(jTimes, jValues);
        power.Color = ReportCharts.Scale(0.55).Darken(0.3);
        DateAxis(j);
        j.Axes.SetLimitsX(xs[0], xs[^1]);
        j.Axes.Margins(bottom: 0);

        var top = page.Y;
        ReportCharts.Draw(page, hs, SKRect.Create(ReportPage.Margin, top, ReportPage.ContentWidth, 290));
        ReportCharts.Draw(page, j, SKRect.Create(ReportPage.Margin, top + 300, ReportPage.ContentWidth, 250));
        page.Y = top + 560;
        page.Paragraph($"{series.Times.Count.ToString("N0", CultureInfo.InvariantCulture)} time steps of the cell's stored series (whole years of the window); " +
            (content.Statistics.PowerFrom == "spectra" ? "J integrated from the output point's spectrum at every step. " : "J computed at every step at the cell depth. ") +
            "The measured values are those matched to the hindcast at the station's own nearest wet cell. " +
            "Missing steps are left out (the line joins their neighbours). GET /point/series gives the same series as CSV or JSON.",
            page.Fonts.Small, colour: ReportPage.Faint);
    }

    /// <summary>Dates on the bottom axis written as ISO 8601 (2021-07), never in one country's order.</summary>
    private static void DateAxis(ScottPlot.Plot plot)
    {
        var axis = plot.Axes.DateTimeTicksBottom();
        if (axis.TickGenerator is ScottPlot.TickGenerators.DateTimeAutomatic automatic)
            automatic.LabelFormatter = date => date.ToString(date.Month == 1 && date.Day == 1 ? "yyyy" : "yyyy-MM", CultureInfo.InvariantCulture);
    }

    /// <summary>The steps with a value: the line plot takes finite values on ascending times only.</summary>
    private static (double[] Times, double[] Values) Valid(double[] times, IReadOnlyList<double> values)
    {
        var keep = Enumerable.Range(0, times.Length).Where(i => double.IsFinite(values[i])).ToArray();
        return ([.. keep.Select(i => times[i])], [.. keep.Select(i => values[i])]);
    }
}
