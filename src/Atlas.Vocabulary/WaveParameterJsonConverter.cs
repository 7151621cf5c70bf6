using System.Text.Json;
using System.Text.Json.Serialization;

namespace Atlas.Vocabulary;

/// <summary>Writes a <see cref="WaveParameter"/> as its trade symbol ("hs", "j", ...) and reads it back.</summary>
public sealed class WaveParameterJsonConverter : JsonConverter<WaveParameter>
{
    /// <inheritdoc/>
    public override WaveParameter Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options)
    {
        string? text = reader.TokenType == JsonTokenType.String ? reader.GetString() : null;
        if (!WaveParameterNames.TryParse(text, out WaveParameter parameter))
            throw new JsonException($"Expected a wave parameter symbol such as \"hs\" or \"j\", found {reader.TokenType} '{text}'.");
        return parameter;
    }

    /// <inheritdoc/>
    public override void Write(Utf8JsonWriter writer, WaveParameter value, JsonSerializerOptions options) => writer.WriteStringValue(value.Symbol());
}
