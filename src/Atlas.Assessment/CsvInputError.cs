namespace Atlas.Assessment;

/// <summary>One problem found in a CSV input.</summary>
/// <param name="LineNumber">1-based line number in the input.</param>
/// <param name="ColumnNumber">1-based column number, or null when the problem concerns the whole line.</param>
/// <param name="Message">What was wrong, naming the field and the offending text.</param>
public sealed record CsvInputError(int LineNumber, int? ColumnNumber, string Message)
{
    /// <summary>"line 4, column 2: ..." or "line 4: ...".</summary>
    public override string ToString() =>
        ColumnNumber is { } column ? $"line {LineNumber}, column {column}: {Message}" : $"line {LineNumber}: {Message}";
}
