namespace Atlas.Hindcast;

/// <summary>The netCDF external types (nc_type); values are the library's own codes.</summary>
public enum NetCdfType
{
    Byte = 1,
    Char = 2,
    Short = 3,
    Int = 4,
    Float = 5,
    Double = 6,
    UByte = 7,
    UShort = 8,
    UInt = 9,
    Int64 = 10,
    UInt64 = 11,
    String = 12,
}

/// <summary>Sizes and default fill values of the atomic netCDF types.</summary>
public static class NetCdfTypeFacts
{
    /// <summary>True for the integer types that CF packing (scale_factor/add_offset) applies to.</summary>
    public static bool IsInteger(this NetCdfType type) => type is NetCdfType.Byte or NetCdfType.Short or NetCdfType.Int
        or NetCdfType.UByte or NetCdfType.UShort or NetCdfType.UInt or NetCdfType.Int64 or NetCdfType.UInt64;

    /// <summary>True for numeric types (everything but char and string).</summary>
    public static bool IsNumeric(this NetCdfType type) => type.IsInteger() || type is NetCdfType.Float or NetCdfType.Double;

    /// <summary>The value netCDF-C writes into unwritten cells when a variable has no _FillValue (netcdf.h NC_FILL_*).</summary>
    public static double DefaultFillValue(this NetCdfType type) => type switch
    {
        NetCdfType.Byte => -127,
        NetCdfType.Char => 0,
        NetCdfType.Short => -32767,
        NetCdfType.Int => -2147483647,
        NetCdfType.Float => 9.9692099683868690e+36f,
        NetCdfType.Double => 9.9692099683868690e+36,
        NetCdfType.UByte => 255,
        NetCdfType.UShort => 65535,
        NetCdfType.UInt => 4294967295U,
        NetCdfType.Int64 => -9223372036854775806L,
        NetCdfType.UInt64 => 18446744073709551614UL,
        _ => double.NaN,
    };
}
