namespace Atlas.Api.Downloads;

/// <summary>
/// The atlas's sequential colour scale, "deep to shore": a path through OKLCh from a deep-sea navy (lightness 0.21,
/// chroma 0.08, hue 258 degrees) through teal (0.58, 0.15, hue 185; the chroma sRGB can hold there) to a warm sand
/// (0.95, 0.085, hue 68), resampled at equal perceived steps (<see cref="ColourRamp"/>). Its mean OKLab difference from
/// every sequential map matplotlib and colorcet ship is at least 0.07 (ColourScaleTests). Lightness rises monotonically, so the order of values survives grey print and the
/// common colour-vision deficiencies. The one definition of the scale: the PNG and vector figures draw with it and the
/// page reads its table from <c>GET /api/v1/colour-scales</c>.
/// </summary>
public static class ColourScale
{
    public const string Name = "deep to shore";
    public const int Steps = ColourRamp.Steps;

    /// <summary>The ramp (OKLCh stops: fraction, lightness, chroma, hue).</summary>
    public static readonly ColourRamp Ramp = ColourRamp.Build(ColourRamp.Through((0, 0.21, 0.08, 258), (0.5, 0.58, 0.15, 185), (1, 0.95, 0.085, 68)), closed: false);

    /// <summary>The colour of a fraction 0..1 of the scale (clamped); NaN gives null.</summary>
    public static (byte R, byte G, byte B)? At(double fraction) => double.IsNaN(fraction) ? null : Ramp.Colours[Ramp.IndexOf(fraction)];

    /// <summary>OKLab lightness of a fraction of the scale (its table entry), before conversion to 8-bit sRGB.</summary>
    public static double LightnessAt(double fraction) => Ramp.LightnessOf(Ramp.IndexOf(double.IsNaN(fraction) ? 0 : fraction));
}
