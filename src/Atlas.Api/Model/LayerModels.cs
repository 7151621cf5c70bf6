namespace Atlas.Api.Model;

/// <summary>What layers a dataset offers and how to fetch them.</summary>
public sealed record LayerCatalogue(
    string Dataset,
    string HrefTemplate,
    IReadOnlyList<string> Formats,
    IReadOnlyList<LayerStatisticItem> Statistics,
    IReadOnlyList<LayerParameterItem> Parameters,
    string PercentileNote,
    string Caution);

public sealed record LayerStatisticItem(string Name, string Description);

/// <summary>A parameter with stored statistics: the periods it has, its unit, and its histogram bin width.</summary>
public sealed record LayerParameterItem(string Symbol, string Name, string Units, IReadOnlyList<string> Statistics,
    IReadOnlyList<string> Periods, double? PercentileBinWidth, string ExampleHref);
