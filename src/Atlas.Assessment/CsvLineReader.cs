using System.Globalization;

namespace Atlas.Assessment;

/// <summary>
/// Splits a plain comma-separated input into trimmed fields, line by line. Blank lines and lines
/// whose first non-blank character is '#' are comments and are skipped. Quoting is not supported:
/// the formats read with it hold only names and numbers.
/// </summary>
internal sealed class CsvLineReader(TextReader reader)
{
    private int _lineNumber;

    /// <summary>Reads the next non-comment line; false at the end of the input.</summary>
    public bool TryReadRecord(out int lineNumber, out string[] fields)
    {
        while (reader.ReadLine() is { } line)
        {
            _lineNumber++;
            var trimmed = line.AsSpan().Trim();
            if (trimmed.IsEmpty || trimmed[0] == '#')
                continue;
            lineNumber = _lineNumber;
            fields = line.Split(',');
            for (int i = 0; i < fields.Length; i++)
                fields[i] = fields[i].Trim();
            return true;
        }
        lineNumber = _lineNumber;
        fields = [];
        return false;
    }

    /// <summary>Parses a number written in the invariant culture ("1.5", "2e-3", "NaN").</summary>
    public static bool TryParseNumber(string text, out double value) =>
        double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out value);
}
