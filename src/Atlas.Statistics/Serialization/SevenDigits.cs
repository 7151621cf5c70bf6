using System.Globalization;

namespace Atlas.Statistics.Serialization;

/// <summary>
/// A number's seven significant digits in plain notation, as UTF-8: the very text of
/// <c>value.TryFormat(buffer, out n, "G7", CultureInfo.InvariantCulture)</c>, made without its general formatting
/// machinery for the values an answer holds (magnitudes 1e-4 to 1e7), which a point answer writes by the thousand.
/// </summary>
/// <remarks>
/// The value is scaled by an exact power of ten (10^0..10^10) in one rounded multiplication, so the scaled value is
/// within 2^-53 of its exact decimal expansion, far less than the 1e-6 margin kept around a rounding tie: a scaled value
/// that close to a tie, a zero, a magnitude outside the plain range, and anything not finite go to <c>TryFormat</c>
/// itself, so that the text is always the same.
/// </remarks>
public static class SevenDigits
{
    private const double TieMargin = 1e-6;
    private static readonly double[] Powers = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10];

    /// <summary>Writes the "G7" text of <paramref name="value"/> into <paramref name="buffer"/> (32 bytes suffice); false when it does not fit.</summary>
    public static bool TryFormat(double value, Span<byte> buffer, out int written)
    {
        if (TryFormatFast(value, buffer, out written)) return true;
        return value.TryFormat(buffer, out written, "G7", CultureInfo.InvariantCulture);
    }

    private static bool TryFormatFast(double value, Span<byte> buffer, out int written)
    {
        written = 0;
        double magnitude = Math.Abs(value);
        // Plain notation for decimal exponents -4..6; 1e-4 itself and values near the ends go the general way.
        if (!(magnitude > 1.0001e-4 && magnitude < 9_999_999) || buffer.Length < 16) return false;
        int exponent = (int)Math.Floor(Math.Log10(magnitude));
        if (exponent < -4 || exponent > 6) return false;
        double scaled = magnitude * Powers[6 - exponent];
        // Log10 can be one off next to a power of ten: bring the scaled value into [1e6, 1e7).
        if (scaled >= 1e7)
        {
            if (++exponent > 6) return false;
            scaled = magnitude * Powers[6 - exponent];
        }
        else if (scaled < 1e6)
        {
            if (--exponent < -4) return false;
            scaled = magnitude * Powers[6 - exponent];
        }
        if (scaled < 1e6 || scaled >= 1e7) return false;
        double floor = Math.Floor(scaled), fraction = scaled - floor;
        if (Math.Abs(fraction - 0.5) < TieMargin) return false;
        long digits = (long)floor + (fraction > 0.5 ? 1 : 0);
        if (digits == 10_000_000)
        {
            if (++exponent > 6) return false;
            digits = 1_000_000;
        }
        // Seven digits d0..d6 stand for d0.d1..d6 x 10^exponent; trailing zeros are dropped.
        Span<byte> text = stackalloc byte[7];
        for (int i = 6; i >= 0; i--)
        {
            text[i] = (byte)('0' + (int)(digits % 10));
            digits /= 10;
        }
        int significant = 7;
        while (significant > 1 && text[significant - 1] == '0') significant--;
        int at = 0;
        if (value < 0) buffer[at++] = (byte)'-';
        if (exponent >= 0)
        {
            int whole = exponent + 1;
            for (int i = 0; i < whole; i++) buffer[at++] = i < significant ? text[i] : (byte)'0';
            if (significant > whole)
            {
                buffer[at++] = (byte)'.';
                for (int i = whole; i < significant; i++) buffer[at++] = text[i];
            }
        }
        else
        {
            buffer[at++] = (byte)'0';
            buffer[at++] = (byte)'.';
            for (int i = -1; i > exponent; i--) buffer[at++] = (byte)'0';
            for (int i = 0; i < significant; i++) buffer[at++] = text[i];
        }
        written = at;
        return true;
    }
}
