namespace Atlas.Api.Downloads;

/// <summary>
/// The atlas's cyclic colour scale for directions, "bearing": constant OKLab lightness (0.70) and chroma (the largest
/// every hue can hold at that lightness, less 3 %, so no hue is clipped), the hue once round the circle starting at a
/// blue (250 degrees) for north. Equal lightness keeps any direction from looking more important than another; 0 and
/// 360 degrees are the same colour. Drawn like <see cref="ColourScale"/> and served with it.
/// </summary>
public static class DirectionColourScale
{
    public const string Name = "bearing";
    public const int Steps = ColourRamp.Steps;
    public const double Lightness = 0.70;
    private const double StartHueDegrees = 250;

    /// <summary>The chroma of the circle: the largest every hue reaches in sRGB at <see cref="Lightness"/>, times 0.97.</summary>
    public static readonly double Chroma = 0.97 * Enumerable.Range(0, 180).Min(k =>
    {
        var (_, a, b) = OkLab.FitLch(Lightness, 0.4, 2 * k);
        return Math.Sqrt(a * a + b * b);
    });

    public static readonly ColourRamp Ramp = ColourRamp.Build(t => (Lightness, Chroma, StartHueDegrees + 360 * t), closed: true);

    /// <summary>The colour of a fraction of the circle (wrapped: 1 is 0 again); NaN gives null.</summary>
    public static (byte R, byte G, byte B)? At(double fraction) => double.IsNaN(fraction) ? null : Ramp.Colours[Ramp.IndexOf(fraction)];

    /// <summary>The colour of a direction in degrees (any value; wrapped to 0..360); NaN gives null.</summary>
    public static (byte R, byte G, byte B)? AtDegrees(double degrees) => At(degrees / 360);

    /// <summary>OKLab lightness of the scale: the same everywhere.</summary>
    public static double LightnessAt(double fraction) => Ramp.LightnessOf(Ramp.IndexOf(double.IsNaN(fraction) ? 0 : fraction));
}
