namespace Atlas.Api.Apis;

/// <summary>The overview shown at the top of the OpenAPI document.</summary>
public static class ApiDocumentation
{
    public const string Overview =
        "Statistics of a calibrated regional wave hindcast, per grid cell and period, served as JSON, CSV, GeoTIFF, GeoJSON, NetCDF " +
        "and PNG, with site and area reports as PDF. Parameters (trade symbols): hs (Hm0, m), te (energy period, s), tp (peak period, s), j (omnidirectional power, kW/m), " +
        "dir (mean direction waves come from, degrees true), spread (degrees), d (directionality coefficient), depth (m). Periods: " +
        "jan..dec, djf, mam, jja, son, annual, y2019. Errors are RFC 9457 problem details saying what to fix. Computing endpoints are " +
        "rate-limited per client address (429 with Retry-After); write endpoints need the X-Api-Key header. A database outage gives " +
        "503 with Retry-After. " + Model.AtlasCaution.Text;
}
