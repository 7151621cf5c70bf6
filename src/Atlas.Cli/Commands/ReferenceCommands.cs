using System.CommandLine;
using Atlas.Storage;
using Npgsql;

namespace Atlas.Cli.Commands;

/// <summary>The parts <c>atlas stations</c> and <c>atlas devices</c> share: the add|list|remove group and the remove verb.</summary>
internal static class ReferenceCommands
{
    public static Command Group(string name, string description, params Command[] verbs)
    {
        var command = new Command(name, description);
        foreach (var verb in verbs) command.Subcommands.Add(verb);
        return command;
    }

    /// <summary><c>atlas GROUP remove NAME</c>: deletes by name or slug, or says there is none (exit code 2).</summary>
    /// <param name="group">The command group (stations, devices).</param>
    /// <param name="item">One of them (station, device).</param>
    /// <param name="removed">What the success line says after the name (e.g. "removed with its record").</param>
    public static Command Remove(string group, string item, string description, string removed,
        Func<NpgsqlDataSource, string, CancellationToken, Task<bool>> deleteAsync)
    {
        var name = new Argument<string>("name") { Description = $"The {item}'s name or slug" };
        var command = new Command("remove", description) { name };
        command.SetAction(async (parse, cancel) =>
        {
            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            if (await deleteAsync(dataSource, parse.GetValue(name)!, cancel))
            {
                Console.WriteLine($"{item} {parse.GetValue(name)}: {removed}");
                return 0;
            }
            Console.Error.WriteLine($"atlas {group} remove: there is no {item} '{parse.GetValue(name)}' (atlas {group} list)");
            return 2;
        });
        return command;
    }
}
