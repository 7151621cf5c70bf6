using static Atlas.Api.Reports.ReportNumbers;

namespace Atlas.Api.Reports;

/// <summary>
/// Device yield (when a device is named), weather windows for the report's access limits, and extreme Hs with its
/// cautions, the strongest repeated in bold so no reader misses it.
/// </summary>
public sealed class AssessmentSection(SiteReportContent content) : IReportSection
{
    private static readonly string[] MonthNames = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];

    public int Pages => 2;

    public void Draw(ReportPage page, int index)
    {
        if (index == 0)
        {
            Yield(page);
            Windows(page);
        }
        else Extremes(page);
    }

    private void Yield(ReportPage page)
    {
        page.Heading("Device yield");
        if (content.Yield is not { } y)
        {
            page.Paragraph("No device was named for this report; name one (a stored power matrix) to add its production here.");
            return;
        }
        page.Paragraph($"{y.Device.Name}, rated {Fixed(y.Device.RatedPowerKw, 0)} kW, power matrix over Hs and {y.Device.Axis}; wave period: {y.PeriodSource}.");
        page.Table(["quantity", "value"],
        [
            ["mean annual energy", Fixed(y.AnnualEnergyMwh, 0) + " MWh/yr"],
            ["mean power", Fixed(y.MeanPowerKw, 1) + " kW"],
            ["capacity factor", Percent(y.CapacityFactor)],
            ["time outside the matrix (0 kW)", Percent(y.OutsideMatrixFraction)],
            ["inter-annual coefficient of variation", Fixed(y.InterannualCv, 2) + $" ({y.CompleteYears} complete years)"],
        ], [220, 140]);
        page.Table(["month", .. MonthNames], [["mean kW", .. y.Months.Select(m => Fixed(m.MeanPowerKw, 0))]], [55, .. Enumerable.Repeat(38.3f, 12)]);
    }

    private void Windows(ReportPage page)
    {
        var w = content.Windows;
        page.Heading("Weather windows");
        page.Paragraph($"Access limit Hs ≤ {Fixed(w.Limits.HsMaxM, 1)} m{(w.Limits.TpMaxS is { } tp ? $", Tp ≤ {Fixed(tp, 1)} s" : "")}, for windows of at least " +
            $"{Fixed(w.RequiredHours, 0)} hours{(content.Request.HsLimitMetres == SiteReportRequest.DefaultHsLimitMetres && content.Request.WindowHours == SiteReportRequest.DefaultWindowHours ? " (the report's default limits)" : "")}. " +
            $"Time within the limits: {Percent(w.AccessibleFraction)}.");
        page.Table(["month", "window start probability", "windows per month", "mean wait (h)", "time within limits"],
            w.Months.Select(m => (IReadOnlyList<string>)[MonthNames[m.Month - 1], Percent(m.WindowStartProbability), Fixed(m.MeanWindowsPerMonth, 1),
                Fixed(m.MeanWaitingHours, 0), Percent(m.AccessibleFraction)]), [70, 110, 100, 90, 100]);
        page.Paragraph($"Calm spells: {w.CalmSpells.Count} (mean {Fixed(w.CalmSpells.MeanHours, 0)} h, longest {Fixed(w.CalmSpells.MaximumHours, 0)} h); " +
            $"storm spells: {w.StormSpells.Count} (mean {Fixed(w.StormSpells.MeanHours, 0)} h, longest {Fixed(w.StormSpells.MaximumHours, 0)} h).", page.Fonts.Small);
        page.Paragraph(PlainWords.Of(w.Method), page.Fonts.Small, colour: ReportPage.Faint);
    }

    private void Extremes(ReportPage page)
    {
        var e = content.Extremes;
        page.Heading("Extreme Hs");
        // The strongest cautions in bold first (they open with their own "STRONG CAUTION"), the others after the table.
        if (e.StrongCaution is { } strong) page.Paragraph(strong, page.Fonts.Bold);
        page.Paragraph($"Record of {Fixed(e.RecordYears, 1)} years of valid steps.");
        var rows = new List<IReadOnlyList<string>>();
        void Add(string method, DistributionFit? fit)
        {
            if (fit is null) return;
            foreach (var level in fit.ReturnLevels)
                rows.Add([method, Fixed(level.ReturnPeriodYears, 0), Fixed(level.Level, 2), Fixed(level.Lower, 2),
                    level.UpperUnbounded ? "unbounded" : Fixed(level.Upper, 2), level.LongExtrapolation ? "beyond twice the record" : ""]);
        }
        if (e.AnnualMaxima is { Available: true } annual)
        {
            Add("annual maxima, Gumbel", annual.Gumbel);
            Add("annual maxima, GEV", annual.Gev);
        }
        if (e.PeaksOverThreshold is { Available: true } peaks) Add($"peaks over {Fixed(peaks.Threshold, 2)} m, GPD", peaks.Gpd);
        if (rows.Count > 0)
            page.Table(["method", "return period (yr)", "Hs (m)", "95 % lower", "95 % upper", "note"], rows, [150, 75, 55, 60, 60, 111]);
        foreach (var reason in new[] { e.AnnualMaxima is { Available: false } a ? "Annual maxima: " + a.Reason : null,
                     e.PeaksOverThreshold is { Available: false } p ? "Peaks over threshold: " + p.Reason : null }.OfType<string>())
            page.Paragraph(reason);
        var cautions = (e.AnnualMaxima?.Cautions ?? []).Concat(e.PeaksOverThreshold?.Cautions ?? [])
            .Where(c => c.Kind is not ("long_extrapolation" or "small_sample") || e.StrongCaution is null).Select(c => c.Text).Distinct();
        foreach (var caution in cautions) page.Paragraph("• " + caution, page.Fonts.Small);
    }
}
