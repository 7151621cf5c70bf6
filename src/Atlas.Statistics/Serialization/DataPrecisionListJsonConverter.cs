using System.Text.Json;
using System.Text.Json.Serialization;

namespace Atlas.Statistics.Serialization;

/// <summary>
/// A list of fractions or statistics of single-precision data, each written like <see cref="DataPrecisionJsonConverter"/>
/// (to the data's significant digits; null for a missing value).
/// </summary>
public sealed class DataPrecisionListJsonConverter : JsonConverter<IReadOnlyList<double>>
{
    private static readonly DataPrecisionJsonConverter Element = new();

    /// <inheritdoc/>
    public override IReadOnlyList<double> Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options)
    {
        if (reader.TokenType != JsonTokenType.StartArray) throw new JsonException("Expected an array of numbers.");
        var values = new List<double>();
        while (reader.Read() && reader.TokenType != JsonTokenType.EndArray)
            values.Add(Element.Read(ref reader, typeof(double), options));
        return values;
    }

    /// <inheritdoc/>
    public override void Write(Utf8JsonWriter writer, IReadOnlyList<double> value, JsonSerializerOptions options)
    {
        writer.WriteStartArray();
        foreach (var v in value) Element.Write(writer, v, options);
        writer.WriteEndArray();
    }
}
