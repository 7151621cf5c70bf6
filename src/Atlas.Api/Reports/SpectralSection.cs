using static Atlas.Api.Reports.ReportNumbers;

namespace Atlas.Api.Reports;

/// <summary>
/// The exact values integrated from the spectra of an output point: the report's own point when the dataset is one of
/// output points, or the nearest output point loaded beside the gridded dataset. Spectral and parametric mean power side
/// by side per period, the directionality from the period-mean directionally resolved power and the spectral width.
/// Nothing when there is no output point.
/// </summary>
public sealed class SpectralSection(SiteReportContent content) : IReportSection
{
    public int Pages => content.Statistics.Spectral is null ? 0 : 1;

    public void Draw(ReportPage page, int index)
    {
        var spectral = content.Statistics.Spectral!;
        page.Heading("Exact values from the spectra");
        var depth = spectral.DepthM is { } d ? $", {Fixed(d, 1)} m deep" : "";
        page.Paragraph(spectral.DistanceKm is { } km
            ? $"The nearest output point of the same hindcast, {spectral.Station}{depth}, lies {Fixed(km, 1)} km from the asked position. " +
              "Its values are integrated from its frequency-direction spectra; the gridded values above are approximations from Hs, Te, Tp, direction and spread."
            : $"This site is the output point {spectral.Station}{depth}: its values are integrated from its frequency-direction spectra.");
        // The annual and seasonal rows, as the summary table gives them (the point answer holds every period).
        var rows = spectral.Periods.Where(p => p.Period.Kind is PeriodKind.Annual or PeriodKind.Season).OrderBy(p => p.Period.Kind).Select(p => (IReadOnlyList<string>)
        [
            SiteOverviewSection.PeriodName(p.Period), p.Steps.ToString("N0", CultureInfo.InvariantCulture), Power(p.MeanPowerSpectral), Power(p.MeanPowerParametric),
            Percent(p.ParametricOverSpectral - 1), Fixed(p.DirectionalityCoefficient, 3), Degrees(p.MaxPowerFromDeg), Fixed(p.MeanSpectralWidth, 3),
        ]).ToList();
        page.Table(["period", "steps", "J spectral\nkW/m", "J from Hm0, Te\nkW/m", "difference", "d", "max J\nfrom °", "spectral\nwidth ε0"],
            rows, [84, 52, 70, 86, 70, 50, 50, 59]);
        page.Paragraph("J spectral = ρ g Σ cg(f, h) S(f) Δf with each frequency's group velocity at the point's depth; J from Hm0 and Te uses the group " +
            "velocity at Te alone; difference = J from Hm0, Te / J spectral − 1. d (directionality coefficient): the largest period-mean directionally resolved power " +
            "over the period-mean power (IEC TS 62600-101); max J from: the direction it is resolved in.", page.Fonts.Small, colour: ReportPage.Faint);
    }
}
