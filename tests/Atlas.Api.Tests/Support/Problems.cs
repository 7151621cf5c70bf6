using System.Net;
using System.Text.Json;

namespace Atlas.Api.Tests.Support;

/// <summary>Assertions on problem-details answers (RFC 9457).</summary>
public static class Problems
{
    /// <summary>Asserts the status and the problem+json type, and returns the problem document.</summary>
    public static async Task<JsonElement> AssertAsync(HttpResponseMessage response, HttpStatusCode status, string? detailContains = null)
    {
        var body = await response.Content.ReadAsStringAsync();
        Assert.True(status == response.StatusCode, $"Expected {(int)status}, got {(int)response.StatusCode}: {body}");
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        var problem = JsonDocument.Parse(body).RootElement.Clone();
        Assert.Equal((int)status, problem.GetProperty("status").GetInt32());
        if (detailContains is not null) Assert.Contains(detailContains, body, StringComparison.OrdinalIgnoreCase);
        return problem;
    }
}
