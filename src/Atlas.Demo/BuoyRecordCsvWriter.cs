using System.Globalization;
using System.Text;

namespace Atlas.Demo;

/// <summary>
/// Writes a buoy record as CSV with the header <c>time,hs_m,tp_s,te_s,dir_deg,qc</c>: times as
/// ISO 8601 UTC (<c>2021-01-01T00:00:00Z</c>), heights and periods with two decimals, directions
/// with one; values a dropout did not deliver are left empty. UTF-8 without byte-order mark,
/// LF line ends.
/// </summary>
public static class BuoyRecordCsvWriter
{
    /// <summary>The header line.</summary>
    public const string Header = "time,hs_m,tp_s,te_s,dir_deg,qc";

    /// <summary>Writes <paramref name="rows"/> to <paramref name="path"/>, replacing any file there.</summary>
    public static void Write(string path, IEnumerable<BuoyObservation> rows)
    {
        ArgumentNullException.ThrowIfNull(rows);
        using var writer = new StreamWriter(path, append: false, new UTF8Encoding(false));
        writer.NewLine = "\n";
        Write(writer, rows);
    }

    /// <summary>Writes <paramref name="rows"/> to <paramref name="writer"/>.</summary>
    public static void Write(TextWriter writer, IEnumerable<BuoyObservation> rows)
    {
        ArgumentNullException.ThrowIfNull(writer);
        ArgumentNullException.ThrowIfNull(rows);
        var invariant = CultureInfo.InvariantCulture;
        writer.WriteLine(Header);
        foreach (var row in rows)
        {
            writer.Write(row.Time.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", invariant));
            writer.Write(',');
            writer.Write(Format(row.Hs, "F2"));
            writer.Write(',');
            writer.Write(Format(row.Tp, "F2"));
            writer.Write(',');
            writer.Write(Format(row.Te, "F2"));
            writer.Write(',');
            writer.Write(Format(row.FromDegrees, "F1"));
            writer.Write(',');
            writer.WriteLine(row.Quality.ToString(invariant));
        }
    }

    private static string Format(double value, string format) =>
        double.IsNaN(value) ? "" : value.ToString(format, CultureInfo.InvariantCulture);
}
