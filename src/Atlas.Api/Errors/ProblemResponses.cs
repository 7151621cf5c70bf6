namespace Atlas.Api.Errors;

/// <summary>
/// Declares in the OpenAPI document the problem answers (application/problem+json, RFC 9457) that an endpoint gives
/// through <see cref="ApiProblems"/>: a <c>ProblemHttpResult</c> carries its status only at run time, so the
/// endpoint states them here (400 validation problems are declared by their typed result).
/// </summary>
public static class ProblemResponses
{
    public static RouteHandlerBuilder ProducesProblems(this RouteHandlerBuilder endpoint, params int[] statuses)
    {
        foreach (var status in statuses) endpoint.ProducesProblem(status);
        return endpoint;
    }
}
