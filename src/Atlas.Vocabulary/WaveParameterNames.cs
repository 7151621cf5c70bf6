namespace Atlas.Vocabulary;

/// <summary>Trade symbols and units of <see cref="WaveParameter"/>, as used in URLs, file names and metadata.</summary>
public static class WaveParameterNames
{
    private static readonly string[] Symbols = ["hs", "te", "tp", "j", "dir", "spread", "d", "depth"];
    private static readonly string[] Units = ["m", "s", "s", "kW/m", "degree", "degree", "1", "m"];

    /// <summary>Every parameter, in declaration order.</summary>
    public static IReadOnlyList<WaveParameter> All { get; } = Enum.GetValues<WaveParameter>();

    /// <summary>The trade symbol: "hs", "te", "tp", "j", "dir", "spread", "d", "depth".</summary>
    public static string Symbol(this WaveParameter parameter) => Symbols[Index(parameter)];

    /// <summary>The unit (UDUNITS spelling): m, s, s, kW/m, degree, degree, 1, m.</summary>
    public static string Unit(this WaveParameter parameter) => Units[Index(parameter)];

    /// <summary>Parses a trade symbol, ignoring case.</summary>
    /// <exception cref="FormatException">The text is not one of the symbols; the message lists them.</exception>
    public static WaveParameter Parse(string text) =>
        TryParse(text, out WaveParameter parameter)
            ? parameter
            : throw new FormatException($"Unknown wave parameter '{text}': expected one of {string.Join(", ", Symbols)}.");

    /// <summary>Parses a trade symbol, ignoring case; false for anything else, including null.</summary>
    public static bool TryParse(string? text, out WaveParameter parameter)
    {
        int i = text is null ? -1 : Array.FindIndex(Symbols, s => string.Equals(s, text.Trim(), StringComparison.OrdinalIgnoreCase));
        parameter = i < 0 ? default : (WaveParameter)i;
        return i >= 0;
    }

    private static int Index(WaveParameter parameter) =>
        (uint)parameter < (uint)Symbols.Length ? (int)parameter : throw new ArgumentOutOfRangeException(nameof(parameter), parameter, "Unknown wave parameter.");
}
