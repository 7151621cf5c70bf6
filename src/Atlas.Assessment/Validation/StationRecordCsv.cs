using System.Globalization;

namespace Atlas.Assessment.Validation;

/// <summary>
/// Reads a station (buoy) record from comma-separated text.
/// </summary>
/// <remarks>
/// <para>Format:</para>
/// <list type="bullet">
/// <item>Blank lines and lines starting with <c>#</c> are comments, anywhere in the input.</item>
/// <item>The first other line is the header: column names, in any order, each at most once, from
/// <c>time</c> (required), <c>hs_m</c> (required), <c>tp_s</c>, <c>te_s</c>, <c>dir_deg</c>, <c>qc</c>.
/// Any other name is an error.</item>
/// <item><c>time</c>: ISO 8601 in UTC, <c>yyyy-MM-ddTHH:mm:ssZ</c> or <c>yyyy-MM-ddTHH:mmZ</c>
/// (a <c>+00:00</c> suffix instead of <c>Z</c> is accepted; any other offset, or none, is an error).</item>
/// <item><c>hs_m</c>: significant wave height in metres, a finite number at or above 0.</item>
/// <item><c>tp_s</c>, <c>te_s</c>: peak and energy period in seconds; empty or <c>NaN</c> means
/// not measured, otherwise a finite number above 0.</item>
/// <item><c>dir_deg</c>: mean direction the waves come from, degrees true; empty or <c>NaN</c> means
/// not measured, otherwise within [0, 360] (360 is stored as 0).</item>
/// <item><c>qc</c>: an integer quality flag; 0 is a good row, anything else is a row the station
/// rejected. Without the column every row is good. Flagged rows are kept (and counted) so that
/// matching can report them; on a flagged row the values need only be numbers, empty or NaN
/// (stations often write fill values there), but its time must still parse and keep the order.</item>
/// <item>Numbers use a point as decimal separator. Every row has as many fields as the header.</item>
/// <item>Times must strictly increase from row to row (or, with <see cref="RowOrder.AnyOrder"/>,
/// only be distinct); duplicate times are always errors.</item>
/// </list>
/// <para>All problems are collected and thrown together as one <see cref="CsvInputException"/>,
/// each with its line number. A header problem stops parsing at the header, since the rows cannot
/// be interpreted without it.</para>
/// </remarks>
public static class StationRecordCsv
{
    /// <summary>Column names the header may use.</summary>
    public static readonly IReadOnlyList<string> ColumnNames = ["time", "hs_m", "tp_s", "te_s", "dir_deg", "qc"];

    private static readonly string[] UtcTimeFormats = ["yyyy-MM-dd'T'HH:mm:ss'Z'", "yyyy-MM-dd'T'HH:mm'Z'"];
    private static readonly string[] OffsetTimeFormats = ["yyyy-MM-dd'T'HH:mm:sszzz", "yyyy-MM-dd'T'HH:mmzzz"];
    private static readonly string[] LocalTimeFormats = ["yyyy-MM-dd'T'HH:mm:ss", "yyyy-MM-dd'T'HH:mm"];

    /// <summary>Parses a station record.</summary>
    /// <param name="reader">The text; read to its end.</param>
    /// <param name="sourceName">Name used in error messages (typically the file name).</param>
    /// <param name="order">Whether rows must already be in time order.</param>
    /// <returns>The record with its observations sorted by time.</returns>
    /// <exception cref="CsvInputException">The header or any row is invalid; lists every problem.</exception>
    public static StationRecord Parse(TextReader reader, string sourceName, RowOrder order = RowOrder.StrictlyIncreasing)
    {
        ArgumentNullException.ThrowIfNull(reader);
        var lines = new CsvLineReader(reader);
        var errors = new List<CsvInputError>();

        if (!lines.TryReadRecord(out int headerLine, out string[] header))
            throw new CsvInputException(sourceName, [new CsvInputError(headerLine, null, "the input is empty: a header line is required")]);

        var columns = ReadHeader(headerLine, header, errors);
        if (errors.Count > 0)
            throw new CsvInputException(sourceName, errors);

        var observations = new List<StationObservation>();
        while (lines.TryReadRecord(out int lineNumber, out string[] fields))
        {
            if (fields.Length != header.Length)
            {
                errors.Add(new CsvInputError(lineNumber, null, $"has {fields.Length} fields but the header has {header.Length}"));
                continue;
            }
            if (ReadRow(lineNumber, fields, columns, errors) is { } observation)
                observations.Add(observation);
        }

        CheckTimes(observations, order, errors);
        if (errors.Count > 0)
            throw new CsvInputException(sourceName, [.. errors.OrderBy(e => e.LineNumber)]);

        return new StationRecord(
            sourceName,
            [.. observations.OrderBy(o => o.TimeUnixSeconds)],
            columns.Tp >= 0, columns.Te >= 0, columns.Direction >= 0);
    }

