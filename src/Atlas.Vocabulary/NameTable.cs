namespace Atlas.Vocabulary;

/// <summary>
/// The names of an enum's values in declaration order, as written in URLs, file names and metadata: looked up by
/// value, parsed ignoring case and surrounding blanks; an unknown name's error lists the known ones.
/// </summary>
internal sealed class NameTable<T>(string what, string[] names) where T : struct, Enum
{
    public IReadOnlyList<string> Names => names;

    public string NameOf(T value) => names[IndexOf(value)];

    /// <summary>The value's position in declaration order (the enums of the vocabulary are ints counted from 0).</summary>
    public int IndexOf(T value)
    {
        int i = System.Runtime.CompilerServices.Unsafe.As<T, int>(ref value);
        return (uint)i < (uint)names.Length ? i : throw new ArgumentOutOfRangeException(nameof(value), value, $"Unknown {what}.");
    }

    public T Parse(string text) =>
        TryParse(text, out T value) ? value : throw new FormatException($"Unknown {what} '{text}': expected one of {string.Join(", ", names)}.");

    public bool TryParse(string? text, out T value)
    {
        int i = text is null ? -1 : Array.FindIndex(names, s => string.Equals(s, text.Trim(), StringComparison.OrdinalIgnoreCase));
        value = i < 0 ? default : (T)Enum.ToObject(typeof(T), i);
        return i >= 0;
    }
}
