using System.Globalization;
using System.Text.RegularExpressions;

namespace Atlas.Hindcast.Spectra;

/// <summary>
/// The units of a variance spectral density, converted to the atlas's: m^2 s rad^-1 (per hertz per radian) for a
/// directional spectrum, m^2 s (per hertz) for a frequency spectrum.
/// </summary>
/// <remarks>
/// udunits spellings and the ones spectral models write beside them are read: products of terms separated by spaces,
/// dots or asterisks, each a unit with an optional exponent ("m2", "m^2", "m**2", "Hz-1", "rad^-1"), and divisions
/// ("m2/Hz/deg"). Lengths in m or cm, per hertz as "s" or "Hz-1", per radian or per degree. Anything else, or a
/// product of the wrong dimension, is refused with the unit named: a density is never guessed.
/// </remarks>
public static partial class SpectralDensityUnits
{
    /// <summary>The factor that turns values in <paramref name="units"/> into the atlas unit, and what was done, in words.</summary>
    /// <exception cref="FormatException">The units are missing, unknown or of another dimension (problem text only).</exception>
    public static (double Factor, string Conversion) ToSi(string? units, bool directional)
    {
        string expected = directional ? "m2 s rad-1" : "m2 s";
        if (string.IsNullOrWhiteSpace(units))
            throw new FormatException($"has no units attribute; a spectral density needs one such as \"{expected}\"");
        int length = 0, time = 0, angle = 0;
        double factor = 1;
        bool perDegree = false;
        var text = units.Trim().Replace("**", "^");
        var parts = text.Split('/');
        for (int p = 0; p < parts.Length; p++)
        {
            int sign = p == 0 ? 1 : -1;
            foreach (var term in Terms().Split(parts[p].Trim()).Where(t => t.Length > 0))
            {
                var match = Term().Match(term);
                if (!match.Success) throw Unknown(units, expected);
                int exponent = match.Groups[2].Success ? int.Parse(match.Groups[2].Value, CultureInfo.InvariantCulture) : 1;
                exponent *= sign;
                switch (match.Groups[1].Value)
                {
                    case "m": length += exponent; break;
                    case "cm": length += exponent; factor *= Math.Pow(0.01, exponent); break;
                    case "s": time += exponent; break;
                    case "Hz": time -= exponent; break;
                    case "rad" or "radian" or "radians": angle += exponent; break;
                    case "degree" or "degrees" or "deg":
                        angle += exponent;
                        factor *= Math.Pow(180 / Math.PI, -exponent);
                        perDegree = true;
                        break;
                    default: throw Unknown(units, expected);
                }
            }
        }
        if (length != 2 || time != 1 || angle != (directional ? -1 : 0))
            throw new FormatException($"has units \"{units}\", which is not a {(directional ? "directional " : "")}variance density " +
                $"(m2 per hertz{(directional ? " per radian or per degree" : "")}, such as \"{expected}\")");
        string conversion = factor == 1 ? "none"
            : perDegree && Math.Abs(factor * Math.PI / 180 - 1) < 1e-12 ? $"from {units} to {expected}: times 180/pi (per degree to per radian)"
            : $"from {units} to {expected}: times {factor.ToString("G6", CultureInfo.InvariantCulture)}";
        return (factor, conversion);
    }

    private static FormatException Unknown(string units, string expected) =>
        new($"has units \"{units}\", which this reader does not know; a spectral density is given in units such as \"{expected}\", " +
            "\"m2 Hz-1 degree-1\" or \"m2/Hz\"");

    [GeneratedRegex(@"[\s.*]+")]
    private static partial Regex Terms();

    [GeneratedRegex(@"^([A-Za-z]+)(?:\^|\*\*)?(-?\d+)?$")]
    private static partial Regex Term();
}
