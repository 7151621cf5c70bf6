namespace Atlas.Api.Downloads;

/// <summary>
/// Declares a download's 200 answer in the OpenAPI document: a file result carries no type the document can read, so
/// the endpoint states its media types here (the body is a binary string whatever the format).
/// </summary>
public static class FileResponses
{
    public static RouteHandlerBuilder ProducesFile(this RouteHandlerBuilder endpoint, string contentType, params string[] additionalContentTypes) =>
        endpoint.Produces(StatusCodes.Status200OK, typeof(Stream), contentType, additionalContentTypes);
}
