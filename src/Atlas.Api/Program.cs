var app = Atlas.Api.ApiHost.Build(args);
app.Run();
