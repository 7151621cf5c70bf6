namespace Atlas.Api.Security;

/// <summary>Lets a write endpoint run only with a valid <c>X-Api-Key</c> header.</summary>
public sealed class ApiKeyFilter(ApiKeyVerifier verifier) : IEndpointFilter
{
    public async ValueTask<object?> InvokeAsync(EndpointFilterInvocationContext context, EndpointFilterDelegate next)
    {
        if (!verifier.HasKeys)
            return TypedResults.Problem(statusCode: 403, title: "Write endpoints are disabled",
                detail: "This server has no API key configured (AtlasApiOptions:ApiKeySha256), so it accepts no writes.");
        var headers = context.HttpContext.Request.Headers;
        if (!headers.TryGetValue(ApiKeyVerifier.HeaderName, out var values) || values.Count != 1 || string.IsNullOrEmpty(values[0]))
        {
            context.HttpContext.Response.Headers.WWWAuthenticate = "ApiKey header=\"X-Api-Key\"";
            return TypedResults.Problem(statusCode: 401, title: "API key required",
                detail: $"This endpoint changes stored data: send your API key in the {ApiKeyVerifier.HeaderName} header (exactly once).");
        }
        if (!verifier.Accepts(values[0]))
        {
            context.HttpContext.Response.Headers.WWWAuthenticate = "ApiKey header=\"X-Api-Key\"";
            return TypedResults.Problem(statusCode: 401, title: "API key not accepted",
                detail: $"The key in the {ApiKeyVerifier.HeaderName} header is not one this server accepts; check it with the operator.");
        }
        return await next(context);
    }
}

public static class ApiKeyEndpoints
{
    /// <summary>Lets the endpoint run only with a valid API key, and documents the 401 and 403 problem answers.</summary>
    public static RouteHandlerBuilder RequireApiKey(this RouteHandlerBuilder endpoint) =>
        endpoint.AddEndpointFilter<ApiKeyFilter>()
            .ProducesProblem(StatusCodes.Status401Unauthorized)
            .ProducesProblem(StatusCodes.Status403Forbidden);
}
