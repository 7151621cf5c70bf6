using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>The position (lat, lon) and calendar years (from, to) that every point request names.</summary>
public sealed record PointPosition(
    [property: FromQuery(Name = "lat")] string? Lat,
    [property: FromQuery(Name = "lon")] string? Lon,
    [property: FromQuery(Name = "from")] string? From,
    [property: FromQuery(Name = "to")] string? To)
{
    /// <summary>lat and lon in degrees, or null with the faults in <paramref name="errors"/>.</summary>
    public (double Latitude, double Longitude)? Position(QueryErrors errors)
    {
        var latitude = QueryNumbers.Read("lat", Lat, "the latitude in degrees north, -90..90", errors, required: true, -90, 90);
        var longitude = QueryNumbers.Read("lon", Lon, "the longitude in degrees east, -180..180", errors, required: true, -180, 180);
        return latitude is { } y && longitude is { } x ? (y, x) : null;
    }

    /// <summary>The from..to years, restricted to the calendar <paramref name="months"/> when given; null with the faults in <paramref name="errors"/>.</summary>
    public YearWindow? Window(QueryErrors errors, string? months = null) => YearWindow.Parse(From, To, months, errors);
}
