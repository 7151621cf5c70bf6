namespace Atlas.Api.Assessment;

/// <summary>The assessment endpoints: stations and validation, devices and yield, weather windows, extremes, assessment layers.</summary>
public static class AssessmentApis
{
    public static IEndpointRouteBuilder MapAssessmentApis(this IEndpointRouteBuilder routes)
    {
        routes.MapStationApi();
        routes.MapValidationApi();
        routes.MapDeviceApi();
        routes.MapPointAssessmentApi();
        routes.MapAssessmentLayerApi();
        return routes;
    }
}