    private sealed record ColumnIndexes(int Time, int Hs, int Tp, int Te, int Direction, int Quality);

    private static ColumnIndexes ReadHeader(int lineNumber, string[] header, List<CsvInputError> errors)
    {
        var positions = new Dictionary<string, int>(StringComparer.Ordinal);
        for (int i = 0; i < header.Length; i++)
        {
            string name = header[i];
            if (!ColumnNames.Contains(name))
                errors.Add(new CsvInputError(lineNumber, i + 1,
                    $"unknown column '{name}' in the header; expected names from {string.Join(", ", ColumnNames)}"));
            else if (!positions.TryAdd(name, i))
                errors.Add(new CsvInputError(lineNumber, i + 1, $"column '{name}' appears twice in the header"));
        }
        foreach (string required in new[] { "time", "hs_m" })
            if (!positions.ContainsKey(required))
                errors.Add(new CsvInputError(lineNumber, null, $"the header lacks the required column '{required}'"));

        int Find(string name) => positions.TryGetValue(name, out int index) ? index : -1;
        return new ColumnIndexes(Find("time"), Find("hs_m"), Find("tp_s"), Find("te_s"), Find("dir_deg"), Find("qc"));
    }

    private static StationObservation? ReadRow(int lineNumber, string[] fields, ColumnIndexes columns, List<CsvInputError> errors)
    {
        int errorsBefore = errors.Count;

        long time = 0;
        string timeText = fields[columns.Time];
        if (!TryParseUtcTime(timeText, out time, out string? timeProblem))
            errors.Add(new CsvInputError(lineNumber, columns.Time + 1, $"time '{timeText}' {timeProblem}"));

        int quality = 0;
        if (columns.Quality >= 0)
        {
            string qualityText = fields[columns.Quality];
            if (!int.TryParse(qualityText, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out quality))
                errors.Add(new CsvInputError(lineNumber, columns.Quality + 1, $"qc '{qualityText}' is not an integer quality flag"));
        }
        bool flagged = quality != 0;

        double hs = ReadNumber(lineNumber, fields, columns.Hs, "hs_m", flagged, allowMissing: false, errors,
            value => value >= 0 ? null : "is negative; Hs must be at or above 0 m");
        double tp = ReadNumber(lineNumber, fields, columns.Tp, "tp_s", flagged, allowMissing: true, errors,
            value => value > 0 ? null : "must be above 0 s");
        double te = ReadNumber(lineNumber, fields, columns.Te, "te_s", flagged, allowMissing: true, errors,
            value => value > 0 ? null : "must be above 0 s");
        double direction = ReadNumber(lineNumber, fields, columns.Direction, "dir_deg", flagged, allowMissing: true, errors,
            value => value is >= 0 and <= 360 ? null : "is outside 0..360 degrees");
        if (direction == 360)
            direction = 0;

        if (errors.Count > errorsBefore)
            return null;
        return new StationObservation(time, hs, tp, te, direction, quality, lineNumber);
    }

