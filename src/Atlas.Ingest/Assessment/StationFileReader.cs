using System.Security.Cryptography;
using Atlas.Assessment;
using Atlas.Assessment.Validation;
using Atlas.Hindcast.Stations;
using Atlas.Storage.Stations;

namespace Atlas.Ingest.Assessment;

/// <summary>
/// Reads a station record file: comma-separated text in the layout of <see cref="StationRecordCsv"/>, or a CF-NetCDF
/// point time series (see <see cref="StationNetCdfReader"/>), told apart by the file's first bytes. Every problem is
/// reported at once (<see cref="CsvInputException"/> with line numbers, <see cref="StationFileException"/> with
/// variable and index), and nothing is returned unless the whole record is good.
/// </summary>
public static class StationFileReader
{
    /// <summary>Reads the record file at <paramref name="path"/>.</summary>
    public static StationFileContent Read(string path)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        if (!File.Exists(path)) throw new FileNotFoundException($"{path}: no such file", path);
        var bytes = File.ReadAllBytes(path);
        var sha256 = Convert.ToHexStringLower(SHA256.HashData(bytes));
        var name = Path.GetFileName(path);
        return IsNetCdf(bytes) ? FromNetCdf(StationNetCdfReader.Read(path), sha256) : FromCsv(bytes, name, sha256);
    }

    /// <summary>Reads a record file's bytes (an upload), in either format, with the same checks as a file on disk.</summary>
    public static StationFileContent Read(byte[] bytes, string sourceName)
    {
        ArgumentNullException.ThrowIfNull(bytes);
        var sha256 = Convert.ToHexStringLower(SHA256.HashData(bytes));
        if (!IsNetCdf(bytes)) return FromCsv(bytes, sourceName, sha256);
        // netCDF-C opens files, not memory: the bytes go to a private temporary file for the read, deleted after.
        var temporary = Path.Combine(Path.GetTempPath(), $"atlas-station-{Guid.NewGuid():N}.nc");
        try
        {
            File.WriteAllBytes(temporary, bytes);
            return FromNetCdf(StationNetCdfReader.Read(temporary, sourceName), sha256);
        }
        finally
        {
            File.Delete(temporary);
        }
    }

    /// <summary>The rows of a decoded CF point time series; NaN where a variable is absent.</summary>
    public static StationFileContent FromNetCdf(StationTimeSeries series, string sha256)
    {
        ArgumentNullException.ThrowIfNull(series);
        var rows = new StationObservationRow[series.TimesUnixSeconds.Length];
        for (int i = 0; i < rows.Length; i++)
            rows[i] = new StationObservationRow(series.TimesUnixSeconds[i], series.Hs[i], series.Tp?[i] ?? float.NaN, series.Te?[i] ?? float.NaN,
                series.Dir?[i] ?? float.NaN, series.Qc[i]);
        return new StationFileContent(series.SourceFile, "netcdf", sha256, rows, series.Tp is not null, series.Te is not null, series.Dir is not null,
            series.Latitude, series.Longitude, rows.Count(r => float.IsNaN(r.Hs)));
    }

    /// <summary>Parses CSV bytes (UTF-8, with or without a byte-order mark).</summary>
    public static StationFileContent FromCsv(byte[] bytes, string sourceName, string sha256)
    {
        using var reader = new StreamReader(new MemoryStream(bytes), detectEncodingFromByteOrderMarks: true);
        var record = StationRecordCsv.Parse(reader, sourceName);
        var errors = record.Observations
            .Where(o => o.QualityFlag is < short.MinValue or > short.MaxValue)
            .Select(o => new CsvInputError(o.LineNumber, null, $"qc {o.QualityFlag} is outside the stored range {short.MinValue}..{short.MaxValue}"))
            .ToList();
        if (errors.Count > 0) throw new CsvInputException(sourceName, errors);
        var rows = record.Observations
            .Select(o => new StationObservationRow(o.TimeUnixSeconds, (float)o.HsMetres, (float)o.TpSeconds, (float)o.TeSeconds,
                (float)o.DirectionFromDegrees, (short)o.QualityFlag))
            .ToArray();
        return new StationFileContent(sourceName, "csv", sha256, rows, record.HasTp, record.HasTe, record.HasDirection, null, null,
            rows.Count(r => float.IsNaN(r.Hs)));
    }

    /// <summary>True for the signatures of classic (CDF 1, 2, 5) and HDF5-based NetCDF files.</summary>
    public static bool IsNetCdf(ReadOnlySpan<byte> head) =>
        (head.Length >= 4 && head[0] == 'C' && head[1] == 'D' && head[2] == 'F' && head[3] is 1 or 2 or 5)
        || head.StartsWith(Hdf5Signature);

    private static ReadOnlySpan<byte> Hdf5Signature => [0x89, (byte)'H', (byte)'D', (byte)'F', (byte)'\r', (byte)'\n', 0x1a, (byte)'\n'];
}
