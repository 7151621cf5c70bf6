namespace Atlas.Api.Errors;

/// <summary>The problem responses shared by several endpoints, worded to say what to change; every "not found" is here.</summary>
public static class ApiProblems
{
    public static ProblemHttpResult UnknownDataset(string slug) =>
        TypedResults.Problem(statusCode: 404, title: "Unknown dataset",
            detail: $"There is no dataset '{slug}'. GET /api/v1/datasets lists the datasets this server holds.");

    public static ProblemHttpResult UnknownStation(string station) =>
        NotFound("Unknown station", $"There is no station '{station}'. GET /api/v1/stations lists the registered stations.");

    public static ProblemHttpResult UnknownDevice(string device) =>
        NotFound("Unknown device", $"There is no device '{device}'. GET /api/v1/devices lists the stored devices.");

    public static ProblemHttpResult Unprocessable(string title, string detail) =>
        TypedResults.Problem(statusCode: 422, title: title, detail: detail);

    public static ProblemHttpResult NotFound(string title, string detail) =>
        TypedResults.Problem(statusCode: 404, title: title, detail: detail);

    public static ProblemHttpResult Conflict(string title, string detail) =>
        TypedResults.Problem(statusCode: 409, title: title, detail: detail);

    public static ProblemHttpResult TooLarge(string detail) =>
        TypedResults.Problem(statusCode: 413, title: "The request is too large", detail: detail);
}
