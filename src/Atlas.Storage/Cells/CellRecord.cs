namespace Atlas.Storage.Cells;

/// <summary>A grid point of a dataset. <see cref="CellId"/> is the point's index in the source grid.</summary>
public sealed record CellRecord(int CellId, int? GridI, int? GridJ, double Longitude, double Latitude, float? DepthMetres, bool Wet, float? CoastDistanceMetres = null);

/// <summary>The wet cell nearest to an asked position, with the great-circle distance to it.</summary>
public sealed record NearestCell(CellRecord Cell, double DistanceMetres);
