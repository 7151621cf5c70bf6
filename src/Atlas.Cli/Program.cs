using Atlas.Cli.Commands;

return await AtlasCommandLine.Build().Parse(args).InvokeAsync();
