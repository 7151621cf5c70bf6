using Microsoft.AspNetCore.Http.Extensions;
using Microsoft.AspNetCore.WebUtilities;

namespace Atlas.Api.Downloads;

/// <summary>
/// Where the CSVW metadata of a CSV answer lives, and the <c>Link: &lt;...&gt;; rel="describedby"</c> header that points
/// at it (RFC 8288; the locating rule of the W3C Model for Tabular Data, section 5.2). Two shapes: a download named by
/// its path (<c>.../annual.csv</c>) has its metadata at the path with <c>-metadata.json</c> added
/// (<c>.../annual.csv-metadata.json</c>, the Recommendation's default location, with the same query); an answer chosen
/// by <c>format=csv</c> has its metadata at the same path and query with <c>format=csvw</c>. The metadata's
/// <c>url</c> points back at the CSV. Both are absolute paths, resolved against the request.
/// </summary>
public static class CsvMetadataLinks
{
    /// <summary>The suffix that turns a CSV path into its metadata path.</summary>
    public const string PathSuffix = "-metadata.json";

    /// <summary>The query value of <c>format</c> that asks for the metadata of a <c>format=csv</c> answer.</summary>
    public const string FormatValue = "csvw";

    /// <summary>
    /// Splits a route's <c>{name}.{format}</c> pair when the path asked for the metadata: ASP.NET matches
    /// <c>annual.csv-metadata.json</c> as name <c>annual.csv-metadata</c> and format <c>json</c>.
    /// </summary>
    public static bool AsksForMetadata(ref string name, ref string format)
    {
        const string csv = ".csv-metadata";
        if (format != "json" || !name.EndsWith(csv, StringComparison.Ordinal)) return false;
        name = name[..^csv.Length];
        format = "csv";
        return true;
    }

    /// <summary>The request's path and query with the path's <c>-metadata.json</c> added (or removed).</summary>
    public static string PathForm(HttpRequest request, bool metadata)
    {
        var path = request.PathBase.Add(request.Path).ToUriComponent();
        path = metadata
            ? (path.EndsWith(PathSuffix, StringComparison.Ordinal) ? path : path + PathSuffix)
            : (path.EndsWith(PathSuffix, StringComparison.Ordinal) ? path[..^PathSuffix.Length] : path);
        return path + request.QueryString.ToUriComponent();
    }

    /// <summary>The request's path and query with <c>format</c> set to <paramref name="format"/>, other values kept in order.</summary>
    public static string FormatForm(HttpRequest request, string format)
    {
        var query = new QueryBuilder();
        var seen = false;
        foreach (var (key, values) in QueryHelpers.ParseQuery(request.QueryString.Value))
        {
            if (key == "format")
            {
                query.Add("format", format);
                seen = true;
            }
            else
                foreach (var value in values) query.Add(key, value ?? "");
        }
        if (!seen) query.Add("format", format);
        return request.PathBase.Add(request.Path).ToUriComponent() + query.ToQueryString().ToUriComponent();
    }

    /// <summary>Adds the describedby link to the CSVW metadata at <paramref name="metadataUrl"/>.</summary>
    public static void Describe(HttpResponse response, string metadataUrl) =>
        response.Headers.Append("Link", $"<{metadataUrl}>; rel=\"describedby\"; type=\"{CsvwMetadataWriter.MediaType}\"");
}
