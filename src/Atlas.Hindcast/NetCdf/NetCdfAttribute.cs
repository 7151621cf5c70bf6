using System.Globalization;

namespace Atlas.Hindcast;

/// <summary>
/// An attribute as stored: text attributes (NC_CHAR, NC_STRING) carry <see cref="Text"/>, numeric attributes carry
/// <see cref="Values"/> converted to double (exact for every type but 64-bit integers beyond 2^53).
/// </summary>
public sealed class NetCdfAttribute
{
    public NetCdfAttribute(string name, NetCdfType type, string? text, double[] values)
    {
        Name = name;
        Type = type;
        Text = text;
        Values = values;
    }

    public string Name { get; }

    /// <summary>The stored type; user-defined types are reported by their numeric code and carry no values.</summary>
    public NetCdfType Type { get; }

    /// <summary>The text of a char or string attribute (several strings joined by a comma), otherwise null.</summary>
    public string? Text { get; }

    /// <summary>Numeric values; empty for text attributes.</summary>
    public IReadOnlyList<double> Values { get; }

    public bool IsText => Text is not null;

    public override string ToString() =>
        Text is not null ? $"{Name} = \"{Text}\"" : $"{Name} = {string.Join(", ", Values.Select(v => v.ToString("R", CultureInfo.InvariantCulture)))}";
}
