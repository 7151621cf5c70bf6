using SkiaSharp;

namespace Atlas.Api.Reports;

/// <summary>
/// The charts page of a site report: monthly means of J and Hs, exceedance of Hs and J, the inter-annual variation of
/// the annual mean power, and the power rose (share of energy from each direction sector).
/// </summary>
public sealed class SiteChartsSection(SiteReportContent content) : IReportSection
{
    public int Pages => 1;

    private static readonly string[] MonthLetters = ["J", "F", "M", "A", "M", "J", "J", "A", "S", "O", "N", "D"];

    public void Draw(ReportPage page, int index)
    {
        var s = content.Statistics;
        page.Heading("Charts");
        const float gap = 14;
        var w = (ReportPage.ContentWidth - gap) / 2;
        const float h = 215;
        var top = page.Y;
        SKRect Box(int column, int row) => SKRect.Create(ReportPage.Margin + column * (w + gap), top + row * (h + 40), w, h);

        ReportCharts.Draw(page, MonthlyMeans(page.Fonts, s), Box(0, 0));
        ReportCharts.Draw(page, Exceedance(page.Fonts, s), Box(1, 0));
        ReportCharts.Draw(page, InterAnnual(page.Fonts, s), Box(0, 1));
        PowerRoseChart.Draw(page, s.PowerRose, Box(1, 1));
        page.Y = top + 2 * h + 46;
        page.Paragraph("Monthly means are climatological (each calendar month over every year of the window). Exceedance is the share of time " +
            "above each value. The inter-annual chart shows the mean power of each calendar year; years below the coverage threshold are " +
            "drawn pale and left out of the coefficient of variation (CV). The rose shows the share of the energy arriving from each 22.5° sector " +
            "(direction waves come from, north at the top).", page.Fonts.Small, colour: ReportPage.Faint);
    }

    private static ScottPlot.Plot MonthlyMeans(ReportFonts fonts, PointStatistics s)
    {
        var plot = ReportCharts.New(fonts, "Monthly mean wave power and Hs", "month", "J (kW/m)");
        var months = Enumerable.Range(1, 12).Select(m => s.Periods.FirstOrDefault(p => p.Period == AtlasPeriod.Month(m))).ToArray();
        var power = months.Select(p => p?.J.Mean ?? double.NaN).ToArray();
        var hs = months.Select(p => p?.Hs.Mean ?? double.NaN).ToArray();
        var bars = plot.Add.Bars(Enumerable.Range(1, 12).Select(m => (double)m).ToArray(), power.Select(v => double.IsFinite(v) ? v : 0).ToArray());
        bars.Color = ReportCharts.Scale(0.35);
        bars.LegendText = "J mean";
        var line = plot.Add.Scatter(Enumerable.Range(1, 12).Select(m => (double)m).ToArray(), hs);
        line.Color = ReportCharts.Scale(0.85).Darken(0.35);
        line.LineWidth = 2;
        line.MarkerSize = 5;
        line.LegendText = "Hs mean (right axis, m)";
        line.Axes.YAxis = plot.Axes.Right;
        plot.Axes.Right.Label.Text = "Hs (m)";
        plot.Axes.Bottom.SetTicks(Enumerable.Range(1, 12).Select(m => (double)m).ToArray(), MonthLetters);
        plot.Axes.SetLimitsY(0, Math.Max(1e-6, power.Where(double.IsFinite).DefaultIfEmpty(1).Max() * 1.15));
        plot.Axes.SetLimitsY(0, Math.Max(1e-6, hs.Where(double.IsFinite).DefaultIfEmpty(1).Max() * 1.15), plot.Axes.Right);
        plot.ShowLegend(ScottPlot.Alignment.UpperCenter);
        return plot;
    }

    private static ScottPlot.Plot Exceedance(ReportFonts fonts, PointStatistics s)
    {
        var plot = ReportCharts.New(fonts, "Exceedance over the window", "Hs (m), bottom axis; J (kW/m), top axis", "share of time above (%)");
        if (s.Exceedance is { } e)
        {
            var hs = plot.Add.Scatter(e.Hs.Thresholds.ToArray(), e.Hs.Fractions.Select(f => 100 * f).ToArray());
            hs.Color = ReportCharts.Scale(0.15);
            hs.MarkerSize = 0;
            hs.LineWidth = 2;
            hs.LegendText = "Hs";
            var j = plot.Add.Scatter(e.J.Thresholds.ToArray(), e.J.Fractions.Select(f => 100 * f).ToArray());
            j.Color = ReportCharts.Scale(0.7).Darken(0.25);
            j.MarkerSize = 0;
            j.LineWidth = 2;
            j.LinePattern = ScottPlot.LinePattern.Dashed;
            j.LegendText = "J (top axis)";
            j.Axes.XAxis = plot.Axes.Top;
            plot.ShowLegend(ScottPlot.Alignment.UpperRight);
        }
        plot.Axes.SetLimitsY(0, 100);
        return plot;
    }

    private static ScottPlot.Plot InterAnnual(ReportFonts fonts, PointStatistics s)
    {
        var annual = s.InterAnnual?.FirstOrDefault(x => x.Period == AtlasPeriod.Annual);
        var title = annual is null ? "Annual mean wave power by year" :
            $"Annual mean wave power by year (CV {ReportNumbers.Fixed(annual.JCoefficientOfVariation, 2)})";
        var plot = ReportCharts.New(fonts, title, "year", "J (kW/m)");
        if (annual is not null && annual.Years.Count > 0)
        {
            foreach (var year in annual.Years)
            {
                var bar = plot.Add.Bar(year.Year, double.IsFinite(year.J) ? year.J : 0);
                bar.Color = year.LowCoverage ? ReportCharts.Scale(0.9) : ReportCharts.Scale(0.35);
            }
            var used = annual.Years.Where(y => !y.LowCoverage && double.IsFinite(y.J)).Select(y => y.J).ToArray();
            if (used.Length > 0)
            {
                var mean = plot.Add.HorizontalLine(used.Average());
                mean.Color = ReportPage.Ink.ToScottPlot();
                mean.LinePattern = ScottPlot.LinePattern.Dotted;
                mean.LegendText = "mean of the years used";
                plot.ShowLegend(ScottPlot.Alignment.LowerRight);
            }
            plot.Axes.Bottom.SetTicks([.. annual.Years.Select(y => (double)y.Year)], [.. annual.Years.Select(y => y.Year.ToString(CultureInfo.InvariantCulture))]);
        }
        plot.Axes.Margins(bottom: 0);
        return plot;
    }
}
