namespace Atlas.Api.Model;

/// <summary>The wet cell a point request was answered from.</summary>
public sealed record PointCell(int Id, double Lat, double Lon, double? DepthM, double DistanceM, double? CoastDistanceM);

/// <summary>The years and months a point computation used.</summary>
public sealed record PointWindow(int? FromYear, int? ToYear, IReadOnlyList<int>? Months);
