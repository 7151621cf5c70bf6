using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>
/// The route <c>/layers/{parameter}/{statistic}/{period}.{format}</c> and its geometry query; <c>{period}.csv-metadata.json</c>
/// asks for the CSVW metadata of the CSV.
/// </summary>
public sealed record LayerDownloadRoute(
    [property: FromRoute(Name = "parameter")] string Parameter,
    [property: FromRoute(Name = "statistic")] string Statistic,
    [property: FromRoute(Name = "period")] string Period,
    [property: FromRoute(Name = "format")] string Format,
    [property: FromQuery(Name = "geometry")] string? Geometry)
{
    /// <summary>
    /// The layer asked for; null with <paramref name="notFound"/> when the path names no layer (404), or with the
    /// fault of the geometry query in <paramref name="errors"/> (400).
    /// </summary>
    public LayerRequest? Read(QueryErrors errors, out ProblemHttpResult? notFound)
    {
        var (period, format) = (Period, Format);
        var companion = LayerCompanions.Read(ref period, ref format);
        notFound = Unknown(period, format);
        if (notFound is not null) return null;
        WaveParameterNames.TryParse(Parameter, out var p);
        StatisticKindNames.TryParse(Statistic, out var s);
        AtlasPeriod.TryParse(period, out var t);
        LayerFormats.TryParse(format, out var f);
        if (Geometry is not null && f != LayerFormat.GeoJson) errors.Add("geometry", "geometry applies to .geojson downloads only; remove it.");
        else if (Geometry is not (null or "point" or "polygon"))
            errors.Add("geometry", $"'{Geometry}' is not a geometry: use point (cell centres, the default) or polygon (cell footprints).");
        return errors.Count > 0 ? null : new LayerRequest(p, s, t, f, Geometry == "polygon", companion);
    }

    private ProblemHttpResult? Unknown(string period, string format)
    {
        if (!WaveParameterNames.TryParse(Parameter, out var p)) return ApiProblems.NotFound("Unknown parameter", VocabularyMessages.UnknownParameter(Parameter));
        if (!StatisticKindNames.TryParse(Statistic, out var s)) return ApiProblems.NotFound("Unknown statistic", VocabularyMessages.UnknownStatistic(Statistic));
        if (!AtlasPeriod.TryParse(period, out _)) return ApiProblems.NotFound("Unknown period", VocabularyMessages.UnknownPeriod(period));
        if (!LayerFormats.TryParse(format, out _))
            return ApiProblems.NotFound("Unknown format",
                $"'.{format}' is not a layer format: use {string.Join(", ", LayerFormats.Extensions.Select(e => "." + e))} (and .csv-metadata.json for the CSV's metadata, .figure.json for the figure's provenance).");
        var offered = ParameterCatalogue.StatisticsOf(p);
        if (!offered.Contains(s))
            return ApiProblems.NotFound("No such layer", $"{p.Symbol()} has no '{s.Name()}' layer: its layers are {string.Join(", ", offered.Select(x => x.Name()))}.");
        return null;
    }
}
