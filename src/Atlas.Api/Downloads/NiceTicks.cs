namespace Atlas.Api.Downloads;

/// <summary>Round tick values (1, 2 or 5 times a power of ten apart) for axes, colour bars and scale bars.</summary>
public static class NiceTicks
{
    /// <summary>About <paramref name="target"/> ticks covering [min, max]; empty when the range is not finite.</summary>
    public static double[] Between(double min, double max, int target)
    {
        if (!double.IsFinite(min) || !double.IsFinite(max)) return [];
        if (max <= min) return [min];
        var step = Round((max - min) / Math.Max(1, target));
        var first = Math.Ceiling(min / step - 1e-9) * step;
        var ticks = new List<double>();
        for (var v = first; v <= max + step * 1e-9; v += step) ticks.Add(Math.Abs(v) < step * 1e-9 ? 0 : v);
        return ticks.ToArray();
    }

    /// <summary>The largest of 1, 2, 5 times a power of ten not above <paramref name="value"/> (which must be positive).</summary>
    public static double Round(double value)
    {
        var power = Math.Pow(10, Math.Floor(Math.Log10(value)));
        var mantissa = value / power;
        return (mantissa >= 5 ? 5 : mantissa >= 2 ? 2 : 1) * power;
    }
}
