namespace Atlas.Api.Assessment;

/// <summary>
/// <c>/api/v1/datasets/{slug}/point/yield</c>, <c>/point/windows</c>, <c>/point/extremes</c>: device production, weather
/// windows and extreme Hs from the exact series of the wet cell nearest a position.
/// </summary>
public static class PointAssessmentApi
{
    public static IEndpointRouteBuilder MapPointAssessmentApi(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/v1/datasets/{slug}/point").WithTags("Points");
        group.MapGet("/yield", YieldAsync)
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();
        group.MapGet("/windows", WindowsAsync)
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();
        group.MapGet("/extremes", ExtremesAsync)
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();
        return routes;
    }

    [EndpointName("PointYield")]
    [EndpointSummary("A device's energy production at the wet cell nearest a position")]
    [EndpointDescription(
        "lat, lon: degrees. device: a stored device's name or slug. interpolation: bilinear (default) or nearest. from, to: calendar years " +
        "(inclusive). Mean annual energy (MWh/yr), capacity factor, production per calendar month and per year with the inter-annual " +
        "coefficient of variation, and the share of time the sea state lies outside the matrix (counted at 0 kW).")]
    public static async Task<Results<Ok<PointYield>, ProblemHttpResult, ValidationProblem>> YieldAsync(
        string slug, [AsParameters] PointPosition at, [AsParameters] PointYieldQuery query,
        PointAssessments assessments, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var position = at.Position(errors);
        var window = at.Window(errors);
        var device = query.DeviceName(errors);
        var reading = MatrixInterpolationQuery.Read(query.Interpolation, errors);
        if (errors.Count > 0 || position is null || window is null) return TypedResults.ValidationProblem(errors, title: "The yield request has invalid query values");

        var (stored, unknown) = await assessments.FindDeviceAsync(device!, cancel);
        if (stored is null) return unknown!;
        var (context, problem) = await assessments.ReadAsync(slug, position.Value, window, cancel);
        if (context is null) return problem!;
        var (answer, failure) = await assessments.YieldAsync(context, stored, reading, cancel);
        return answer is null ? failure! : TypedResults.Ok(answer);
    }

    [EndpointName("PointWindows")]
    [EndpointSummary("Weather windows for access limits at the wet cell nearest a position")]
    [EndpointDescription(
        "lat, lon: degrees. hs_max: the Hs limit, m. tp_max (optional): the Tp limit, s. hours: the duration an operation needs. from, to: " +
        "calendar years. Per calendar month: the probability that a window starts at a random time, the mean number of windows, the mean " +
        "waiting time for the next window start; calm and storm spell persistence; the share of time within limits.")]
    public static async Task<Results<Ok<PointWindows>, ProblemHttpResult, ValidationProblem>> WindowsAsync(
        string slug, [AsParameters] PointPosition at, [AsParameters] AccessLimitsQuery query,
        PointAssessments assessments, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var position = at.Position(errors);
        var window = at.Window(errors);
        var limits = query.Limits(errors);
        var duration = query.Duration("the duration the operation needs, in hours", errors, required: true);
        if (errors.Count > 0 || position is null || window is null || limits is null || duration is null)
            return TypedResults.ValidationProblem(errors, title: "The windows request has invalid query values");

        var (context, problem) = await assessments.ReadAsync(slug, position.Value, window, cancel);
        if (context is null) return problem!;
        var (answer, failure) = await assessments.WindowsAsync(context, limits, duration.Value, cancel);
        return answer is null ? failure! : TypedResults.Ok(answer);
    }

    [EndpointName("PointExtremes")]
    [EndpointSummary("Extreme Hs return levels at the wet cell nearest a position")]
    [EndpointDescription(
        "lat, lon: degrees. method: annual-maxima (Gumbel and GEV by maximum likelihood), peaks-over-threshold (GPD on runs-declustered " +
        "storm peaks), or both when left out. threshold (m) or threshold_quantile (default 0.99) and separation_hours (default 48) for " +
        "peaks over threshold. Return levels for 1, 5, 10, 50 and 100 years with 95 % profile-likelihood intervals, the fit against the " +
        "data (probability-plot points) and cautions, strongest first in strong_caution when the record is short for the return period.")]
    public static async Task<Results<Ok<PointExtremes>, ProblemHttpResult, ValidationProblem>> ExtremesAsync(
        string slug, [AsParameters] PointPosition at, [AsParameters] PointExtremesQuery query,
        PointAssessments assessments, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var position = at.Position(errors);
        var window = at.Window(errors);
        var method = query.OneMethod(errors);
        var pot = query.PeaksOptions(errors);
        if (errors.Count > 0 || position is null || window is null) return TypedResults.ValidationProblem(errors, title: "The extremes request has invalid query values");

        var (context, problem) = await assessments.ReadAsync(slug, position.Value, window, cancel);
        if (context is null) return problem!;
        var (answer, failure) = await assessments.ExtremesAsync(context, method, pot, cancel);
        return answer is null ? failure! : TypedResults.Ok(answer);
    }
}
