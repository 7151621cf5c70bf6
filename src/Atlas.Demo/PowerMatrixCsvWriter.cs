using System.Globalization;
using System.Text;

namespace Atlas.Demo;

/// <summary>
/// Writes a power matrix as CSV: the first cell is <c>hs_m\te_s</c>, the rest of the first row the
/// Te bin centres (s), the first column the Hs bin centres (m), the body power in whole kW.
/// UTF-8 without byte-order mark, LF line ends.
/// </summary>
public static class PowerMatrixCsvWriter
{
    /// <summary>The corner cell naming both axes.</summary>
    public const string Corner = "hs_m\\te_s";

    /// <summary>Writes <paramref name="matrix"/> to <paramref name="path"/>, replacing any file there.</summary>
    public static void Write(string path, DevicePowerMatrix matrix)
    {
        ArgumentNullException.ThrowIfNull(matrix);
        using var writer = new StreamWriter(path, append: false, new UTF8Encoding(false));
        writer.NewLine = "\n";
        Write(writer, matrix);
    }

    /// <summary>Writes <paramref name="matrix"/> to <paramref name="writer"/>.</summary>
    public static void Write(TextWriter writer, DevicePowerMatrix matrix)
    {
        ArgumentNullException.ThrowIfNull(writer);
        ArgumentNullException.ThrowIfNull(matrix);
        var invariant = CultureInfo.InvariantCulture;
        writer.Write(Corner);
        foreach (double te in matrix.TeCentres) writer.Write("," + te.ToString("0.0##", invariant));
        writer.WriteLine();
        for (int i = 0; i < matrix.HsCentres.Length; i++)
        {
            writer.Write(matrix.HsCentres[i].ToString("0.0##", invariant));
            for (int j = 0; j < matrix.TeCentres.Length; j++)
                writer.Write("," + matrix.Kilowatts[i, j].ToString("F0", invariant));
            writer.WriteLine();
        }
    }
}
