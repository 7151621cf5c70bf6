using System.Globalization;
using System.Text.RegularExpressions;

namespace Atlas.Hindcast;

/// <summary>The physical quantity a wave variable carries, and so the SI unit it is converted to.</summary>
public enum PhysicalQuantity
{
    /// <summary>Converted to metres.</summary>
    Length,
    /// <summary>Converted to seconds.</summary>
    Time,
    /// <summary>Converted to degrees (the atlas keeps directions in degrees, not radians).</summary>
    Angle,
    /// <summary>Converted to hertz (a peak frequency, later turned into a period by its reciprocal).</summary>
    Frequency,
}

/// <summary>
/// A linear conversion from a file's units to the atlas units: <c>si = value * Factor + Offset</c>.
/// Covers the udunits spellings that wave-model output uses for lengths, periods, angles and frequencies, and the
/// spellings real files carry beside them ("Degree true", "degrees_true", "deg", "°", "1/s"); anything else is refused
/// rather than guessed.
/// </summary>
public readonly record struct UnitConversion(double Factor, double Offset)
{
    public static readonly UnitConversion Identity = new(1, 0);

    public bool IsIdentity => Factor == 1 && Offset == 0;

    // Symbols are case-sensitive as in udunits ("m" is metre, "M" is not a unit); spelled-out names are not.
    private static readonly Dictionary<string, (PhysicalQuantity Quantity, double Factor)> Symbols = new(StringComparer.Ordinal)
    {
        ["m"] = (PhysicalQuantity.Length, 1),
        ["cm"] = (PhysicalQuantity.Length, 0.01),
        ["mm"] = (PhysicalQuantity.Length, 0.001),
        ["km"] = (PhysicalQuantity.Length, 1000),
        ["ft"] = (PhysicalQuantity.Length, 0.3048),
        ["s"] = (PhysicalQuantity.Time, 1),
        ["ms"] = (PhysicalQuantity.Time, 0.001),
        ["min"] = (PhysicalQuantity.Time, 60),
        ["h"] = (PhysicalQuantity.Time, 3600),
        ["°"] = (PhysicalQuantity.Angle, 1),
        ["rad"] = (PhysicalQuantity.Angle, 180 / Math.PI),
        ["Hz"] = (PhysicalQuantity.Frequency, 1),
        ["mHz"] = (PhysicalQuantity.Frequency, 0.001),
        // udunits writes a reciprocal second as "s-1"; files also carry "1/s", "s^-1" and "/s".
        ["s-1"] = (PhysicalQuantity.Frequency, 1),
        ["s^-1"] = (PhysicalQuantity.Frequency, 1),
        ["s**-1"] = (PhysicalQuantity.Frequency, 1),
        ["1/s"] = (PhysicalQuantity.Frequency, 1),
        ["/s"] = (PhysicalQuantity.Frequency, 1),
    };

    private static readonly Dictionary<string, (PhysicalQuantity Quantity, double Factor)> Words = new(StringComparer.OrdinalIgnoreCase)
    {
        ["meter"] = (PhysicalQuantity.Length, 1),
        ["meters"] = (PhysicalQuantity.Length, 1),
        ["metre"] = (PhysicalQuantity.Length, 1),
        ["metres"] = (PhysicalQuantity.Length, 1),
        ["centimeter"] = (PhysicalQuantity.Length, 0.01),
        ["centimeters"] = (PhysicalQuantity.Length, 0.01),
        ["centimetre"] = (PhysicalQuantity.Length, 0.01),
        ["centimetres"] = (PhysicalQuantity.Length, 0.01),
        ["millimeter"] = (PhysicalQuantity.Length, 0.001),
        ["millimeters"] = (PhysicalQuantity.Length, 0.001),
        ["millimetre"] = (PhysicalQuantity.Length, 0.001),
        ["millimetres"] = (PhysicalQuantity.Length, 0.001),
        ["kilometer"] = (PhysicalQuantity.Length, 1000),
        ["kilometers"] = (PhysicalQuantity.Length, 1000),
        ["kilometre"] = (PhysicalQuantity.Length, 1000),
        ["kilometres"] = (PhysicalQuantity.Length, 1000),
        ["foot"] = (PhysicalQuantity.Length, 0.3048),
        ["feet"] = (PhysicalQuantity.Length, 0.3048),
        ["sec"] = (PhysicalQuantity.Time, 1),
        ["secs"] = (PhysicalQuantity.Time, 1),
        ["second"] = (PhysicalQuantity.Time, 1),
        ["seconds"] = (PhysicalQuantity.Time, 1),
        ["minute"] = (PhysicalQuantity.Time, 60),
        ["minutes"] = (PhysicalQuantity.Time, 60),
        ["hour"] = (PhysicalQuantity.Time, 3600),
        ["hours"] = (PhysicalQuantity.Time, 3600),
        ["degree"] = (PhysicalQuantity.Angle, 1),
        ["degrees"] = (PhysicalQuantity.Angle, 1),
        ["degree_true"] = (PhysicalQuantity.Angle, 1),
        ["degrees_true"] = (PhysicalQuantity.Angle, 1),
        ["deg"] = (PhysicalQuantity.Angle, 1),
        ["arc_degree"] = (PhysicalQuantity.Angle, 1),
        ["angular_degree"] = (PhysicalQuantity.Angle, 1),
        ["radian"] = (PhysicalQuantity.Angle, 180 / Math.PI),
        ["radians"] = (PhysicalQuantity.Angle, 180 / Math.PI),
        // Reanalysis-style spellings of a bearing from true north: "Degree true", "degrees true".
        ["degree true"] = (PhysicalQuantity.Angle, 1),
        ["degrees true"] = (PhysicalQuantity.Angle, 1),
        ["degree_T"] = (PhysicalQuantity.Angle, 1),
        ["degrees_T"] = (PhysicalQuantity.Angle, 1),
        ["°T"] = (PhysicalQuantity.Angle, 1),
        ["hertz"] = (PhysicalQuantity.Frequency, 1),
        // A lower-case "hz" is not udunits, but files carry it and it cannot mean anything else.
        ["hz"] = (PhysicalQuantity.Frequency, 1),
    };

    private static readonly Regex Blanks = new(@"\s+", RegexOptions.CultureInvariant);

    // udunits allows a numeric scale in front of a unit: "0.01 m", "1e-3 m", "100 cm".
    private static readonly Regex ScaledUnit = new(@"^(?<scale>[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?)\s*\*?\s*(?<unit>\S.*)$", RegexOptions.CultureInvariant);

    /// <summary>
    /// The conversion of <paramref name="units"/> to the SI unit of <paramref name="quantity"/>.
    /// Throws <see cref="FormatException"/> naming the units string when it is not a unit of that quantity.
    /// </summary>
    public static UnitConversion ToSi(string? units, PhysicalQuantity quantity)
    {
        if (TryToSi(units, quantity, out var conversion)) return conversion;
        string target = quantity switch
        {
            PhysicalQuantity.Length => "metres",
            PhysicalQuantity.Time => "seconds",
            PhysicalQuantity.Frequency => "hertz",
            _ => "degrees",
        };
        throw new FormatException(string.IsNullOrWhiteSpace(units)
            ? $"has no units attribute; expected a {quantity.ToString().ToLowerInvariant()} convertible to {target} (give the units in the mapping file if the file omits them)"
            : $"units '{units}' cannot be converted to {target}");
    }

    public static bool TryToSi(string? units, PhysicalQuantity quantity, out UnitConversion conversion)
    {
        conversion = default;
        if (string.IsNullOrWhiteSpace(units)) return false;
        // Runs of blanks count as one ("Degree  true" is "Degree true").
        string text = Blanks.Replace(units.Trim(), " ");
        double scale = 1;
        var scaled = ScaledUnit.Match(text);
        if (scaled.Success && !Lookup(text, out _))
        {
            scale = double.Parse(scaled.Groups["scale"].Value, NumberStyles.Float, CultureInfo.InvariantCulture);
            text = scaled.Groups["unit"].Value.Trim();
        }
        if (!Lookup(text, out var unit) || unit.Quantity != quantity || scale <= 0) return false;
        conversion = new UnitConversion(scale * unit.Factor, 0);
        return true;
    }

    private static bool Lookup(string text, out (PhysicalQuantity Quantity, double Factor) unit) =>
        Symbols.TryGetValue(text, out unit) || Words.TryGetValue(text, out unit);
}
