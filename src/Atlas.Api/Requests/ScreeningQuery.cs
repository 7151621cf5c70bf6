using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>The site-screening criteria of <c>GET /screen</c>, each optional, as sent.</summary>
public sealed record ScreeningQuery(
    [property: FromQuery(Name = "min_power_kw_m")] string? MinPowerKwM,
    [property: FromQuery(Name = "min_depth_m")] string? MinDepthM,
    [property: FromQuery(Name = "max_depth_m")] string? MaxDepthM,
    [property: FromQuery(Name = "max_coast_distance_km")] string? MaxCoastDistanceKm,
    [property: FromQuery(Name = "max_hs_p90_m")] string? MaxHsP90M,
    [property: FromQuery(Name = "period")] string? Period,
    [property: FromQuery(Name = "format")] string? Format = null)
{
    /// <summary>
    /// GeoJSON (null, the default), CSV, or the CSV's CSVW metadata; null with the fault in <paramref name="errors"/>
    /// for anything else.
    /// </summary>
    public TableFormat? Form(QueryErrors errors)
    {
        switch (Format)
        {
            case null or "geojson": return null;
            case "csv": return TableFormat.Csv;
            case CsvMetadataLinks.FormatValue: return TableFormat.CsvMetadata;
            default:
                errors.Add("format", $"'{Format}' is not a screening format: use geojson or csv ({CsvMetadataLinks.FormatValue} gives the CSV's metadata).");
                return null;
        }
    }

    /// <summary>The criteria read, or null with every fault in <paramref name="errors"/>.</summary>
    public ScreeningBounds? Read(QueryErrors errors)
    {
        var minPower = Bound("min_power_kw_m", MinPowerKwM, "the mean power in kW/m", errors);
        var minDepth = Bound("min_depth_m", MinDepthM, "the depth in m, positive down", errors);
        var maxDepth = Bound("max_depth_m", MaxDepthM, "the depth in m, positive down", errors);
        var maxCoast = Bound("max_coast_distance_km", MaxCoastDistanceKm, "the distance to the coast in km", errors);
        var maxHs = Bound("max_hs_p90_m", MaxHsP90M, "the 90th percentile of Hs in m", errors);
        var period = AtlasPeriod.Annual;
        if (Period is not null && !AtlasPeriod.TryParse(Period, out period)) errors.Add("period", VocabularyMessages.UnknownPeriod(Period));
        if (minDepth is { } a && maxDepth is { } b && a > b)
            errors.Add("max_depth_m", $"The depth window is reversed: min_depth_m {a} is greater than max_depth_m {b}; swap them.");
        return errors.Count > 0 ? null : new ScreeningBounds(period, minPower, minDepth, maxDepth, maxCoast, maxHs);
    }

    private static double? Bound(string name, string? text, string meaning, QueryErrors errors) =>
        QueryNumbers.Read(name, text, meaning, errors, required: false, min: 0);
}

/// <summary>Screening criteria in their units (kW/m, m, km), null where not given.</summary>
public sealed record ScreeningBounds(AtlasPeriod Period, double? MinPowerKwM, double? MinDepthM, double? MaxDepthM, double? MaxCoastDistanceKm, double? MaxHsP90M);
