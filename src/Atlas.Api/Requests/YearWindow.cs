namespace Atlas.Api.Requests;

/// <summary>
/// The from/to/months window of a point request: whole calendar years (UTC) from..to inclusive, and optionally a
/// set of calendar months (1..12). Parsing collects every fault with a message that says what to send instead.
/// </summary>
public sealed record YearWindow(int? FromYear, int? ToYear, IReadOnlyList<int>? Months)
{
    public static YearWindow? Parse(string? from, string? to, string? months, Dictionary<string, string[]> errors)
    {
        var fromYear = Year("from", from, errors);
        var toYear = Year("to", to, errors);
        if (fromYear is { } f && toYear is { } t && f > t)
            errors["to"] = [$"The window is reversed: from={f} is after to={t}; swap them."];
        IReadOnlyList<int>? monthList = null;
        if (months is not null)
        {
            var parsed = new SortedSet<int>();
            foreach (var part in months.Split(',', StringSplitOptions.TrimEntries))
            {
                if (!int.TryParse(part, NumberStyles.None, CultureInfo.InvariantCulture, out var m) || m is < 1 or > 12)
                {
                    errors["months"] = [$"'{part}' is not a month: give months as numbers 1..12 separated by commas, e.g. months=12,1,2."];
                    break;
                }
                parsed.Add(m);
            }
            if (parsed.Count == 0 && !errors.ContainsKey("months")) errors["months"] = ["months is empty: give months 1..12 separated by commas, or leave it out."];
            monthList = parsed.ToArray();
        }
        return errors.Count > 0 ? null : new YearWindow(fromYear, toYear, monthList);
    }

    public bool Includes(int year, int month) =>
        (FromYear is not { } f || year >= f) && (ToYear is not { } t || year <= t) && (Months is null || Months.Contains(month));

    private static int? Year(string name, string? text, Dictionary<string, string[]> errors)
    {
        if (text is null) return null;
        if (!int.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out var year) || year is < 1000 or > 9999)
        {
            errors[name] = [$"{name} '{text}' is not a year: give a four-digit calendar year, e.g. {name}=2019."];
            return null;
        }
        return year;
    }
}
