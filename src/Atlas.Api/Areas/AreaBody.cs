namespace Atlas.Api.Areas;

/// <summary>The body of an area request (a GeoJSON polygon), read within the configured size limit.</summary>
public static class AreaBody
{
    /// <summary>The body's bytes, or the 413 problem when it is larger than <see cref="AtlasApiOptions.MaxRequestBodyBytes"/>.</summary>
    public static async Task<(byte[]? Body, ProblemHttpResult? Problem)> ReadAsync(HttpRequest request, AtlasApiOptions limits, CancellationToken cancel)
    {
        if (request.ContentLength > limits.MaxRequestBodyBytes)
            return (null, ApiProblems.TooLarge($"The body is {request.ContentLength} bytes; the limit is {limits.MaxRequestBodyBytes}. Simplify the polygon."));
        var body = await RequestBody.ReadAsync(request, limits.MaxRequestBodyBytes, cancel);
        return body is null
            ? (null, ApiProblems.TooLarge($"The body exceeds the limit of {limits.MaxRequestBodyBytes} bytes. Simplify the polygon."))
            : (body, null);
    }
}
