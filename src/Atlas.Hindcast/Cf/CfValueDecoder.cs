using System.Numerics;
using System.Runtime.InteropServices;

namespace Atlas.Hindcast;

/// <summary>
/// Turns stored values of one variable into float32 atlas values (SI units, NaN for missing) following CF:
/// missing when equal to _FillValue (or, without one, the netCDF default fill of the type) or to any missing_value,
/// or outside valid_range / valid_min / valid_max; then unpacked as <c>raw * scale_factor + add_offset</c>;
/// then converted to SI units; elevations are negated into depths; directions are turned from "to" into "from"
/// by adding 180 degrees and wrapped into [0, 360); a peak frequency is turned into a period by its reciprocal.
/// </summary>
/// <remarks>
/// As in netCDF4-python, 8-bit types have no default fill (their whole range is commonly data) and fill values are
/// compared after casting them to the stored type. valid_* attributes are compared with the stored (packed) values,
/// as the netCDF attribute conventions define them and netCDF4-python applies them, whatever their own type.
/// _Unsigned = "true" makes integer data unsigned.
/// </remarks>
public sealed class CfValueDecoder
{
    private readonly double[] _rawMissing;
    private readonly double _rawMin, _rawMax;
    private readonly double _scale, _offset, _factor, _unitOffset;
    private readonly bool _isDirection, _toFrom, _reciprocal;
    private readonly StoredFloatMask _mask;

    private CfValueDecoder(double[] rawMissing, double rawMin, double rawMax, double scale, double offset, UnitConversion units, bool negate, bool isDirection, bool toFrom, bool reciprocal, NetCdfType readType)
    {
        _reciprocal = reciprocal;
        _rawMissing = rawMissing;
        _rawMin = rawMin;
        _rawMax = rawMax;
        _scale = scale;
        _offset = offset;
        _factor = negate ? -units.Factor : units.Factor;
        _unitOffset = negate ? -units.Offset : units.Offset;
        _isDirection = isDirection;
        _toFrom = toFrom;
        ReadType = readType;
        Units = units;
        IsPacked = scale != 1 || offset != 0;
        _mask = new StoredFloatMask(rawMissing.Select(m => (float)m), (float)rawMin, (float)rawMax);
    }

    /// <summary>The type to read from the file before decoding (unsigned when _Unsigned = "true").</summary>
    public NetCdfType ReadType { get; }

    public UnitConversion Units { get; }

    public bool IsPacked { get; }

    /// <summary>True when the decoded value is the reciprocal of the converted one (a peak frequency read as Tp).</summary>
    public bool IsReciprocal => _reciprocal;

    /// <summary>
    /// The stored values that decode as missing, when decoding float data changes nothing else (unpacked, in SI units, no
    /// direction turned, no reciprocal); null when it does more.
    /// </summary>
    public StoredFloatMask? MaskOnly => OnlyMasks ? _mask : null;

    /// <summary>True when decoding changes nothing but the missing values (float data in SI units).</summary>
    private bool OnlyMasks => ReadType == NetCdfType.Float && !IsPacked && _factor == 1 && _unitOffset == 0 && !_isDirection && !_reciprocal;

    /// <summary>
    /// Builds the decoder for <paramref name="variable"/>. Throws <see cref="FormatException"/> (problem text only) for
    /// a non-numeric variable or units that are not of <paramref name="quantity"/>.
    /// </summary>
    /// <param name="unitsOverride">Units to use instead of the variable's units attribute (from a mapping file).</param>
    /// <param name="negate">True for an elevation (positive up) decoded as a depth (positive down).</param>
    /// <param name="towards">True when the variable is a direction the waves travel to.</param>
    /// <param name="reciprocal">True to decode 1 / value (a frequency in Hz read as a period in s); a value at or below
    /// zero then decodes as missing.</param>
    public static CfValueDecoder Create(NetCdfVariable variable, PhysicalQuantity quantity, string? unitsOverride = null,
        bool negate = false, bool towards = false, bool reciprocal = false)
    {
        if (!variable.Type.IsNumeric()) throw new FormatException($"has type {variable.Type}; a numeric type is required");
        bool unsigned = string.Equals(variable.TextAttribute("_Unsigned"), "true", StringComparison.OrdinalIgnoreCase);
        var readType = unsigned ? variable.Type switch
        {
            NetCdfType.Byte => NetCdfType.UByte,
            NetCdfType.Short => NetCdfType.UShort,
            NetCdfType.Int => NetCdfType.UInt,
            var t => t,
        } : variable.Type;

        string? units = unitsOverride ?? variable.TextAttribute("units");
        var conversion = UnitConversion.ToSi(units, quantity);

        double scale = variable.NumberAttribute("scale_factor") ?? 1;
        double offset = variable.NumberAttribute("add_offset") ?? 0;
        if (!double.IsFinite(scale) || !double.IsFinite(offset)) throw new FormatException("scale_factor/add_offset is not finite");

        var missing = new List<double>();
        var fill = variable.Attribute("_FillValue");
        if (fill is { IsText: false, Values.Count: > 0 }) missing.Add(CastToStored(fill.Values[0], readType));
        else if (fill is null && readType is not (NetCdfType.Byte or NetCdfType.UByte)) missing.Add(readType.DefaultFillValue());
        if (variable.Attribute("missing_value") is { IsText: false } mv) missing.AddRange(mv.Values.Select(v => CastToStored(v, readType)));

        double rawMin = double.NegativeInfinity, rawMax = double.PositiveInfinity;
        if (variable.Attribute("valid_range") is { IsText: false } range)
        {
            if (range.Values.Count != 2) throw new FormatException($"valid_range has {range.Values.Count} values; two are required");
            (rawMin, rawMax) = (CastToStored(range.Values[0], readType), CastToStored(range.Values[1], readType));
        }
        else
        {
            if (variable.NumberAttribute("valid_min") is { } vmin) rawMin = CastToStored(vmin, readType);
            if (variable.NumberAttribute("valid_max") is { } vmax) rawMax = CastToStored(vmax, readType);
        }

        return new CfValueDecoder(missing.Distinct().ToArray(), rawMin, rawMax, scale, offset,
            conversion, negate, quantity == PhysicalQuantity.Angle, towards, reciprocal, readType);
    }

