namespace Atlas.Api.Downloads;

/// <summary>
/// A colour ramp as a table of <see cref="Steps"/> 8-bit sRGB colours, built from a path through OKLCh (lightness,
/// chroma, hue by a fraction 0..1; chroma reduced to fit sRGB) and resampled at equal arc length in OKLab, so that
/// equal steps of the table are equal perceived colour differences. A closed ramp (a cyclic one) spaces its entries
/// over the whole loop, so that the last entry is one step before the first.
/// </summary>
public sealed class ColourRamp
{
    public const int Steps = 256;
    private const int Samples = 2048;

    private readonly (byte R, byte G, byte B)[] _colours;
    private readonly double[] _lightness;

    private ColourRamp((byte, byte, byte)[] colours, double[] lightness, bool closed)
    {
        _colours = colours;
        _lightness = lightness;
        Closed = closed;
    }

    public bool Closed { get; }

    /// <summary>The table, first entry at fraction 0.</summary>
    public IReadOnlyList<(byte R, byte G, byte B)> Colours => _colours;

    /// <summary>
    /// The entry of a fraction: an open ramp clamps to 0..1 and rounds to the nearest of its entries
    /// (index round(f (Steps - 1))); a closed ramp wraps (index floor(f Steps) mod Steps). The page indexes the same way.
    /// </summary>
    public int IndexOf(double fraction) => Closed
        ? (int)((((long)Math.Floor(fraction * Steps) % Steps) + Steps) % Steps)
        : (int)Math.Round(Math.Clamp(fraction, 0, 1) * (Steps - 1));

    /// <summary>The OKLab lightness of the entry at <paramref name="index"/>, before conversion to 8-bit sRGB.</summary>
    public double LightnessOf(int index) => _lightness[index];

    /// <summary>Builds the ramp of <paramref name="path"/> (OKLCh of a fraction, hue in degrees).</summary>
    public static ColourRamp Build(Func<double, (double Lightness, double Chroma, double HueDegrees)> path, bool closed)
    {
        var points = new (double L, double A, double B)[Samples + 1];
        for (var k = 0; k <= Samples; k++)
        {
            var (l, c, h) = path(k / (double)Samples);
            points[k] = OkLab.FitLch(l, c, h);
        }
        var arc = new double[points.Length];
        for (var k = 1; k < points.Length; k++)
            arc[k] = arc[k - 1] + Math.Sqrt(Square(points[k].L - points[k - 1].L) + Square(points[k].A - points[k - 1].A) + Square(points[k].B - points[k - 1].B));
        var total = arc[^1];
        var colours = new (byte, byte, byte)[Steps];
        var lightness = new double[Steps];
        var j = 0;
        for (var i = 0; i < Steps; i++)
        {
            var target = total * i / (closed ? Steps : Steps - 1);
            while (j < arc.Length - 2 && arc[j + 1] < target) j++;
            var f = arc[j + 1] > arc[j] ? Math.Clamp((target - arc[j]) / (arc[j + 1] - arc[j]), 0, 1) : 0;
            var (p, q) = (points[j], points[j + 1]);
            var lab = (p.L + f * (q.L - p.L), p.A + f * (q.A - p.A), p.B + f * (q.B - p.B));
            colours[i] = OkLab.ToSrgbBytes(lab.Item1, lab.Item2, lab.Item3);
            lightness[i] = lab.Item1;
        }
        return new ColourRamp(colours, lightness, closed);
    }

    /// <summary>Piecewise-linear interpolation of OKLCh stops (fraction, lightness, chroma, hue in degrees).</summary>
    public static Func<double, (double, double, double)> Through(params (double At, double Lightness, double Chroma, double HueDegrees)[] stops) => t =>
    {
        var k = 1;
        while (k < stops.Length - 1 && t > stops[k].At) k++;
        var (a, b) = (stops[k - 1], stops[k]);
        var f = Math.Clamp((t - a.At) / (b.At - a.At), 0, 1);
        return (a.Lightness + f * (b.Lightness - a.Lightness), a.Chroma + f * (b.Chroma - a.Chroma), a.HueDegrees + f * (b.HueDegrees - a.HueDegrees));
    };

    /// <summary>The css hex form, #rrggbb, of an entry.</summary>
    public static string Hex((byte R, byte G, byte B) c) => $"#{c.R:x2}{c.G:x2}{c.B:x2}";

    private static double Square(double x) => x * x;
}
