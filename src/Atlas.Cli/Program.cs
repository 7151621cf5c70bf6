using System.CommandLine;
using System.CommandLine.Parsing;
using Atlas.Cli.Commands;
using Atlas.Storage;

ServerRuntimeSettings.ApplyTo(args);
var parsed = AtlasCommandLine.Build().Parse(args);
try
{
    return await parsed.InvokeAsync(new InvocationConfiguration { EnableDefaultExceptionHandler = false });
}
catch (DatabaseUnreachableException e)
{
    Console.Error.WriteLine($"{CommandName(parsed)}: {e.Message}");
    return DatabaseUnreachableException.ExitCode;
}
catch (OperationCanceledException)
{
    Console.Error.WriteLine($"{CommandName(parsed)}: cancelled.");
    return 130;
}
catch (Exception e)
{
    // What the command-line library's own handler prints, so that a failure nobody foresaw still shows its whole trace.
    Console.Error.WriteLine("Unhandled exception: " + e);
    return 1;
}

/// <summary>"atlas datasets list": the words that named the command, as the commands' own messages begin.</summary>
static string CommandName(ParseResult parsed)
{
    var names = new List<string>();
    for (var result = parsed.CommandResult; result.Parent is CommandResult parent; result = parent) names.Insert(0, result.Command.Name);
    return string.Join(' ', names.Prepend("atlas"));
}
