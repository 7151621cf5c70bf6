using System.Text.Json;
using System.Text.Json.Serialization;

namespace Atlas.Statistics;

/// <summary>
/// Writes a missing value (NaN, or an infinity) as JSON null and reads null back as NaN, so that result records
/// keep the NaN-for-missing convention in memory and still serialise to valid JSON.
/// </summary>
public sealed class NaNAsNullJsonConverter : JsonConverter<double>
{
    /// <inheritdoc/>
    public override bool HandleNull => true;

    /// <inheritdoc/>
    public override double Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options) =>
        reader.TokenType == JsonTokenType.Null ? double.NaN : reader.GetDouble();

    /// <inheritdoc/>
    public override void Write(Utf8JsonWriter writer, double value, JsonSerializerOptions options)
    {
        if (double.IsFinite(value)) writer.WriteNumberValue(value);
        else writer.WriteNullValue();
    }
}
