namespace Atlas.Api.Reports;

/// <summary>
/// How reports print numbers: fixed decimals per quantity, invariant culture, and an en dash for a missing value. The
/// values are the API's own (the same records its JSON serialises), only rounded for print.
/// </summary>
public static class ReportNumbers
{
    public const string NoValue = "–";

    public static string Fixed(double value, int decimals) =>
        double.IsFinite(value) ? value.ToString("F" + decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture) : NoValue;

    public static string Fixed(double? value, int decimals) => value is { } v ? Fixed(v, decimals) : NoValue;

    /// <summary>A fraction 0..1 as a percentage.</summary>
    public static string Percent(double fraction, int decimals = 1) => double.IsFinite(fraction) ? Fixed(100 * fraction, decimals) + " %" : NoValue;

    public static string Percent(double? fraction, int decimals = 1) => fraction is { } f ? Percent(f, decimals) : NoValue;

    /// <summary>Hs, Te, Tp (m, s): two decimals.</summary>
    public static string Metric(double value) => Fixed(value, 2);

    /// <summary>Wave power, kW/m: one decimal.</summary>
    public static string Power(double value) => Fixed(value, 1);

    /// <summary>A direction, degrees true: whole degrees.</summary>
    public static string Degrees(double value) => Fixed(value, 0);

    public static string Distance(double metres) =>
        metres >= 10_000 ? Fixed(metres / 1000, 1) + " km" : Fixed(metres, 0) + " m";

    /// <summary>A round step (1, 2 or 5 times a power of ten) near <paramref name="rough"/>, for ticks, rings and scale bars.</summary>
    public static double NiceStep(double rough)
    {
        var power = Math.Pow(10, Math.Floor(Math.Log10(rough)));
        var m = rough / power;
        return (m < 1.5 ? 1 : m < 3.5 ? 2 : m < 7.5 ? 5 : 10) * power;
    }

    /// <summary>A position as degrees with hemispheres, e.g. "50.01° N, 26.005° W" (up to <paramref name="decimals"/> decimals).</summary>
    public static string Position(double latitude, double longitude, int decimals = 4)
    {
        var format = "0." + new string('#', decimals);
        return $"{Math.Abs(latitude).ToString(format, CultureInfo.InvariantCulture)}° {(latitude >= 0 ? "N" : "S")}, " +
            $"{Math.Abs(longitude).ToString(format, CultureInfo.InvariantCulture)}° {(longitude >= 0 ? "E" : "W")}";
    }
}
