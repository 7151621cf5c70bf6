namespace Atlas.Api.Requests;

/// <summary>
/// The one reader of numbers in query strings and form fields: invariant culture, finite values only, each fault
/// reported under the value's name with what to give instead.
/// </summary>
public static class QueryNumbers
{
    public static bool TryParse(string? text, out double value) =>
        double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out value) && double.IsFinite(value);

    /// <summary>
    /// The one reading of a numeric request value: null, with the error under <paramref name="name"/>, when it is
    /// missing but required, not a number, or outside [<paramref name="min"/>, <paramref name="max"/>] (above
    /// <paramref name="min"/> when <paramref name="aboveMin"/>); null without an error when it is missing and optional.
    /// </summary>
    /// <param name="meaning">What to give, as it reads after "give" (e.g. "the Hs limit in metres").</param>
    public static double? Read(string name, string? text, string meaning, Dictionary<string, string[]> errors, bool required,
        double min = double.MinValue, double max = double.MaxValue, bool aboveMin = false)
    {
        if (string.IsNullOrWhiteSpace(text))
        {
            if (required) errors[name] = [$"{name} is required: {meaning}."];
            return null;
        }
        if (!TryParse(text, out var value)) { errors[name] = [$"{name} '{text}' is not a number: give {meaning}, with a decimal point."]; return null; }
        if (aboveMin && value <= min) { errors[name] = [$"{name} {text} must be above {min.ToString(CultureInfo.InvariantCulture)}: give {meaning}."]; return null; }
        if (value < min && max == double.MaxValue)
        {
            errors[name] = [$"{name} {text} must be at or above {min.ToString(CultureInfo.InvariantCulture)}: give {meaning}."];
            return null;
        }
        if (value < min || value > max) { errors[name] = [$"{name} {text} is out of range: give {meaning}."]; return null; }
        return value;
    }
}
