using System.Globalization;
using System.Text.Json;
using System.Text.Json.Serialization;

namespace Atlas.Statistics.Serialization;

/// <summary>
/// Writes a statistic of single-precision data to <see cref="SignificantDigits"/> significant digits, the nominal
/// precision of that data (3.781118, not 3.7811184595989924, and 1.023 for a stored 1.023f rather than its double
/// expansion 1.0230000019073486): further digits are the arithmetic's, not the hindcast's, and would only swell an
/// answer. A missing value (NaN, or an infinity) is written as JSON null and null reads back as NaN, so result records
/// keep the NaN-for-missing convention in memory and still serialise to valid JSON.
/// </summary>
public sealed class DataPrecisionJsonConverter : JsonConverter<double>
{
    /// <summary>Significant digits written: about what a 32-bit float holds (common practice for float data).</summary>
    public const int SignificantDigits = 7;

    /// <summary>The value rounded to <see cref="SignificantDigits"/> significant digits (decimal rounding; NaN stays NaN).</summary>
    public static double Round(double value) =>
        double.IsFinite(value) ? double.Parse(value.ToString("G7", CultureInfo.InvariantCulture), CultureInfo.InvariantCulture) : value;

    /// <inheritdoc/>
    public override bool HandleNull => true;

    /// <inheritdoc/>
    public override double Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options) =>
        reader.TokenType == JsonTokenType.Null ? double.NaN : reader.GetDouble();

    /// <inheritdoc/>
    public override void Write(Utf8JsonWriter writer, double value, JsonSerializerOptions options)
    {
        if (!double.IsFinite(value)) writer.WriteNullValue();
        else if (TryFormatPlain(value, stackalloc byte[32], out var digits)) writer.WriteRawValue(digits, skipInputValidation: true);
        else writer.WriteNumberValue(Round(value));
    }

    /// <summary>
    /// The value's seven significant digits in plain notation, as <see cref="Utf8JsonWriter.WriteNumberValue(double)"/>
    /// writes <see cref="Round"/> of it (the shortest digits that read back are those seven, trailing zeros dropped), without
    /// the text round trip; false when they need an exponent, whose notation differs between the two formats.
    /// </summary>
    private static bool TryFormatPlain(double value, Span<byte> buffer, out ReadOnlySpan<byte> digits)
    {
        digits = default;
        if (!SevenDigits.TryFormat(value, buffer, out int written) || buffer[..written].IndexOfAny((byte)'E', (byte)'e') >= 0) return false;
        digits = buffer[..written];
        return true;
    }
}
