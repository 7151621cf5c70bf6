using Microsoft.AspNetCore.Http.HttpResults;

namespace Atlas.Api.Infrastructure;

/// <summary>The problem responses shared by several endpoints, worded to say what to change.</summary>
public static class ApiProblems
{
    public static ProblemHttpResult UnknownDataset(string slug) =>
        TypedResults.Problem(statusCode: 404, title: "Unknown dataset",
            detail: $"There is no dataset '{slug}'. GET /api/v1/datasets lists the datasets this server holds.");

    public static ProblemHttpResult Unprocessable(string title, string detail) =>
        TypedResults.Problem(statusCode: 422, title: title, detail: detail);

    public static ProblemHttpResult NotFound(string title, string detail) =>
        TypedResults.Problem(statusCode: 404, title: title, detail: detail);

    public static ProblemHttpResult TooLarge(string detail) =>
        TypedResults.Problem(statusCode: 413, title: "The request is too large", detail: detail);
}
