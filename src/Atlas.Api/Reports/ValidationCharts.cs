namespace Atlas.Api.Reports;

/// <summary>The validation charts of the trade: model against measurement (scatter or 2-D histogram) and quantile against quantile.</summary>
public static class ValidationCharts
{
    /// <summary>Modelled against measured Hs with the 1:1 line and the fitted line; a 2-D histogram above <paramref name="densityAbove"/> pairs.</summary>
    public static ScottPlot.Plot Scatter(ReportFonts fonts, ValidationPlotSeries pairs, SkillRow skill, int densityAbove)
    {
        var plot = ReportCharts.New(fonts, $"Hs pairs (N = {pairs.Observed.Count.ToString("N0", CultureInfo.InvariantCulture)})", "measured Hs (m)", "modelled Hs (m)");
        var top = Math.Max(pairs.Observed.Max(), pairs.Modelled.Max()) * 1.05;
        if (pairs.Observed.Count > densityAbove)
        {
            const int bins = 40;
            var counts = new double[bins, bins];
            for (var i = 0; i < pairs.Observed.Count; i++)
            {
                var column = Math.Min(bins - 1, (int)(pairs.Observed[i] / top * bins));
                var row = Math.Min(bins - 1, (int)(pairs.Modelled[i] / top * bins));
                counts[bins - 1 - row, column]++;
            }
            // Coloured by the logarithm of the count: pairs crowd the calm end, and a linear scale would show only it.
            for (var r = 0; r < bins; r++)
                for (var c = 0; c < bins; c++)
                    counts[r, c] = counts[r, c] == 0 ? double.NaN : Math.Log10(counts[r, c]);
            var heat = plot.Add.Heatmap(counts);
            heat.Colormap = new ReportCharts.HouseColormap();
            heat.Extent = new ScottPlot.CoordinateRect(0, top, 0, top);
            heat.NaNCellColor = ScottPlot.Colors.Transparent;
            var bar = plot.Add.ColorBar(heat);
            bar.Label = "log10 of pairs per cell";
        }
        else
        {
            var points = plot.Add.ScatterPoints(pairs.Observed.ToArray(), pairs.Modelled.ToArray());
            points.Color = ReportCharts.Scale(0.3).WithAlpha(0.5);
            points.MarkerSize = 2.5f;
        }
        var one = plot.Add.Line(0, 0, top, top);
        one.Color = ReportPage.Ink.ToScottPlot();
        one.LinePattern = ScottPlot.LinePattern.Dashed;
        one.LegendText = "1:1";
        if (skill.RegressionSlope is { } slope && skill.RegressionIntercept is { } intercept)
        {
            var fitted = plot.Add.Line(0, intercept, top, intercept + slope * top);
            fitted.Color = ReportCharts.Scale(0.75).Darken(0.3);
            fitted.LineWidth = 2;
            fitted.LegendText = $"fitted: {ReportNumbers.Fixed(slope, 3)} x + {ReportNumbers.Fixed(intercept, 3)}";
        }
        plot.ShowLegend(ScottPlot.Alignment.UpperLeft);
        plot.Axes.SetLimits(0, top, 0, top);
        return plot;
    }

    /// <summary>Quantiles of the model against those of the measurement (probabilities 0.01..0.99, Hyndman-Fan type 7), with the 1:1 line.</summary>
    public static ScottPlot.Plot QuantileQuantile(ReportFonts fonts, ValidationPlotSeries pairs)
    {
        var plot = ReportCharts.New(fonts, "Hs: quantile against quantile", "measured quantile (m)", "modelled quantile (m)");
        var observed = pairs.ObservedQuantiles.Where(double.IsFinite).ToArray();
        var modelled = pairs.ModelledQuantiles.Where(double.IsFinite).ToArray();
        var top = Math.Max(observed.DefaultIfEmpty(1).Max(), modelled.DefaultIfEmpty(1).Max()) * 1.05;
        var qq = plot.Add.ScatterPoints(pairs.ObservedQuantiles.ToArray(), pairs.ModelledQuantiles.ToArray());
        qq.Color = ReportCharts.Scale(0.25);
        qq.MarkerSize = 4;
        var one = plot.Add.Line(0, 0, top, top);
        one.Color = ReportPage.Ink.ToScottPlot();
        one.LinePattern = ScottPlot.LinePattern.Dashed;
        plot.Axes.SetLimits(0, top, 0, top);
        return plot;
    }
}
