namespace Atlas.Api.Downloads;

/// <summary>
/// What a layer figure carries beside the picture: its short caption (printed under the map) and its full provenance
/// (source files with checksums, software, dates, method notes, what was assumed at ingest, the caution), which goes
/// into the file's own metadata (PNG text chunks, SVG metadata) and into the sidecar JSON download, never under the map.
/// </summary>
public sealed record FigureProvenance(string Title, string Caption, IReadOnlyList<KeyValuePair<string, string>> Items, Provenance Provenance)
{
    public static FigureProvenance Of(LayerData data, string colourScale)
    {
        var p = data.Provenance;
        var request = data.Request;
        var caption =
            $"Dataset: {p.Title} ({p.Dataset}). Parameter: {ParameterCatalogue.LongName(request.Parameter)} ({request.Parameter.Symbol()}); " +
            $"statistic: {ParameterCatalogue.StatisticLongName(request.Statistic)}; period: {request.Period.Name}; units: {data.Units}. " +
            $"{p.Caution} Provenance: see metadata.";
        List<KeyValuePair<string, string>> items =
        [
            new("Title", data.Title),
            new("Description", caption),
            new("Source", p.SourceFilesText()),
            new("Software", $"{p.Software} {p.SoftwareVersion}"),
            new("Creation Time", p.GeneratedAtUtc.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture)),
            new("Disclaimer", p.Caution),
            new("Comment", CsvwMetadataWriter.ProvenanceText(p)),
            new("Colour scale", colourScale),
        ];
        if (p.Licence is { } licence) items.Add(new("Copyright", licence));
        if (p.Citation is { } citation) items.Add(new("Citation", citation));
        return new FigureProvenance(data.Title, caption, items, p);
    }

    /// <summary>The sidecar JSON: the title, caption, the items of the file metadata and the provenance record.</summary>
    public byte[] SidecarJson(JsonSerializerOptions options)
    {
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer, new JsonWriterOptions { Indented = true }))
        {
            json.WriteStartObject();
            json.WriteString("title", Title);
            json.WriteString("caption", Caption);
            json.WriteStartObject("metadata");
            foreach (var (key, value) in Items) json.WriteString(key, value);
            json.WriteEndObject();
            json.WritePropertyName("provenance");
            JsonSerializer.Serialize(json, Provenance, options);
            json.WriteEndObject();
        }
        return buffer.ToArray();
    }
}
