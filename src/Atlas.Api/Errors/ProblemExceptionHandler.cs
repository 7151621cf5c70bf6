using Microsoft.AspNetCore.Mvc;
using Microsoft.AspNetCore.Diagnostics;

namespace Atlas.Api.Errors;

/// <summary>
/// Turns exceptions into problem details: a database outage is 503 with Retry-After, a malformed request that the
/// framework rejected keeps its status, a value the database cannot take as text (a NUL) is 400, anything else is 500
/// without internals.
/// </summary>
public sealed partial class ProblemExceptionHandler(IProblemDetailsService problems, ILogger<ProblemExceptionHandler> logger) : IExceptionHandler
{
    public const int RetryAfterSeconds = 10;

    public async ValueTask<bool> TryHandleAsync(HttpContext context, Exception exception, CancellationToken cancel)
    {
        ProblemDetails problem;
        if (DatabaseOutage.Is(exception))
        {
            DatabaseUnavailable(logger, context.Request.Path, exception);
            context.Response.StatusCode = StatusCodes.Status503ServiceUnavailable;
            context.Response.Headers.RetryAfter = RetryAfterSeconds.ToString(System.Globalization.CultureInfo.InvariantCulture);
            problem = new ProblemDetails
            {
                Status = 503,
                Title = "The database is unavailable",
                Detail = $"The atlas database cannot be reached just now. Retry in {RetryAfterSeconds} seconds; if this persists, " +
                         "the operator should check that the database server is running (atlas db status).",
            };
        }
        else if (exception is BadHttpRequestException bad)
        {
            context.Response.StatusCode = bad.StatusCode;
            problem = new ProblemDetails
            {
                Status = bad.StatusCode,
                Title = bad.StatusCode == 413 ? "The request body is too large" : "The request could not be read",
                Detail = bad.Message,
            };
        }
        else if (exception is Npgsql.PostgresException { SqlState: "22021" or "22P05" })
        {
            // A request value PostgreSQL cannot take as text, in practice a NUL character (%00) in a name or query value.
            context.Response.StatusCode = StatusCodes.Status400BadRequest;
            problem = new ProblemDetails
            {
                Status = 400,
                Title = "The request holds a character that is not accepted",
                Detail = "A value of this request contains a NUL character (%00) or another character that is not valid text; remove it and retry.",
            };
        }
        else if (exception is OperationCanceledException && context.RequestAborted.IsCancellationRequested)
        {
            return true;
        }
        else
        {
            UnhandledError(logger, context.Request.Path, exception);
            context.Response.StatusCode = 500;
            problem = new ProblemDetails
            {
                Status = 500,
                Title = "Internal error",
                Detail = "The server failed while answering this request; the error is logged with the trace id below.",
            };
        }
        return await problems.TryWriteAsync(new ProblemDetailsContext { HttpContext = context, ProblemDetails = problem, Exception = exception });
    }

    [LoggerMessage(EventId = 1, Level = LogLevel.Warning, Message = "Database unavailable while serving {Path}")]
    private static partial void DatabaseUnavailable(ILogger logger, string path, Exception exception);

    [LoggerMessage(EventId = 2, Level = LogLevel.Error, Message = "Unhandled error while serving {Path}")]
    private static partial void UnhandledError(ILogger logger, string path, Exception exception);
}
