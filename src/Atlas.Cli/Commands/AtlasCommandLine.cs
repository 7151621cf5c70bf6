using System.CommandLine;

namespace Atlas.Cli.Commands;

/// <summary>The <c>atlas</c> command: one sub-command per job, each in its own file.</summary>
public static class AtlasCommandLine
{
    public static RootCommand Build()
    {
        var root = new RootCommand("Wave-resource atlas: load hindcast fields, compute resource statistics, serve them.");
        root.Subcommands.Add(DemoCommand.Build());
        root.Subcommands.Add(IngestCommand.Build());
        root.Subcommands.Add(StatsCommand.Build());
        root.Subcommands.Add(DatasetsCommand.Build());
        root.Subcommands.Add(ServeCommand.Build());
        root.Subcommands.Add(WorkerCommand.Build());
        root.Subcommands.Add(JobsCommand.Build());
        root.Subcommands.Add(DatabaseCommands.Build());
        root.Subcommands.Add(StationsCommand.Build());
        root.Subcommands.Add(DevicesCommand.Build());
        root.Subcommands.Add(ValidateCommand.Build());
        root.Subcommands.Add(ReportCommand.Build());
        return root;
    }
}
