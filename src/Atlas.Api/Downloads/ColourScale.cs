namespace Atlas.Api.Downloads;

/// <summary>
/// The atlas's sequential colour scale, defined in the OKLab perceptual colour space (Ottosson 2020): lightness rises
/// linearly from 0.27 to 0.93 while the hue turns from blue-violet (290 degrees) through teal and green to yellow
/// (95 degrees). Equal steps in value are equal steps in perceived lightness, so the scale reads the same in grey
/// print and to colour-blind readers. Where a colour falls outside sRGB its chroma is reduced, never its lightness.
/// </summary>
public static class ColourScale
{
    public const int Steps = 256;

    private const double LightnessStart = 0.27, LightnessEnd = 0.93;
    private const double HueStart = 290, HueEnd = 95;

    private static readonly (byte R, byte G, byte B)[] Table = Build();

    /// <summary>The colour of a fraction 0..1 of the scale (clamped); NaN gives null.</summary>
    public static (byte R, byte G, byte B)? At(double fraction)
    {
        if (double.IsNaN(fraction)) return null;
        var index = (int)Math.Round(Math.Clamp(fraction, 0, 1) * (Steps - 1));
        return Table[index];
    }

    /// <summary>OKLab lightness of a fraction of the scale, before conversion to 8-bit sRGB.</summary>
    public static double LightnessAt(double fraction) => LightnessStart + (LightnessEnd - LightnessStart) * Math.Clamp(fraction, 0, 1);

    private static (byte, byte, byte)[] Build()
    {
        var table = new (byte, byte, byte)[Steps];
        for (var k = 0; k < Steps; k++)
        {
            var t = k / (double)(Steps - 1);
            var lightness = LightnessAt(t);
            var hue = (HueStart + (HueEnd - HueStart) * t) * Math.PI / 180;
            // Chroma grows towards the light end, where sRGB has room for it.
            var chroma = 0.09 + 0.08 * t;
            var rgb = ToSrgb(lightness, chroma, hue);
            while (rgb is null && chroma > 0)
            {
                chroma -= 0.002;
                rgb = ToSrgb(lightness, Math.Max(0, chroma), hue);
            }
            table[k] = rgb ?? (Encode(lightness * lightness * lightness), Encode(lightness * lightness * lightness), Encode(lightness * lightness * lightness));
        }
        return table;
    }

    // OKLCh to sRGB (Ottosson's OKLab matrices); null when outside the sRGB gamut.
    private static (byte, byte, byte)? ToSrgb(double lightness, double chroma, double hue)
    {
        var a = chroma * Math.Cos(hue);
        var b = chroma * Math.Sin(hue);
        var l = Math.Pow(lightness + 0.3963377774 * a + 0.2158037573 * b, 3);
        var m = Math.Pow(lightness - 0.1055613458 * a - 0.0638541728 * b, 3);
        var s = Math.Pow(lightness - 0.0894841775 * a - 1.2914855480 * b, 3);
        var red = 4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s;
        var green = -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s;
        var blue = -0.0041960863 * l - 0.7034186147 * m + 1.7076147010 * s;
        const double slack = 1e-4;
        if (red < -slack || red > 1 + slack || green < -slack || green > 1 + slack || blue < -slack || blue > 1 + slack) return null;
        return (Encode(red), Encode(green), Encode(blue));
    }

    private static byte Encode(double linear)
    {
        var c = Math.Clamp(linear, 0, 1);
        var srgb = c <= 0.0031308 ? 12.92 * c : 1.055 * Math.Pow(c, 1 / 2.4) - 0.055;
        return (byte)Math.Round(srgb * 255);
    }
}