    /// <summary>Decodes float data in place (the common unpacked case).</summary>
    public void DecodeInPlace(Span<float> values) => Decode<float>(values, values);

    /// <summary>
    /// Decodes <paramref name="raw"/> (read as <see cref="ReadType"/>, or the signed type of the same size when
    /// unsigned) into <paramref name="destination"/>. The two may be the same memory for float data.
    /// </summary>
    public void Decode<T>(ReadOnlySpan<T> raw, Span<float> destination) where T : unmanaged, INumberBase<T>
    {
        if (destination.Length < raw.Length) throw new ArgumentException("destination is shorter than the data", nameof(destination));
        // Unsigned data arrive in the signed type of the same size; reinterpret rather than convert.
        if (ReadType == NetCdfType.UByte && typeof(T) == typeof(sbyte)) { DecodeScalar(MemoryMarshal.Cast<T, byte>(raw), destination); return; }
        if (ReadType == NetCdfType.UShort && typeof(T) == typeof(short)) { DecodeScalar(MemoryMarshal.Cast<T, ushort>(raw), destination); return; }
        if (ReadType == NetCdfType.UInt && typeof(T) == typeof(int)) { DecodeScalar(MemoryMarshal.Cast<T, uint>(raw), destination); return; }
        if (typeof(T) == typeof(float) && OnlyMasks)
        {
            MaskFloats(MemoryMarshal.Cast<T, float>(raw), destination);
            return;
        }
        DecodeScalar(raw, destination);
    }

    private void DecodeScalar<T>(ReadOnlySpan<T> raw, Span<float> destination) where T : unmanaged, INumberBase<T>
    {
        var missing = _rawMissing;
        for (int i = 0; i < raw.Length; i++)
        {
            double r = double.CreateTruncating(raw[i]);
            bool isMissing = r < _rawMin || r > _rawMax;
            for (int k = 0; k < missing.Length && !isMissing; k++) isMissing = r == missing[k];
            if (isMissing)
            {
                destination[i] = float.NaN;
                continue;
            }
            double v = (r * _scale + _offset) * _factor + _unitOffset;
            if (_isDirection) v = WrapDegrees(_toFrom ? v + 180 : v);
            // A zero or negative peak frequency has no period: the step is missing, never infinite or negative.
            if (_reciprocal) v = v > 0 ? 1 / v : double.NaN;
            destination[i] = (float)v;
        }
    }

    private void MaskFloats(ReadOnlySpan<float> raw, Span<float> destination)
    {
        var mask = _mask;
        int i = 0;
        if (Vector.IsHardwareAccelerated && raw.Length >= Vector<float>.Count)
        {
            var nan = new Vector<float>(float.NaN);
            var rawVectors = MemoryMarshal.Cast<float, Vector<float>>(raw);
            var outVectors = MemoryMarshal.Cast<float, Vector<float>>(destination);
            for (int k = 0; k < rawVectors.Length; k++)
            {
                var v = rawVectors[k];
                outVectors[k] = Vector.ConditionalSelect(mask.Missing(v), nan, v);
            }
            i = rawVectors.Length * Vector<float>.Count;
        }
        for (; i < raw.Length; i++)
        {
            float v = raw[i];
            destination[i] = mask.IsMissing(v) ? float.NaN : v;
        }
    }

    /// <summary>Wraps an angle into [0, 360); NaN stays NaN.</summary>
    internal static double WrapDegrees(double degrees)
    {
        double w = degrees - 360 * Math.Floor(degrees / 360);
        return (float)w >= 360f ? 0 : w;
    }

    private static double CastToStored(double value, NetCdfType type) => type switch
    {
        NetCdfType.Float => (float)value,
        NetCdfType.Byte => unchecked((sbyte)(long)value),
        NetCdfType.UByte => unchecked((byte)(long)value),
        NetCdfType.Short => unchecked((short)(long)value),
        NetCdfType.UShort => unchecked((ushort)(long)value),
        NetCdfType.Int => unchecked((int)(long)value),
        NetCdfType.UInt => unchecked((uint)(long)value),
        _ => value,
    };
}
