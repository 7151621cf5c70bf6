namespace Atlas.Demo;

/// <summary>A latitude/longitude box in degrees (west and east are longitudes east of Greenwich, negative west).</summary>
public sealed record GeoBox(double West, double East, double South, double North);
