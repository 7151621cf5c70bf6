namespace Atlas.Api;

/// <summary>Builds the atlas web application: services, middleware, the endpoints and the map page.</summary>
public static class ApiHost
{
    public static WebApplication Build(string[] args)
    {
        var builder = WebApplication.CreateBuilder(args);
        builder.AddAtlasApi();
        var app = builder.Build();
        app.UseAtlasPipeline();
        app.MapHealthApi();
        app.MapOperationsApi();
        app.MapDatasetApi();
        app.MapLandMaskApi();
        app.MapColourScaleApi();
        app.MapPointApi();
        app.MapLayerApi();
        app.MapAreaApi();
        app.MapScreeningApi();
        app.MapAdminApi();
        app.MapAssessmentApis();
        app.MapReportApi();
        return app;
    }
}
