using System.Globalization;

namespace Atlas.Api.Infrastructure;

/// <summary>Parses numbers from query strings: invariant culture, finite values only.</summary>
public static class QueryNumbers
{
    public static bool TryParse(string? text, out double value) =>
        double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out value) && double.IsFinite(value);
}
