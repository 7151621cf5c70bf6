using System.Text;
using System.Text.Json;
using System.Text.RegularExpressions;
using Atlas.Api.Model;
using Atlas.TestSupport;

namespace Atlas.Api.Tests.Support;

/// <summary>
/// Fetches a CSV answer of the API and checks that it opens as it is, with outside readers and no options: GDAL's CSV
/// driver (<c>ogrinfo</c>, gdal-bin) and pandas' <c>read_csv</c> with its defaults (python3-pandas). Then follows the
/// answer's <c>Link: rel="describedby"</c> header (RFC 8288) to its CSV on the Web metadata and checks that against the
/// W3C Recommendation "Metadata Vocabulary for Tabular Data" (17 December 2015): section 5.2 (<c>@context</c> is
/// http://www.w3.org/ns/csvw, alone or first of a pair), 5.3.1 (<c>url</c> is required and resolves to the table),
/// 5.5 and 5.6 (the schema's columns; a <c>name</c> is letters, digits, '_', '.' or %-escapes and does not start with
/// '_'; <c>datatype</c> a built-in name), and the compatibility rule of the companion "Model for Tabular Data and
/// Metadata on the Web" (section 5.5.1: each column's titles include the CSV's header text, in order). No CSVW
/// validator is packaged for Debian, pip or npm offline here, so these properties are checked directly.
/// </summary>
public static class CsvDownloadCheck
{
    public sealed record Checked(string Csv, string[] Header, int Rows, JsonElement Metadata, string MetadataUrl);

    // The built-in datatypes of the Recommendation (section 5.11.1) this project uses, and a few more for the check.
    private static readonly string[] BuiltInDatatypes = ["string", "integer", "double", "decimal", "number", "boolean", "dateTime", "date", "time", "float", "long", "int"];

    public static async Task<Checked> AssertAsync(HttpClient client, string url)
    {
        var response = await client.GetAsync(url);
        Assert.True(response.IsSuccessStatusCode, $"{url}: {(int)response.StatusCode} {await response.Content.ReadAsStringAsync()}");
        Assert.Equal("text/csv", response.Content.Headers.ContentType?.MediaType);
        var bytes = await response.Content.ReadAsByteArrayAsync();
        var text = Encoding.UTF8.GetString(bytes);
        var lines = text.Split("\r\n");
        Assert.Equal("", lines[^1]);  // RFC 4180: CRLF ends every record, the last one too
        Assert.DoesNotContain(lines, l => l.StartsWith('#'));
        var header = lines[0].Split(',');
        var rows = lines.Length - 2;

        // RFC 8288 link to the metadata, and the metadata's url back at the CSV.
        var link = response.Headers.GetValues("Link").Single(l => l.Contains("rel=\"describedby\"", StringComparison.Ordinal));
        Assert.Contains("type=\"application/csvm+json\"", link);
        var target = Regex.Match(link, "^<([^>]*)>").Groups[1].Value;
        var requestUri = new Uri(client.BaseAddress!, url);
        var metadataUri = new Uri(requestUri, target);
        var described = await client.GetAsync(metadataUri);
        Assert.True(described.IsSuccessStatusCode, $"{metadataUri}: {(int)described.StatusCode}");
        Assert.Equal("application/csvm+json", described.Content.Headers.ContentType?.MediaType);
        var metadata = JsonDocument.Parse(await described.Content.ReadAsStringAsync()).RootElement.Clone();

        var context = metadata.GetProperty("@context");
        Assert.Equal("http://www.w3.org/ns/csvw", context.ValueKind == JsonValueKind.Array ? context[0].GetString() : context.GetString());
        var tableUri = new Uri(metadataUri, metadata.GetProperty("url").GetString());
        Assert.Equal(bytes, await client.GetByteArrayAsync(tableUri));
        var columns = metadata.GetProperty("tableSchema").GetProperty("columns").EnumerateArray().ToArray();
        Assert.Equal(header, columns.Select(c => c.GetProperty("name").GetString()).ToArray());
        foreach (var column in columns)
        {
            var name = column.GetProperty("name").GetString()!;
            Assert.Matches("^(?!_)([A-Za-z0-9_.]|%[0-9A-Fa-f]{2})+$", name);
            var titles = column.GetProperty("titles");
            Assert.Equal(name, titles.ValueKind == JsonValueKind.Array ? titles[0].GetString() : titles.GetString());
            Assert.Contains(column.GetProperty("datatype").GetString(), BuiltInDatatypes);
        }
        var comments = metadata.GetProperty("rdfs:comment").EnumerateArray().Select(c => c.GetString()).ToArray();
        Assert.Contains(AtlasCaution.Text, comments);
        Assert.True(metadata.TryGetProperty("dc:provenance", out _));

        var path = ExternalTool.TempFile(".csv");
        try
        {
            await File.WriteAllBytesAsync(path, bytes);
            // GDAL's CSV driver, no open options: the first line is the header, every other line a feature.
            var info = ExternalTool.Run("ogrinfo", "-ro", "-al", "-so", path);
            Assert.Contains($"Feature Count: {rows}", info);
            var fields = Regex.Matches(info, @"^(\S+): (String|Integer|Integer64|Real|Date|DateTime|Time)\b", RegexOptions.Multiline).Select(m => m.Groups[1].Value).ToArray();
            Assert.Equal(header, fields);
            // pandas with its defaults.
            var read = ExternalTool.Run(ExternalTool.Python, "-c",
                "import json, sys, pandas\nf = pandas.read_csv(sys.argv[1])\nprint(json.dumps({'columns': [str(c) for c in f.columns], 'rows': len(f)}))", path);
            var frame = JsonDocument.Parse(read).RootElement;
            Assert.Equal(header, frame.GetProperty("columns").EnumerateArray().Select(c => c.GetString()).ToArray());
            Assert.Equal(rows, frame.GetProperty("rows").GetInt32());
        }
        finally { File.Delete(path); }
        return new Checked(text, header, rows, metadata, metadataUri.PathAndQuery);
    }

    /// <summary>The unit the metadata states for a column.</summary>
    public static string? Unit(JsonElement metadata, string column) =>
        metadata.GetProperty("tableSchema").GetProperty("columns").EnumerateArray().Single(c => c.GetProperty("name").GetString() == column)
            .TryGetProperty("schema:unitText", out var unit) ? unit.GetString() : null;

    /// <summary>The notes (rdfs:comment) and the provenance text of the metadata, in one string to search.</summary>
    public static string Notes(JsonElement metadata) =>
        string.Join("\n", metadata.GetProperty("rdfs:comment").EnumerateArray().Select(c => c.GetString())) + "\n" + metadata.GetProperty("dc:provenance").GetString();

    /// <summary>The names of the source files under prov:wasDerivedFrom.</summary>
    public static string[] SourceFiles(JsonElement metadata) =>
        metadata.GetProperty("prov:wasDerivedFrom").EnumerateArray().Select(f => f.GetProperty("schema:name").GetString()!).ToArray();

    /// <summary>The checksums of the source files under prov:wasDerivedFrom.</summary>
    public static string[] SourceChecksums(JsonElement metadata) =>
        metadata.GetProperty("prov:wasDerivedFrom").EnumerateArray().Select(f => f.GetProperty("schema:identifier").GetString()!).ToArray();
}
