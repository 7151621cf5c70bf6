namespace Atlas.Api.Model;

/// <summary>The two colour scales of the atlas.</summary>
public sealed record ColourScales(ColourScaleTable Sequential, ColourScaleTable Direction);

/// <summary>One colour scale: its name, whether it wraps round, how it is made and its table of #rrggbb colours.</summary>
public sealed record ColourScaleTable(string Name, bool Cyclic, string Description, string[] Colours);
