namespace Atlas.Api.Downloads;

/// <summary>
/// Writes the W3C CSV on the Web metadata of a CSV download (Metadata Vocabulary for Tabular Data, W3C
/// Recommendation 17 December 2015): a table description in JSON-LD with <c>@context</c> http://www.w3.org/ns/csvw,
/// the <c>url</c> of the CSV, the default dialect stated, and <c>tableSchema.columns</c> with each column's
/// <c>name</c> (the header text), <c>titles</c> (the header text first, so that a processor's header check passes,
/// then a readable title), <c>datatype</c>, its unit as <c>schema:unitText</c> and its meaning as
/// <c>dc:description</c>. What used to head the CSV as comment lines is here as common properties: the title and
/// description (<c>dc:</c>), the provenance as text (<c>dc:provenance</c>) and the source files with checksums
/// (<c>prov:wasDerivedFrom</c>), the caution and the notes (<c>rdfs:comment</c>, the caution first).
/// </summary>
public static class CsvwMetadataWriter
{
    /// <summary>The media type of CSVW metadata (registered with the Recommendation).</summary>
    public const string MediaType = "application/csvm+json";

    private static readonly JsonWriterOptions Indented = new() { Indented = true };

    public static byte[] Write(CsvTable table, string csvUrl)
    {
        var p = table.Provenance;
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer, Indented))
        {
            json.WriteStartObject();
            json.WriteStartArray("@context");
            json.WriteStringValue("http://www.w3.org/ns/csvw");
            json.WriteStartObject();
            json.WriteString("@language", "en");
            json.WriteEndObject();
            json.WriteEndArray();
            json.WriteString("url", csvUrl);
            json.WriteString("dc:title", table.Title);
            json.WriteString("dc:description", table.Description);
            json.WriteStartObject("dc:created");
            json.WriteString("@value", p.GeneratedAtUtc.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture));
            json.WriteString("@type", "xsd:dateTime");
            json.WriteEndObject();
            if (p.Licence is { } licence) json.WriteString("dc:license", licence);
            if (p.Citation is { } citation) json.WriteString("dc:bibliographicCitation", citation);
            json.WriteString("dc:provenance", ProvenanceText(p));
            json.WriteStartArray("prov:wasDerivedFrom");
            foreach (var file in p.SourceFiles)
            {
                json.WriteStartObject();
                json.WriteString("schema:name", file.Name);
                json.WriteString("schema:identifier", file.Checksum);
                json.WriteString("schema:temporalCoverage",
                    $"{file.TimeStartUtc.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture)}/{file.TimeEndUtc.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture)}");
                json.WriteEndObject();
            }
            json.WriteEndArray();
            json.WriteStartArray("rdfs:comment");
            json.WriteStringValue(p.Caution);
            foreach (var note in table.Notes ?? []) json.WriteStringValue(note);
            foreach (var warning in p.Warnings ?? []) json.WriteStringValue("Warning from the ingest: " + warning);
            json.WriteEndArray();
            // The defaults of the Recommendation, stated so that a reader need not know them.
            json.WriteStartObject("dialect");
            json.WriteBoolean("header", true);
            json.WriteString("delimiter", ",");
            json.WriteBoolean("doubleQuote", true);
            json.WriteString("encoding", "utf-8");
            json.WriteEndObject();
            json.WriteStartObject("tableSchema");
            json.WriteStartArray("columns");
            foreach (var column in table.Columns)
            {
                json.WriteStartObject();
                json.WriteString("name", column.Name);
                json.WriteStartArray("titles");
                json.WriteStringValue(column.Name);
                if (column.Title != column.Name) json.WriteStringValue(column.Title);
                json.WriteEndArray();
                json.WriteString("datatype", column.Datatype);
                if (column.Unit is { } unit) json.WriteString("schema:unitText", unit);
                if (column.Description is { } description) json.WriteString("dc:description", description);
                json.WriteEndObject();
            }
            json.WriteEndArray();
            json.WriteEndObject();
            json.WriteEndObject();
        }
        return buffer.ToArray();
    }

    /// <summary>The provenance in sentences: dataset, software, dates, method and what was assumed at ingest.</summary>
    public static string ProvenanceText(Provenance p) =>
        $"From dataset {p.Dataset} ({p.Title}), {p.SourceFiles.Count} source file{(p.SourceFiles.Count == 1 ? "" : "s")} " +
        "(named with their checksums, blake3: or sha256:, under prov:wasDerivedFrom), by " +
        $"{p.Software} {p.SoftwareVersion}; statistics computed {(p.StatisticsComputedAtUtc is { } t ? "at " + t.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture) : "not yet")}; " +
        $"this file generated at {p.GeneratedAtUtc.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture)}. Method: {p.MethodNotes} " +
        $"Assumed at ingest: {p.AssumptionsText()}.";
}
