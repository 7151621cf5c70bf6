namespace Atlas.Hindcast;

/// <summary>A dimension of a netCDF file: its id, name, current length and whether it is unlimited.</summary>
public sealed record NetCdfDimension(int Id, string Name, long Length, bool IsUnlimited);
