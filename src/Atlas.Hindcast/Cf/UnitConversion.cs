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

    /// <summary>A unit the conversion knows, with its spellings: symbols compare case-sensitively, words do not.</summary>
    private sealed record KnownUnit(PhysicalQuantity Quantity, double Factor, string[] Symbols, string[] Words);

    private static readonly KnownUnit[] Known =
    [
        new(PhysicalQuantity.Length, 1, ["m"], ["meter", "meters", "metre", "metres"]),
        new(PhysicalQuantity.Length, 0.01, ["cm"], ["centimeter", "centimeters", "centimetre", "centimetres"]),
        new(PhysicalQuantity.Length, 0.001, ["mm"], ["millimeter", "millimeters", "millimetre", "millimetres"]),
        new(PhysicalQuantity.Length, 1000, ["km"], ["kilometer", "kilometers", "kilometre", "kilometres"]),
        new(PhysicalQuantity.Length, 0.3048, ["ft"], ["foot", "feet"]),
        new(PhysicalQuantity.Time, 1, ["s"], ["sec", "secs", "second", "seconds"]),
        new(PhysicalQuantity.Time, 0.001, ["ms"], []),
        new(PhysicalQuantity.Time, 60, ["min"], ["minute", "minutes"]),
        new(PhysicalQuantity.Time, 3600, ["h"], ["hour", "hours"]),
        // Besides the udunits names, reanalysis-style spellings of a bearing from true north ("Degree true", "°T").
        new(PhysicalQuantity.Angle, 1, ["°"],
            ["degree", "degrees", "degree_true", "degrees_true", "deg", "arc_degree", "angular_degree",
             "degree true", "degrees true", "degree_T", "degrees_T", "°T"]),
        new(PhysicalQuantity.Angle, 180 / Math.PI, ["rad"], ["radian", "radians"]),
        // udunits writes a reciprocal second as "s-1"; files also carry "1/s", "s^-1" and "/s". A lower-case "hz" is
        // not udunits, but files carry it and it cannot mean anything else.
        new(PhysicalQuantity.Frequency, 1, ["Hz", "s-1", "s^-1", "s**-1", "1/s", "/s"], ["hertz", "hz"]),
        new(PhysicalQuantity.Frequency, 0.001, ["mHz"], []),
    ];

    // Symbols are case-sensitive as in udunits ("m" is metre, "M" is not a unit); spelled-out names are not.
    private static readonly Dictionary<string, (PhysicalQuantity Quantity, double Factor)> Symbols =
        Spellings(unit => unit.Symbols, StringComparer.Ordinal);

    private static readonly Dictionary<string, (PhysicalQuantity Quantity, double Factor)> Words =
        Spellings(unit => unit.Words, StringComparer.OrdinalIgnoreCase);

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

    private static Dictionary<string, (PhysicalQuantity Quantity, double Factor)> Spellings(
        Func<KnownUnit, string[]> spellings, StringComparer comparer)
    {
        var table = new Dictionary<string, (PhysicalQuantity, double)>(comparer);
        foreach (var unit in Known)
            foreach (var spelling in spellings(unit))
                table.Add(spelling, (unit.Quantity, unit.Factor));
        return table;
    }
}
