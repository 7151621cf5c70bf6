using System.CommandLine;
using Atlas.Storage;
using Npgsql;

namespace Atlas.Cli.Commands;

/// <summary>The parts <c>atlas stations</c> and <c>atlas devices</c> share: the add|list|remove group and its verbs' frames.</summary>
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

    /// <summary>
    /// Gives <c>atlas GROUP add</c> its action: stores what <paramref name="addAsync"/> reads and prints the line it
    /// returns (exit code 0); a bad or missing file, a bad value or a name already taken (<typeparamref name="TDuplicate"/>)
    /// is reported with "Nothing was stored." (exit code 2).
    /// </summary>
    public static Command Add<TDuplicate>(string group, Command add, Func<ParseResult, NpgsqlDataSource, CancellationToken, Task<string>> addAsync)
        where TDuplicate : Exception
    {
        add.SetAction(async (parse, cancel) =>
        {
            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            try
            {
                Console.WriteLine(await addAsync(parse, dataSource, cancel));
                return 0;
            }
            catch (Exception e) when (e is FormatException or ArgumentException or FileNotFoundException or TDuplicate)
            {
                Console.Error.WriteLine($"atlas {group} add: {e.Message}");
                Console.Error.WriteLine("Nothing was stored.");
                return 2;
            }
        });
        return add;
    }

    /// <summary><c>atlas GROUP list</c>: one line an item, or <paramref name="none"/> when there is none.</summary>
    public static Command List<T>(string description, string none,
        Func<NpgsqlDataSource, CancellationToken, Task<IReadOnlyList<T>>> listAsync, Func<T, string> line)
    {
        var command = new Command("list", description);
        command.SetAction(async (_, cancel) =>
        {
            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            var items = await listAsync(dataSource, cancel);
            if (items.Count == 0) Console.WriteLine(none);
            foreach (var item in items) Console.WriteLine(line(item));
            return 0;
        });
        return command;
    }
}
