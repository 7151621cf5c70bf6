using System.Text.Json;
using System.Text.Json.Serialization;

namespace Atlas.Vocabulary;

/// <summary>Writes an <see cref="AtlasPeriod"/> as its name ("jan", "djf", "annual", "y2019") and reads it back.</summary>
public sealed class AtlasPeriodJsonConverter : JsonConverter<AtlasPeriod>
{
    /// <inheritdoc/>
    public override AtlasPeriod Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options)
    {
        string? text = reader.TokenType == JsonTokenType.String ? reader.GetString() : null;
        if (!AtlasPeriod.TryParse(text, out AtlasPeriod period))
            throw new JsonException($"Expected a period name such as \"jan\", \"djf\", \"annual\" or \"y2019\", found {reader.TokenType} '{text}'.");
        return period;
    }

    /// <inheritdoc/>
    public override void Write(Utf8JsonWriter writer, AtlasPeriod value, JsonSerializerOptions options) => writer.WriteStringValue(value.Name);
}
