namespace Atlas.Assessment;

/// <summary>
/// Thrown by the CSV parsers once they have read the whole input, listing every problem found
/// (nothing is dropped silently and parsing does not stop at the first bad row).
/// </summary>
public sealed class CsvInputException : FormatException
{
    /// <summary>At most this many errors are spelled out in <see cref="Exception.Message"/>; <see cref="Errors"/> holds all.</summary>
    public const int ErrorsInMessage = 100;

    /// <summary>Creates the exception for a named source and its errors.</summary>
    public CsvInputException(string sourceName, IReadOnlyList<CsvInputError> errors)
        : base(ComposeMessage(sourceName, errors))
    {
        SourceName = sourceName;
        Errors = errors;
    }

    /// <summary>The name of the input (a file name or a label given by the caller).</summary>
    public string SourceName { get; }

    /// <summary>Every problem found, in line order.</summary>
    public IReadOnlyList<CsvInputError> Errors { get; }

    private static string ComposeMessage(string sourceName, IReadOnlyList<CsvInputError> errors)
    {
        var text = new System.Text.StringBuilder();
        text.Append(sourceName).Append(": ").Append(errors.Count).Append(errors.Count == 1 ? " error" : " errors");
        foreach (var error in errors.Take(ErrorsInMessage))
            text.Append('\n').Append("  ").Append(error);
        if (errors.Count > ErrorsInMessage)
            text.Append('\n').Append("  ... and ").Append(errors.Count - ErrorsInMessage).Append(" more (see Errors)");
        return text.ToString();
    }
}
