using Atlas.Hindcast.Native;

namespace Atlas.Hindcast;

/// <summary>
/// A call into netCDF-C returned an error status. The problem text is the library's own nc_strerror
/// text, prefixed by the operation that failed. It is a <see cref="HindcastFormatException"/> so that a reader
/// catches one type for every unusable file; writers raise it too (a full disk, a missing folder).
/// </summary>
public sealed class NetCdfException : HindcastFormatException
{
    public NetCdfException(string file, string? variable, string operation, int status)
        : base(file, variable, $"{operation} failed: {NetCdfNative.ErrorText(status)} (netCDF status {status})")
    {
        Status = status;
        Operation = operation;
    }

    /// <summary>The netCDF-C status code (negative).</summary>
    public int Status { get; }

    /// <summary>The native function that failed, e.g. "nc_get_vara_float".</summary>
    public string Operation { get; }

    /// <summary>Throws when <paramref name="status"/> is not NC_NOERR.</summary>
    internal static void Check(int status, string file, string? variable, string operation)
    {
        if (status != NetCdfNative.NC_NOERR) throw new NetCdfException(file, variable, operation, status);
    }
}
