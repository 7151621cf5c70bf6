using System.Globalization;

namespace Atlas.Api.Tests.Reports;

/// <summary>A number a report prints, compared with the API's value at the printed precision.</summary>
public static class PrintedNumber
{
    /// <summary>The printed number equals the API's value within half a unit of its last decimal.</summary>
    public static void Equal(double api, string printed, int decimals)
    {
        var value = double.Parse(printed, NumberStyles.Float, CultureInfo.InvariantCulture);
        Assert.True(Math.Abs(value - api) <= 0.5 * Math.Pow(10, -decimals) + 1e-9, $"printed {printed}, the API says {api}");
    }
}
