namespace Atlas.Vocabulary;

/// <summary>Trade symbols and units of <see cref="WaveParameter"/>, as used in URLs, file names and metadata.</summary>
public static class WaveParameterNames
{
    private static readonly NameTable<WaveParameter> Symbols = new("wave parameter", ["hs", "te", "tp", "j", "dir", "spread", "d", "depth"]);
    private static readonly string[] Units = ["m", "s", "s", "kW/m", "degree", "degree", "1", "m"];

    /// <summary>Every parameter, in declaration order.</summary>
    public static IReadOnlyList<WaveParameter> All { get; } = Enum.GetValues<WaveParameter>();

    /// <summary>The trade symbol: "hs", "te", "tp", "j", "dir", "spread", "d", "depth".</summary>
    public static string Symbol(this WaveParameter parameter) => Symbols.NameOf(parameter);

    /// <summary>The unit (UDUNITS spelling): m, s, s, kW/m, degree, degree, 1, m.</summary>
    public static string Unit(this WaveParameter parameter) => Units[Symbols.IndexOf(parameter)];

    /// <summary>Parses a trade symbol, ignoring case.</summary>
    /// <exception cref="FormatException">The text is not one of the symbols; the message lists them.</exception>
    public static WaveParameter Parse(string text) => Symbols.Parse(text);

    /// <summary>Parses a trade symbol, ignoring case; false for anything else, including null.</summary>
    public static bool TryParse(string? text, out WaveParameter parameter) => Symbols.TryParse(text, out parameter);
}
