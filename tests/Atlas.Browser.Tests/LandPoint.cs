using System.Text.Json;

namespace Atlas.Browser.Tests;

/// <summary>A position well inside the land mask (even-odd ray casting over all its rings).</summary>
public static class LandPoint
{
    public static (double Lat, double Lon) Inside(JsonElement land)
    {
        var rings = land.GetProperty("features").EnumerateArray()
            .SelectMany(f => f.GetProperty("geometry").GetProperty("coordinates").EnumerateArray())
            .SelectMany(polygon => polygon.EnumerateArray())
            .Select(ring => ring.EnumerateArray().Select(p => (X: p[0].GetDouble(), Y: p[1].GetDouble())).ToArray())
            .ToArray();
        Assert.NotEmpty(rings);
        var all = rings.SelectMany(r => r).ToArray();
        double west = all.Min(p => p.X), east = all.Max(p => p.X), south = all.Min(p => p.Y), north = all.Max(p => p.Y);
        // The candidate farthest from every ring edge: the middle of the widest piece of land.
        (double Lat, double Lon, double Clearance) best = (double.NaN, double.NaN, -1);
        for (var i = 1; i < 40; i++)
            for (var j = 1; j < 40; j++)
            {
                double x = west + (east - west) * i / 40, y = south + (north - south) * j / 40;
                if (!InsideAll(rings, x, y)) continue;
                var clearance = rings.Min(r => EdgeDistance(r, x, y));
                if (clearance > best.Clearance) best = (y, x, clearance);
            }
        Assert.True(best.Clearance > 0, "no point found inside the land mask");
        return (best.Lat, best.Lon);
    }

    private static bool InsideAll((double X, double Y)[][] rings, double x, double y)
    {
        var inside = false;
        foreach (var ring in rings)
            for (int k = 0, m = ring.Length - 1; k < ring.Length; m = k++)
                if ((ring[k].Y > y) != (ring[m].Y > y) && x < (ring[m].X - ring[k].X) * (y - ring[k].Y) / (ring[m].Y - ring[k].Y) + ring[k].X)
                    inside = !inside;
        return inside;
    }

    private static double EdgeDistance((double X, double Y)[] ring, double x, double y)
    {
        var best = double.MaxValue;
        for (var k = 1; k < ring.Length; k++)
        {
            var (ax, ay) = ring[k - 1];
            var (bx, by) = ring[k];
            double dx = bx - ax, dy = by - ay, length2 = dx * dx + dy * dy;
            var t = length2 == 0 ? 0 : Math.Clamp(((x - ax) * dx + (y - ay) * dy) / length2, 0, 1);
            best = Math.Min(best, Math.Sqrt(Math.Pow(x - ax - t * dx, 2) + Math.Pow(y - ay - t * dy, 2)));
        }
        return best;
    }
}
