namespace Atlas.Vocabulary;

/// <summary>Writes an <see cref="AtlasPeriod"/> as its name ("jan", "djf", "annual", "y2019") and reads it back.</summary>
public sealed class AtlasPeriodJsonConverter : TextJsonConverter<AtlasPeriod>
{
    protected override string Expected => "a period name such as \"jan\", \"djf\", \"annual\" or \"y2019\"";

    protected override bool TryParse(string? text, out AtlasPeriod value) => AtlasPeriod.TryParse(text, out value);

    protected override string Format(AtlasPeriod value) => value.Name;
}
