using CsvHelper;
using CsvHelper.Configuration;

namespace Atlas.Api.Downloads;

/// <summary>
/// A CSV download as it is described: what the rows are, the columns, the provenance and notes (method, units,
/// assumptions). The CSV itself is plain RFC 4180 (one header row, then the rows, no comment lines), written by
/// CsvHelper; everything else goes to its W3C CSV on the Web metadata (<see cref="CsvwMetadataWriter"/>).
/// </summary>
public sealed record CsvTable(string Title, string Description, IReadOnlyList<CsvColumn> Columns, Provenance Provenance, IReadOnlyList<string>? Notes = null)
{
    public const string ContentType = "text/csv; charset=utf-8";

    /// <summary>The CSV in memory: the header, then the rows <paramref name="rows"/> writes.</summary>
    public byte[] ToBytes(Action<CsvTableWriter> rows)
    {
        using var buffer = new MemoryStream();
        using (var writer = CsvTableWriter.Open(buffer, this))
        {
            rows(writer);
        }
        return buffer.ToArray();
    }
}

/// <summary>
/// Writes the rows of a <see cref="CsvTable"/>: fields in column order, numbers in the invariant culture, a missing
/// value as an empty field. A row with more or fewer fields than the table has columns is a programming error and throws.
/// </summary>
public sealed class CsvTableWriter : IDisposable, IAsyncDisposable
{
    private static readonly CsvConfiguration Configuration = new(CultureInfo.InvariantCulture) { NewLine = "\r\n" };
    private readonly StreamWriter _text;
    private readonly CsvWriter _csv;
    private readonly int _columns;
    private int _field;

    private CsvTableWriter(Stream stream, CsvTable table)
    {
        _text = new StreamWriter(stream, new UTF8Encoding(false), 64 * 1024, leaveOpen: true);
        _csv = new CsvWriter(_text, Configuration);
        _columns = table.Columns.Count;
        foreach (var column in table.Columns) _csv.WriteField(column.Name);
        _csv.NextRecord();
    }

    /// <summary>Starts the CSV on <paramref name="stream"/> with the header row.</summary>
    public static CsvTableWriter Open(Stream stream, CsvTable table) => new(stream, table);

    public CsvTableWriter Text(string? value) => Field(value);

    public CsvTableWriter Integer(long? value) => Field(value?.ToString(CultureInfo.InvariantCulture));

    /// <summary>A number in <paramref name="format"/> (round-trip by default); NaN, infinities and null give an empty field.</summary>
    public CsvTableWriter Number(double? value, string format = "R") =>
        Field(value is { } v && double.IsFinite(v) ? v.ToString(format, CultureInfo.InvariantCulture) : null);

    /// <inheritdoc cref="Number(double?, string)"/>
    public CsvTableWriter Number(float value, string format) =>
        Field(float.IsFinite(value) ? value.ToString(format, CultureInfo.InvariantCulture) : null);

    public CsvTableWriter Boolean(bool value) => Field(value ? "true" : "false");

    /// <summary>A UTC time as ISO 8601 with a Z (the XSD dateTime form).</summary>
    public CsvTableWriter Time(DateTime utc) => Field(utc.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture));

    public void EndRow()
    {
        CheckRow();
        _csv.NextRecord();
    }

    public async Task EndRowAsync(CancellationToken cancel)
    {
        CheckRow();
        await _csv.NextRecordAsync();
        cancel.ThrowIfCancellationRequested();
    }

    private CsvTableWriter Field(string? value)
    {
        _csv.WriteField(value ?? "");
        _field++;
        return this;
    }

    private void CheckRow()
    {
        if (_field != _columns) throw new InvalidOperationException($"A CSV row has {_field} fields; the table has {_columns} columns.");
        _field = 0;
    }

    public void Dispose()
    {
        _csv.Flush();
        _csv.Dispose();
        _text.Dispose();
    }

    public async ValueTask DisposeAsync()
    {
        await _csv.FlushAsync();
        await _csv.DisposeAsync();
        await _text.DisposeAsync();
    }
}
