namespace Atlas.Api.Downloads;

/// <summary>
/// The OKLab perceptual colour space (B. Ottosson, "A perceptual color space for image processing", 2020, with its
/// published matrices) and its conversions to and from 8-bit sRGB (IEC 61966-2-1 transfer function). Euclidean
/// distance in OKLab is the space's colour difference (ΔE).
/// </summary>
public static class OkLab
{
    /// <summary>OKLab to linear-light sRGB, unclipped (a component outside 0..1 is out of gamut).</summary>
    public static (double R, double G, double B) ToLinearSrgb(double lightness, double a, double b)
    {
        var l = Math.Pow(lightness + 0.3963377774 * a + 0.2158037573 * b, 3);
        var m = Math.Pow(lightness - 0.1055613458 * a - 0.0638541728 * b, 3);
        var s = Math.Pow(lightness - 0.0894841775 * a - 1.2914855480 * b, 3);
        return (4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s,
                -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s,
                -0.0041960863 * l - 0.7034186147 * m + 1.7076147010 * s);
    }

    /// <summary>8-bit sRGB to OKLab.</summary>
    public static (double L, double A, double B) FromSrgb(byte red, byte green, byte blue)
    {
        double r = Decode(red), g = Decode(green), b = Decode(blue);
        var l = Math.Cbrt(0.4122214708 * r + 0.5363325363 * g + 0.0514459929 * b);
        var m = Math.Cbrt(0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * b);
        var s = Math.Cbrt(0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * b);
        return (0.2104542553 * l + 0.7936177850 * m - 0.0040720468 * s,
                1.9779984951 * l - 2.4285922050 * m + 0.4505937099 * s,
                0.0259040371 * l + 0.7827717662 * m - 0.8086757660 * s);
    }

    /// <summary>True when the OKLab colour lies inside the sRGB gamut.</summary>
    public static bool InGamut(double lightness, double a, double b)
    {
        const double slack = 1e-6;
        var (r, g, bl) = ToLinearSrgb(lightness, a, b);
        return r >= -slack && r <= 1 + slack && g >= -slack && g <= 1 + slack && bl >= -slack && bl <= 1 + slack;
    }

    /// <summary>
    /// The OKLab colour of lightness, chroma and hue (degrees), with the chroma reduced (never the lightness) until it
    /// fits sRGB; found by bisection to about 1e-7 of chroma.
    /// </summary>
    public static (double L, double A, double B) FitLch(double lightness, double chroma, double hueDegrees)
    {
        var (cos, sin) = (Math.Cos(hueDegrees * Math.PI / 180), Math.Sin(hueDegrees * Math.PI / 180));
        double lo = 0, hi = chroma;
        if (InGamut(lightness, chroma * cos, chroma * sin)) lo = chroma;
        else
            for (var k = 0; k < 24; k++)
            {
                var mid = (lo + hi) / 2;
                if (InGamut(lightness, mid * cos, mid * sin)) lo = mid;
                else hi = mid;
            }
        return (lightness, lo * cos, lo * sin);
    }

    /// <summary>OKLab to 8-bit sRGB, each linear component clamped to 0..1 first.</summary>
    public static (byte R, byte G, byte B) ToSrgbBytes(double lightness, double a, double b)
    {
        var (r, g, bl) = ToLinearSrgb(lightness, a, b);
        return (Encode(r), Encode(g), Encode(bl));
    }

    private static byte Encode(double linear)
    {
        var c = Math.Clamp(linear, 0, 1);
        var srgb = c <= 0.0031308 ? 12.92 * c : 1.055 * Math.Pow(c, 1 / 2.4) - 0.055;
        return (byte)Math.Round(srgb * 255);
    }

    private static double Decode(byte value)
    {
        var c = value / 255.0;
        return c <= 0.04045 ? c / 12.92 : Math.Pow((c + 0.055) / 1.055, 2.4);
    }
}
