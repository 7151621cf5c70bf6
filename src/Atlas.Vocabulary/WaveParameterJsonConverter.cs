namespace Atlas.Vocabulary;

/// <summary>Writes a <see cref="WaveParameter"/> as its trade symbol ("hs", "j", ...) and reads it back.</summary>
public sealed class WaveParameterJsonConverter : TextJsonConverter<WaveParameter>
{
    protected override string Expected => "a wave parameter symbol such as \"hs\" or \"j\"";

    protected override bool TryParse(string? text, out WaveParameter value) => WaveParameterNames.TryParse(text, out value);

    protected override string Format(WaveParameter value) => value.Symbol();
}
