namespace Atlas.Hindcast;

/// <summary>On-disk format of a netCDF file, as nc_inq_format reports it.</summary>
public enum NetCdfFormat
{
    /// <summary>CDF-1, the original classic format (32-bit offsets).</summary>
    Classic = 1,
    /// <summary>CDF-2, classic model with 64-bit offsets.</summary>
    Offset64 = 2,
    /// <summary>NetCDF-4 on HDF5, enhanced data model.</summary>
    NetCdf4 = 3,
    /// <summary>NetCDF-4 on HDF5 restricted to the classic data model.</summary>
    NetCdf4Classic = 4,
    /// <summary>CDF-5, classic model with 64-bit data sizes and the unsigned/64-bit types.</summary>
    Cdf5 = 5,
}
