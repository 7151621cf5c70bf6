namespace Atlas.Api.Operations;

/// <summary>
/// Gives every request one id, echoed in the <c>X-Request-Id</c> response header, carried by problem details as
/// <c>trace_id</c>, and put in the log scope of everything logged while serving it. A client or proxy may send its
/// own id in <c>X-Request-Id</c>; it is adopted when it is 1 to 64 characters of letters, digits and <c>-._:</c>
/// (anything else, such as a header stuffed with markup or newlines, is ignored and the server's own id is used).
/// </summary>
public static class RequestIds
{
    public const string HeaderName = "X-Request-Id";
    public const int MaxLength = 64;

    public static IApplicationBuilder UseRequestIds(this IApplicationBuilder app) => app.Use(async (context, next) =>
    {
        var incoming = context.Request.Headers[HeaderName];
        var adopted = incoming.Count == 1 && IsAcceptable(incoming[0]);
        if (adopted) context.TraceIdentifier = incoming[0]!;
        var id = context.TraceIdentifier;
        context.Response.OnStarting(() =>
        {
            context.Response.Headers[HeaderName] = id;
            return Task.CompletedTask;
        });
        // The host's own scope already holds RequestId for the server's id; an adopted id needs a scope of its own.
        var logger = context.RequestServices.GetRequiredService<ILoggerFactory>().CreateLogger("Atlas.Api.Requests");
        using (adopted ? logger.BeginScope(new Dictionary<string, object> { ["RequestId"] = id }) : null)
            await next(context);
    });

    public static bool IsAcceptable(string? id) =>
        id is { Length: > 0 and <= MaxLength } && id.All(c => char.IsAsciiLetterOrDigit(c) || c is '-' or '.' or '_' or ':');
}
