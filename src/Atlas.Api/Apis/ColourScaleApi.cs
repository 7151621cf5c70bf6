namespace Atlas.Api.Apis;

/// <summary>
/// <c>GET /api/v1/colour-scales</c>: the tables of the atlas's colour scales, the same ones the figures draw with, so
/// that the page and the downloads cannot drift apart.
/// </summary>
public static class ColourScaleApi
{
    public static IEndpointRouteBuilder MapColourScaleApi(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/v1/colour-scales", Scales).WithTags("Colour scales");
        return routes;
    }

    private static readonly ColourScales Tables = new(
        Describe(ColourScale.Name, ColourScale.Ramp,
            "Sequential, for every layer but directions: OKLCh from a deep-sea navy through teal to a warm sand, lightness rising " +
            "monotonically, resampled at equal perceived (OKLab) steps. Fraction f of the range takes entry round(f x 255)."),
        Describe(DirectionColourScale.Name, DirectionColourScale.Ramp,
            "Cyclic, for directions: constant OKLab lightness and chroma, the hue once round the circle from blue at north. " +
            "Direction d degrees takes entry floor(d / 360 x 256) mod 256; 0 and 360 degrees are the same colour."));

    [EndpointName("ColourScales")]
    [EndpointSummary("The atlas's sequential and cyclic colour scales as 256-entry sRGB tables")]
    [EndpointDescription("The page draws its layers, colour bar and tables with these; the PNG and vector figures use the same tables.")]
    public static Ok<ColourScales> Scales(HttpContext http)
    {
        http.Response.Headers.CacheControl = "public, max-age=3600";
        return TypedResults.Ok(Tables);
    }

    private static ColourScaleTable Describe(string name, ColourRamp ramp, string description) =>
        new(name, ramp.Closed, description, ramp.Colours.Select(ColourRamp.Hex).ToArray());
}
