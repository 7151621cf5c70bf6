using SkiaSharp;

namespace Atlas.Api.Reports;

/// <summary>The report's type: DejaVu Sans (Debian's default sans-serif, embedded by the PDF writer) in a few sizes.</summary>
public sealed class ReportFonts : IDisposable
{
    private readonly SKTypeface _regular = SKTypeface.FromFamilyName("DejaVu Sans") ?? SKTypeface.Default;
    private readonly SKTypeface _bold = SKTypeface.FromFamilyName("DejaVu Sans", SKFontStyle.Bold) ?? SKTypeface.Default;

    public ReportFonts()
    {
        Title = new SKFont(_bold, 17);
        Heading = new SKFont(_bold, 12.5f);
        Bold = new SKFont(_bold, 9.5f);
        Body = new SKFont(_regular, 9.5f);
        Small = new SKFont(_regular, 7.8f);
        SmallBold = new SKFont(_bold, 7.8f);
        Tiny = new SKFont(_regular, 6.4f);
    }

    public SKFont Title { get; }
    public SKFont Heading { get; }
    public SKFont Bold { get; }
    public SKFont Body { get; }
    public SKFont Small { get; }
    public SKFont SmallBold { get; }
    public SKFont Tiny { get; }

    /// <summary>The family name, for the charts drawn by the charting library.</summary>
    public string Family => _regular.FamilyName;

    public void Dispose()
    {
        foreach (var font in new[] { Title, Heading, Bold, Body, Small, SmallBold, Tiny }) font.Dispose();
        _regular.Dispose();
        _bold.Dispose();
    }
}