    /// <summary>
    /// Reads one numeric field. Returns NaN for an absent column. A missing value (empty or NaN) is
    /// an error only where <paramref name="allowMissing"/> is false on a good row; range checks
    /// apply only on good rows.
    /// </summary>
    private static double ReadNumber(
        int lineNumber, string[] fields, int column, string name, bool flagged, bool allowMissing,
        List<CsvInputError> errors, Func<double, string?> rangeProblem)
    {
        if (column < 0)
            return double.NaN;
        string text = fields[column];
        double value;
        if (text.Length == 0)
            value = double.NaN;
        else if (!CsvLineReader.TryParseNumber(text, out value))
        {
            errors.Add(new CsvInputError(lineNumber, column + 1, $"{name} '{text}' is not a number"));
            return double.NaN;
        }

        if (flagged)
            return value;
        if (double.IsNaN(value))
        {
            if (!allowMissing)
                errors.Add(new CsvInputError(lineNumber, column + 1,
                    $"{name} is {(text.Length == 0 ? "empty" : "NaN")}; a good row (qc 0) needs a value — flag the row instead"));
            return value;
        }
        if (double.IsInfinity(value))
        {
            errors.Add(new CsvInputError(lineNumber, column + 1, $"{name} '{text}' is not finite"));
            return double.NaN;
        }
        if (rangeProblem(value) is { } problem)
            errors.Add(new CsvInputError(lineNumber, column + 1, $"{name} {text} {problem}"));
        return value;
    }

    private static bool TryParseUtcTime(string text, out long unixSeconds, out string? problem)
    {
        unixSeconds = 0;
        problem = null;
        var invariant = CultureInfo.InvariantCulture;
        if (DateTimeOffset.TryParseExact(text, UtcTimeFormats, invariant, DateTimeStyles.AssumeUniversal, out var utc))
        {
            unixSeconds = utc.ToUnixTimeSeconds();
            return true;
        }
        if (DateTimeOffset.TryParseExact(text, OffsetTimeFormats, invariant, DateTimeStyles.None, out var withOffset))
        {
            if (withOffset.Offset == TimeSpan.Zero)
            {
                unixSeconds = withOffset.ToUnixTimeSeconds();
                return true;
            }
            string sign = withOffset.Offset < TimeSpan.Zero ? "-" : "+";
            problem = $"has offset {sign}{withOffset.Offset:hh\\:mm}; station times must be UTC (suffix Z)";
            return false;
        }
        problem = DateTime.TryParseExact(text, LocalTimeFormats, invariant, DateTimeStyles.None, out _)
            ? "has no UTC designator; write it as 2021-01-01T03:00:00Z"
            : "is not an ISO 8601 UTC time such as 2021-01-01T03:00:00Z";
        return false;
    }

    private static void CheckTimes(List<StationObservation> observations, RowOrder order, List<CsvInputError> errors)
    {
        if (order == RowOrder.StrictlyIncreasing)
        {
            for (int i = 1; i < observations.Count; i++)
            {
                var previous = observations[i - 1];
                var current = observations[i];
                if (current.TimeUnixSeconds == previous.TimeUnixSeconds)
                    errors.Add(new CsvInputError(current.LineNumber, null,
                        $"duplicate time {FormatTime(current.TimeUnixSeconds)}, already on line {previous.LineNumber}"));
                else if (current.TimeUnixSeconds < previous.TimeUnixSeconds)
                    errors.Add(new CsvInputError(current.LineNumber, null,
                        $"time {FormatTime(current.TimeUnixSeconds)} is not after the previous row's {FormatTime(previous.TimeUnixSeconds)} (line {previous.LineNumber}); times must increase"));
            }
            return;
        }

        var firstLineOfTime = new Dictionary<long, int>();
        foreach (var observation in observations)
            if (!firstLineOfTime.TryAdd(observation.TimeUnixSeconds, observation.LineNumber))
                errors.Add(new CsvInputError(observation.LineNumber, null,
                    $"duplicate time {FormatTime(observation.TimeUnixSeconds)}, already on line {firstLineOfTime[observation.TimeUnixSeconds]}"));
    }

    private static string FormatTime(long unixSeconds) =>
        DateTimeOffset.FromUnixTimeSeconds(unixSeconds).UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture);
}
