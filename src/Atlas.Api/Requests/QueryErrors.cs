namespace Atlas.Api.Requests;

/// <summary>
/// The faults found in one request's values, by query or form name, in the shape a validation problem (RFC 9457,
/// status 400) carries them.
/// </summary>
public sealed class QueryErrors : Dictionary<string, string[]>
{
    public void Add(string name, string message) => this[name] = [message];

    /// <summary>The value when it is one of <paramref name="allowed"/> (null when left out), else an error naming the choices.</summary>
    public string? Choice(string name, string? text, string what, params string[] allowed)
    {
        if (text is null || allowed.Contains(text)) return text;
        Add(name, $"'{text}' is not a {what}: use {Choices(allowed)}.");
        return null;
    }

    private static string Choices(string[] allowed) =>
        allowed.Length == 1 ? allowed[0] : string.Join(", ", allowed[..^1]) + " or " + allowed[^1];
}
