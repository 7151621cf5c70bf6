namespace Atlas.Api.Requests;

/// <summary>The position (lat, lon) and years (from, to) that every point request names.</summary>
public interface IPointQuery
{
    string? Lat { get; }
    string? Lon { get; }
    string? From { get; }
    string? To { get; }
}

public static class PointQueries
{
    /// <summary>lat and lon in degrees, or null with the faults in <paramref name="errors"/>.</summary>
    public static (double Latitude, double Longitude)? Position(this IPointQuery query, QueryErrors errors)
    {
        var latitude = QueryNumbers.Read("lat", query.Lat, "the latitude in degrees north, -90..90", errors, required: true, -90, 90);
        var longitude = QueryNumbers.Read("lon", query.Lon, "the longitude in degrees east, -180..180", errors, required: true, -180, 180);
        return latitude is { } y && longitude is { } x ? (y, x) : null;
    }

    /// <summary>The from..to years, or null with the faults in <paramref name="errors"/>.</summary>
    public static YearWindow? Years(this IPointQuery query, QueryErrors errors) => YearWindow.Parse(query.From, query.To, null, errors);
}
