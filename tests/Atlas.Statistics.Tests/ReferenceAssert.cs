using System.Text.Json.Nodes;

namespace Atlas.Statistics.Tests;

/// <summary>Comparisons of project results with the JSON of reference_statistics.py.</summary>
internal static class ReferenceAssert
{
    public static double Number(JsonNode? node) => node is null ? double.NaN : node.GetValue<double>();

    /// <summary>
    /// Count, coverage exactly; mean relative to <paramref name="meanTolerance"/> (of the mean, plus 1e-12 absolute);
    /// sd to 10 x that; min and max to <paramref name="extremeTolerance"/> (relative); percentiles to
    /// <paramref name="percentileTolerance"/> absolute (a bin width for histogram percentiles).
    /// </summary>
    public static void Summary(JsonNode? expected, SummaryStatistics actual, string context,
        double meanTolerance, double extremeTolerance, double percentileTolerance)
    {
        if (expected is null)
        {
            Assert.True(actual.Count == 0 && double.IsNaN(actual.Mean), $"{context}: expected an absent parameter, got count {actual.Count}");
            return;
        }
        long count = expected["count"]!.GetValue<long>();
        Assert.True(count == actual.Count, $"{context}: count {actual.Count}, NumPy {count}");
        Assert.True(Math.Abs(Number(expected["coverage"]) - actual.Coverage) < 1e-15, $"{context}: coverage {actual.Coverage}, NumPy {Number(expected["coverage"])}");
        if (count == 0)
        {
            Assert.True(double.IsNaN(actual.Mean) && double.IsNaN(actual.P90), $"{context}: no valid step must give NaN");
            return;
        }
        Close(Number(expected["mean"]), actual.Mean, meanTolerance, $"{context} mean");
        Close(Number(expected["sd"]), actual.Sd, 10 * meanTolerance, $"{context} sd");
        Close(Number(expected["min"]), actual.Min, extremeTolerance, $"{context} min");
        Close(Number(expected["max"]), actual.Max, extremeTolerance, $"{context} max");
        foreach (var (name, value) in new[] { ("p10", actual.P10), ("p50", actual.P50), ("p90", actual.P90), ("p99", actual.P99) })
        {
            double reference = Number(expected[name]);
            Assert.True(Math.Abs(reference - value) <= percentileTolerance,
                $"{context} {name}: {value:R}, NumPy {reference:R}, difference {Math.Abs(reference - value):E3} above {percentileTolerance:E3}");
        }
    }

    public static void Close(double expected, double actual, double relativeTolerance, string context)
    {
        double allowed = relativeTolerance * Math.Abs(expected) + 1e-12;
        Assert.True(Math.Abs(expected - actual) <= allowed,
            $"{context}: {actual:R}, reference {expected:R}, difference {Math.Abs(expected - actual):E3} above {allowed:E3}");
    }
}
