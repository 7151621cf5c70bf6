using SkiaSharp;

namespace Atlas.Api.Reports;

/// <summary>Colours between the report's canvas (SkiaSharp) and its charts (ScottPlot).</summary>
public static class ColourConversions
{
    public static ScottPlot.Color ToScottPlot(this SKColor colour) => new(colour.Red, colour.Green, colour.Blue, colour.Alpha);
}
