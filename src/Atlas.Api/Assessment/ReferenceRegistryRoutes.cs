namespace Atlas.Api.Assessment;

/// <summary>
/// The routes every registry of reference records has (stations, devices): list, one record by name or slug, register
/// one by upload, remove one. The handlers describe themselves (name, summary) with endpoint attributes.
/// </summary>
public static class ReferenceRegistryRoutes
{
    /// <param name="prefix">The collection's path, e.g. <c>/api/v1/devices</c>.</param>
    /// <param name="tag">The OpenAPI tag.</param>
    /// <param name="key">The route value naming one record, e.g. <c>device</c> (the handlers' parameter of that name).</param>
    /// <param name="uploadTypes">The media types an upload may have besides multipart/form-data.</param>
    public static IEndpointRouteBuilder MapReferenceRegistry<TRegistered>(this IEndpointRouteBuilder routes, string prefix, string tag, string key,
        Delegate list, Delegate describe, Delegate add, Delegate remove, params string[] uploadTypes)
    {
        var group = routes.MapGroup(prefix).WithTags(tag);
        group.MapGet("/", list);
        group.MapGet($"/{{{key}}}", describe).ProducesProblems(StatusCodes.Status404NotFound);
        group.MapPost("/", add).AcceptsUpload<TRegistered>(uploadTypes);
        group.MapDelete($"/{{{key}}}", remove).ProducesProblems(StatusCodes.Status404NotFound).RequireApiKey();
        return routes;
    }
}
