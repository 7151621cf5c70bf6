using System.Globalization;

namespace Atlas.Hindcast;

/// <summary>
/// An attribute as stored: text attributes (NC_CHAR, NC_STRING) carry <see cref="Text"/>, numeric attributes carry
/// <see cref="Values"/> converted to double (exact for every type but 64-bit integers beyond 2^53).
/// </summary>
/// <param name="Name">The attribute's name.</param>
/// <param name="Type">The stored type; user-defined types are reported by their numeric code and carry no values.</param>
/// <param name="Text">The text of a char or string attribute (several strings joined by a comma), otherwise null.</param>
/// <param name="Values">Numeric values; empty for text attributes.</param>
public sealed record NetCdfAttribute(string Name, NetCdfType Type, string? Text, IReadOnlyList<double> Values)
{
    public bool IsText => Text is not null;

    public override string ToString() =>
        Text is not null ? $"{Name} = \"{Text}\"" : $"{Name} = {string.Join(", ", Values.Select(v => v.ToString("R", CultureInfo.InvariantCulture)))}";
}
