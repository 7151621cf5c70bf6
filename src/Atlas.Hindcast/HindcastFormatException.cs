namespace Atlas.Hindcast;

/// <summary>
/// A hindcast file that cannot be used as it stands: unreadable, truncated, missing a required variable,
/// with units that cannot be converted, or with a bad time axis. The message reads
/// "file.nc: variable 'hs': problem" (or "file.nc: problem" when no variable is at fault).
/// </summary>
public class HindcastFormatException : Exception
{
    public HindcastFormatException(string file, string? variable, string problem, Exception? inner = null)
        : base(Compose(file, variable, problem), inner)
    {
        File = file;
        Variable = variable;
        Problem = problem;
    }

    /// <summary>The path of the file, as it was given.</summary>
    public string File { get; }

    /// <summary>The variable at fault, or null when the problem is the file as a whole.</summary>
    public string? Variable { get; }

    /// <summary>What was wrong, without the file and variable prefix.</summary>
    public string Problem { get; }

    private static string Compose(string file, string? variable, string problem) =>
        variable is null ? $"{file}: {problem}" : $"{file}: variable '{variable}': {problem}";
}
