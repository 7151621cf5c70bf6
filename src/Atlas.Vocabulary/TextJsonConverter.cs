using System.Text.Json;
using System.Text.Json.Serialization;

namespace Atlas.Vocabulary;

/// <summary>Writes a value of the vocabulary as its name and reads it back; anything else is a JSON error saying what was expected.</summary>
public abstract class TextJsonConverter<T> : JsonConverter<T>
{
    /// <summary>What the error says was expected, e.g. <c>a period name such as "jan"</c>.</summary>
    protected abstract string Expected { get; }

    /// <summary>Parses a name; false for anything else, including null.</summary>
    protected abstract bool TryParse(string? text, out T value);

    /// <summary>The name written.</summary>
    protected abstract string Format(T value);

    /// <inheritdoc/>
    public override T Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options)
    {
        string? text = reader.TokenType == JsonTokenType.String ? reader.GetString() : null;
        return TryParse(text, out T value) ? value : throw new JsonException($"Expected {Expected}, found {reader.TokenType} '{text}'.");
    }

    /// <inheritdoc/>
    public override void Write(Utf8JsonWriter writer, T value, JsonSerializerOptions options) => writer.WriteStringValue(Format(value));
}
