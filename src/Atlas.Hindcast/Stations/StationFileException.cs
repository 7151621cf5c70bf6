namespace Atlas.Hindcast.Stations;

/// <summary>
/// A station file that cannot be loaded, with every problem found (each naming the variable, index and time, or the
/// attribute at fault). The message starts with the file name.
/// </summary>
public sealed class StationFileException(string sourceName, IReadOnlyList<string> problems)
    : FormatException(Compose(sourceName, problems))
{
    /// <summary>At most this many problems are spelled out in the message; <see cref="Problems"/> holds all.</summary>
    public const int ProblemsInMessage = 100;

    public string SourceName { get; } = sourceName;

    public IReadOnlyList<string> Problems { get; } = problems;

    private static string Compose(string sourceName, IReadOnlyList<string> problems)
    {
        var lines = problems.Take(ProblemsInMessage).Select(p => "\n  " + p);
        var more = problems.Count > ProblemsInMessage ? $"\n  ... and {problems.Count - ProblemsInMessage} more" : "";
        return $"{sourceName}: {problems.Count} {(problems.Count == 1 ? "problem" : "problems")}{string.Concat(lines)}{more}";
    }
}
