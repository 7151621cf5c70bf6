using System.Net;
using System.Text;
using System.Text.Json;
using Atlas.Api.Tests.Support;
using Xunit.Abstractions;

namespace Atlas.Api.Tests.Operations;

/// <summary>
/// Hostile requests against every operation of the OpenAPI document: SQL meta-characters, odd encodings and huge
/// values in each path segment and query parameter in turn, path traversal in download names. None may be a server
/// error, every refusal is a problem document, and no stored row changes (the layer cache aside, which valid reads fill).
/// </summary>
[Collection(AtlasApiCollection.Name)]
public sealed class BadRequestTests(AtlasApiFixture atlas, ITestOutputHelper output)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();

    /// <summary>Values sent raw in the URL (already percent-encoded where they must be).</summary>
    private static readonly string[] HostileValues =
    [
        "%27", "%27%20OR%20%271%27%3D%271", "1%3B%20DROP%20TABLE%20dataset%3B%20--", "%22%3B%20DELETE%20FROM%20cell%3B%20--",
        "%24%241%24%24", "%5C", "%00", "%25", "%zz", "%c0%af", "%ff%fe", "%e2%80%ae", "..%2F..%2F..%2Fetc%2Fpasswd",
        "%252e%252e%252f", "-1e309", "NaN", "%E6%B5%B7", new string('9', 400), new string('a', 20_000),
    ];

    private static readonly Dictionary<string, string> ValidValues = new()
    {
        ["slug"] = SyntheticAtlas.CoastSlug, ["lat"] = "40.45", ["lon"] = "20.45", ["parameter"] = "hs", ["statistic"] = "mean",
        ["period"] = "annual", ["format"] = "csv",
    };

    private static readonly string[] DataTables =
        ["dataset", "dataset_year", "cell", "series_chunk", "source_file", "statistic_block", "cell_statistic_state", "job", "station", "station_observation", "device_matrix"];

    [Fact]
    public async Task HostileValuesInEveryParameterOfEveryOperationAreNeverServerErrorsAndChangeNothing()
    {
        var before = await FingerprintAsync();
        var operations = await OperationsAsync();
        Assert.True(operations.Count >= 20, $"only {operations.Count} operations found in the OpenAPI document");
        var sent = 0;
        var failures = new List<string>();
        foreach (var (method, template, parameters) in operations)
        foreach (var target in parameters)
        foreach (var hostile in HostileValues)
        {
            // The in-memory test client itself refuses a NUL in the path; RawRequestTests sends one to Kestrel.
            if (target.In == "path" && hostile == "%00") continue;
            var path = template;
            var query = new List<string>();
            foreach (var (name, location) in parameters)
            {
                var value = name == target.Name ? hostile : ValidValues.GetValueOrDefault(name);
                if (location == "path") path = path.Replace("{" + name + "}", value ?? "x");
                else if (value is not null) query.Add($"{name}={value}");
            }
            var url = path + (query.Count > 0 ? "?" + string.Join('&', query) : "");
            using var request = new HttpRequestMessage(new HttpMethod(method), url);
            request.Headers.Add("X-Api-Key", AtlasApiFixture.ApiKey);
            if (method is "POST") request.Content = new StringContent(hostile, Encoding.UTF8, "application/json");
            using var response = await _client.SendAsync(request);
            sent++;
            var status = (int)response.StatusCode;
            if (status >= 500) failures.Add($"{method} {Shorten(url)}: {status} {Shorten(await response.Content.ReadAsStringAsync())}");
            else if (status >= 400 && response.Content.Headers.ContentType?.MediaType != "application/problem+json")
                failures.Add($"{method} {Shorten(url)}: {status} without a problem document");
        }
        output.WriteLine($"{operations.Count} operations, {sent} hostile requests");
        Assert.True(failures.Count == 0, string.Join('\n', failures.Take(20)));
        Assert.Equal(before, await FingerprintAsync());
    }

    [Theory]
    [InlineData("/api/v1/datasets/{slug}/layers/hs/mean/..%2F..%2F..%2F..%2Fetc%2Fpasswd")]
    [InlineData("/api/v1/datasets/{slug}/layers/hs/mean/%2e%2e%2f%2e%2e%2fannual.csv")]
    [InlineData("/api/v1/datasets/{slug}/layers/hs/mean/annual.csv%2F..%2F..%2Fpasswd")]
    [InlineData("/api/v1/datasets/{slug}/layers/..%5C..%5Cwindows/mean/annual.csv")]
    [InlineData("/api/v1/datasets/..%2F..%2Fetc/layers/hs/mean/annual.csv")]
    [InlineData("/..%2F..%2F..%2Fetc%2Fpasswd")]
    [InlineData("/%2e%2e/%2e%2e/%2e%2e/etc/passwd")]
    [InlineData("/index.html/..%2F..%2F..%2Fetc%2Fpasswd")]
    [InlineData("/%c0%ae%c0%ae/%c0%ae%c0%ae/etc/passwd")]
    public async Task PathTraversalInADownloadNameReachesNoFile(string template)
    {
        var response = await _client.GetAsync(template.Replace("{slug}", SyntheticAtlas.CoastSlug));
        var body = await response.Content.ReadAsStringAsync();
        Assert.True((int)response.StatusCode is >= 400 and < 500, $"{template}: {(int)response.StatusCode} {Shorten(body)}");
        Assert.DoesNotContain("root:", body);
    }

    [Fact]
    public async Task AHugeQueryStringIsRefusedWithoutAServerError()
    {
        var query = string.Join('&', Enumerable.Range(0, 5000).Select(i => $"p{i}=%27{i}"));
        var response = await _client.GetAsync($"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/point?lat=40.45&lon=20.45&{query}&lat=%27");
        Assert.True((int)response.StatusCode is >= 400 and < 500, $"{(int)response.StatusCode}");
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
    }

    [Fact]
    public async Task AnAreaPolygonCarryingSqlInItsPropertiesAndCoordinatesChangesNothing()
    {
        var before = await FingerprintAsync();
        foreach (var body in new[]
                 {
                     """{"type":"Feature","properties":{"name":"'; DROP TABLE cell; --"},"geometry":{"type":"Polygon","coordinates":[[[20.1,40.1],[20.5,40.1],[20.5,40.5],[20.1,40.1]]]}}""",
                     """{"type":"Polygon","coordinates":[[["20.1'); DELETE FROM dataset; --",40.1],[20.5,40.1],[20.5,40.5],[20.1,40.1]]]}""",
                     """{"type":"Polygon","coordinates":"ST_GeomFromText('POLYGON EMPTY')"}""",
                     "\uFEFF{\"type\":\"Polygon\"}", "{\"type\":\"Polygon\",\"coordinates\":[[[1e400,0],[0,0],[0,1],[1e400,0]]]}",
                 })
        {
            var response = await _client.PostAsync($"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/area?parameter=hs&statistic=mean&period=annual",
                new StringContent(body, Encoding.UTF8, "application/geo+json"));
            Assert.True((int)response.StatusCode < 500, $"{body}: {(int)response.StatusCode} {await response.Content.ReadAsStringAsync()}");
        }
        Assert.Equal(before, await FingerprintAsync());
    }

    private async Task<List<(string Method, string Template, List<(string Name, string In)> Parameters)>> OperationsAsync()
    {
        var document = JsonDocument.Parse(await _client.GetStringAsync("/swagger/v1/swagger.json")).RootElement;
        var operations = new List<(string, string, List<(string, string)>)>();
        foreach (var path in document.GetProperty("paths").EnumerateObject())
        foreach (var operation in path.Value.EnumerateObject())
        {
            var parameters = new List<(string, string)>();
            if (operation.Value.TryGetProperty("parameters", out var list))
                foreach (var parameter in list.EnumerateArray())
                    parameters.Add((parameter.GetProperty("name").GetString()!, parameter.GetProperty("in").GetString()!));
            if (parameters.Count > 0) operations.Add((operation.Name.ToUpperInvariant(), path.Name, parameters));
        }
        return operations;
    }

    private async Task<string> FingerprintAsync()
    {
        var parts = new List<string>();
        foreach (var table in DataTables)
        {
            await using var command = atlas.DataSource.CreateCommand(
                $"SELECT count(*) || ':' || coalesce(md5(string_agg(t::text, '|' ORDER BY t::text)), '') FROM {table} t");
            parts.Add($"{table}={await command.ExecuteScalarAsync()}");
        }
        return string.Join('\n', parts);
    }

    private static string Shorten(string text) => text.Length <= 300 ? text : text[..300] + "...";
}
