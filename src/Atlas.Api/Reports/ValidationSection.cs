using SkiaSharp;
using static Atlas.Api.Reports.ReportNumbers;

namespace Atlas.Api.Reports;

/// <summary>
/// How well the hindcast matched the measuring station nearest the report's cell: the skill table (overall, by season
/// and by Hs class) and, for Hs, the scatter of model against measurement (a 2-D histogram where pairs are many) with
/// the 1:1 and fitted lines, and the quantile-quantile plot. Says so plainly when no station is covered.
/// </summary>
public sealed class ValidationSection(SiteReportContent content) : IReportSection
{
    /// <summary>Pairs above which the scatter becomes a 2-D histogram (points would hide each other).</summary>
    public const int DensityAbove = 2000;

    public int Pages => 1;

    public void Draw(ReportPage page, int index)
    {
        page.Heading("Validation against the nearest measuring station");
        if (content.Station is not { } nearest)
        {
            page.Paragraph("No registered measuring station lies within this dataset, so the hindcast's skill near this site cannot be shown. " +
                "Treat the figures with the general skill stated for the dataset, if any.");
            return;
        }
        var station = nearest.Skill.Station;
        page.Paragraph($"Station {station.Name} ({(station.Independent ? "kept aside for validation: independent of the calibration" : "used in calibration: not independent")}), " +
            $"{Distance(nearest.DistanceFromCellMetres)} from this report's cell, {station.TimeStartUtc:yyyy-MM-dd} to {station.TimeEndUtc:yyyy-MM-dd}. " +
            $"Compared at its own nearest wet cell {nearest.Skill.Cell.Id} ({Distance(nearest.Skill.Cell.DistanceM)} away).");
        var rows = new List<IReadOnlyList<string>>();
        foreach (var v in nearest.Skill.Variables)
            if (v.Overall is { } o)
                rows.Add([v.Variable + " (" + v.Unit + ")", o.N.ToString(CultureInfo.InvariantCulture), Fixed(o.Bias, 3), Fixed(o.Rmse, 3), Fixed(o.ScatterIndex, 3),
                    Fixed(o.PearsonR, 3), Fixed(o.RegressionSlope, 3), Fixed(o.RegressionIntercept, 3)]);
            else if (v.Directional is { } d)
                rows.Add([v.Variable + " (degrees)", d.N.ToString(CultureInfo.InvariantCulture), Fixed(d.CircularBias, 1), Fixed(d.CircularRmse, 1), ReportNumbers.NoValue, ReportNumbers.NoValue, ReportNumbers.NoValue, ReportNumbers.NoValue]);
        page.Table(["variable", "N", "bias", "RMSE", "scatter\nindex", "r", "fitted\nslope", "fitted\nintercept"], rows, [92, 50, 56, 56, 64, 56, 66, 71]);

        if (nearest.Skill.Find("hs") is { } hs)
        {
            var grouped = hs.BySeason.Concat(hs.ByHsClass).Where(g => g.Skill is not null).Select(g => (IReadOnlyList<string>)
            [
                g.Season is { } season ? SiteOverviewSection.PeriodName(AtlasPeriod.TryParse(season, out var p) ? p : AtlasPeriod.Annual) :
                    g.HsUpperM is { } u ? $"Hs {Fixed(g.HsLowerM, 0)}–{Fixed(u, 0)} m" : $"Hs ≥ {Fixed(g.HsLowerM, 0)} m",
                g.Skill!.N.ToString(CultureInfo.InvariantCulture), Fixed(g.Skill.Bias, 3), Fixed(g.Skill.Rmse, 3), Fixed(g.Skill.ScatterIndex, 3), Fixed(g.Skill.PearsonR, 3),
            ]).ToArray();
            page.Subheading("Hs skill by season and by class of the measured Hs");
            page.Table(["group", "N", "bias m", "RMSE m", "scatter index", "r"], grouped, [110, 50, 60, 60, 70, 60]);
        }
        page.Paragraph("bias = mean(model − measured); scatter index = RMSE / mean measured; r: Pearson correlation; fitted line: least squares of model on measurement.",
            page.Fonts.Small, colour: ReportPage.Faint);

        if (nearest.HsPairs is { Observed.Count: > 1 } pairs && nearest.Skill.Find("hs")?.Overall is { } overall)
        {
            var w = (ReportPage.ContentWidth - 14) / 2;
            var box = SKRect.Create(ReportPage.Margin, page.Y + 4, w, Math.Min(230, ReportPage.Bottom - page.Y - 8));
            ReportCharts.Draw(page, ValidationCharts.Scatter(page.Fonts, pairs, overall, DensityAbove), box);
            ReportCharts.Draw(page, ValidationCharts.QuantileQuantile(page.Fonts, pairs), SKRect.Create(box.Right + 14, box.Top, w, box.Height));
            page.Y = box.Bottom + 4;
        }
    }
}
