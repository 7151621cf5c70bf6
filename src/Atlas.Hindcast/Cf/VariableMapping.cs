using System.Text.Json;

namespace Atlas.Hindcast;

/// <summary>
/// Per-dataset variable names for files whose variables lack CF standard names (or carry ones that do not say which
/// is which). Read from JSON:
/// <code>
/// { "hs": "swh", "te": "t_m10", "tp": "tpk", "dir": "mwd", "spread": "spr", "depth": "dpt",
///   "depth_positive": "down", "time": "time", "units": { "hs": "cm", "dir": "radians" } }
/// </code>
/// Use "dir_to" instead of "dir" for a direction the waves travel towards (converted to "from" by +180 degrees).
/// "depth_positive": "up" marks an elevation (sea floor negative). "units" supplies or overrides units strings.
/// A mapped name always wins over a standard_name search, but a mapping that contradicts the variable's own
/// standard_name (for instance "te" naming a first-moment period Tm01) is refused.
/// </summary>
public sealed class VariableMapping
{
    private static readonly Dictionary<string, WaveParameter> Keys = new(StringComparer.Ordinal)
    {
        ["hs"] = WaveParameter.Hs,
        ["te"] = WaveParameter.Te,
        ["tp"] = WaveParameter.Tp,
        ["dir"] = WaveParameter.Dir,
        ["dir_to"] = WaveParameter.Dir,
        ["spread"] = WaveParameter.Spread,
        ["depth"] = WaveParameter.Depth,
    };

    public VariableMapping(
        IReadOnlyDictionary<WaveParameter, string> names,
        IReadOnlyDictionary<WaveParameter, string>? units = null,
        bool directionIsTowards = false,
        bool? depthPositiveUp = null,
        string? timeVariable = null,
        string source = "variable mapping")
    {
        Names = names;
        Units = units ?? new Dictionary<WaveParameter, string>();
        DirectionIsTowards = directionIsTowards;
        DepthPositiveUp = depthPositiveUp;
        TimeVariable = timeVariable;
        Source = source;
    }

    /// <summary>Variable name in the file for each mapped wave variable.</summary>
    public IReadOnlyDictionary<WaveParameter, string> Names { get; }

    /// <summary>Units strings that replace (or supply missing) units attributes.</summary>
    public IReadOnlyDictionary<WaveParameter, string> Units { get; }

    /// <summary>True when the mapped direction is the direction the waves travel to ("dir_to").</summary>
    public bool DirectionIsTowards { get; }

    /// <summary>True for an elevation (positive up), false for a depth (positive down), null to follow the file.</summary>
    public bool? DepthPositiveUp { get; }

    /// <summary>Name of the time coordinate variable, or null to find it by its units.</summary>
    public string? TimeVariable { get; }

    /// <summary>Name of a point file's spectral density variable, or null to find it by its standard name.</summary>
    public string? Spectrum { get; init; }

    /// <summary>Name of a point file's frequency coordinate, or null to find it by its standard name or name.</summary>
    public string? Frequency { get; init; }

    /// <summary>Name of a point file's direction coordinate, or null to find it by its standard name.</summary>
    public string? SpectrumDirection { get; init; }

    /// <summary>True when the mapped direction coordinate gives the direction the waves travel to.</summary>
    public bool SpectrumDirectionIsTowards { get; init; }

    /// <summary>Water depth of output points by station name, m positive down (used where the file gives none, and
    /// over the file's value when given).</summary>
    public IReadOnlyDictionary<string, double> StationDepths { get; init; } = new Dictionary<string, double>();

    /// <summary>Where the mapping came from (its file path), for error messages.</summary>
    public string Source { get; }

    /// <summary>Reads a mapping file; a malformed file throws <see cref="HindcastFormatException"/> naming it and the key.</summary>
    public static VariableMapping Load(string path) => Parse(File.ReadAllText(path), path);

    public static VariableMapping Parse(string json, string source = "variable mapping")
    {
        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(json, new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
        }
        catch (JsonException e)
        {
            throw new HindcastFormatException(source, null, $"not valid JSON: {e.Message}", e);
        }
        using (document)
        {
            if (document.RootElement.ValueKind != JsonValueKind.Object)
                throw new HindcastFormatException(source, null, "a variable mapping must be a JSON object");
            var names = new Dictionary<WaveParameter, string>();
            var units = new Dictionary<WaveParameter, string>();
            bool towards = false;
            bool? positiveUp = null;
            string? time = null;
            string? spectrum = null, frequency = null, spectrumDirection = null;
            bool spectrumTowards = false;
            var stationDepths = new Dictionary<string, double>(StringComparer.Ordinal);
            foreach (var property in document.RootElement.EnumerateObject())
            {
                string key = property.Name;
                if (Keys.TryGetValue(key, out var variable))
                {
                    if (names.ContainsKey(variable))
                        throw new HindcastFormatException(source, key, "gives the direction twice (use either 'dir' or 'dir_to')");
                    names[variable] = Text(property, source);
                    if (key == "dir_to") towards = true;
                }
                else if (key == "time") time = Text(property, source);
                else if (key == "spectrum") spectrum = Text(property, source);
                else if (key == "frequency") frequency = Text(property, source);
                else if (key is "spectrum_direction" or "spectrum_direction_to")
                {
                    if (spectrumDirection is not null)
                        throw new HindcastFormatException(source, key, "gives the spectrum's direction twice (use either 'spectrum_direction' or 'spectrum_direction_to')");
                    spectrumDirection = Text(property, source);
                    spectrumTowards = key == "spectrum_direction_to";
                }
                else if (key == "station_depths_m")
                {
                    if (property.Value.ValueKind != JsonValueKind.Object)
                        throw new HindcastFormatException(source, key, "must be an object of station names and depths in metres, such as { \"outer\": 42.5 }");
                    foreach (var d in property.Value.EnumerateObject())
                    {
                        if (d.Value.ValueKind != JsonValueKind.Number || !(d.Value.GetDouble() > 0) || !double.IsFinite(d.Value.GetDouble()))
                            throw new HindcastFormatException(source, $"{key}.{d.Name}", "must be a positive depth in metres");
                        stationDepths[d.Name] = d.Value.GetDouble();
                    }
                }
                else if (key == "depth_positive")
                {
                    positiveUp = Text(property, source) switch
                    {
                        "up" => true,
                        "down" => false,
                        var other => throw new HindcastFormatException(source, key, $"must be \"up\" or \"down\", not \"{other}\""),
                    };
                }
                else if (key == "units")
                {
                    if (property.Value.ValueKind != JsonValueKind.Object)
                        throw new HindcastFormatException(source, key, "must be an object such as { \"hs\": \"cm\" }");
                    foreach (var u in property.Value.EnumerateObject())
                    {
                        if (!Keys.TryGetValue(u.Name, out var unitVariable))
                            throw new HindcastFormatException(source, "units." + u.Name, $"unknown key; expected one of {string.Join(", ", Keys.Keys)}");
                        units[unitVariable] = Text(u, source);
                    }
                }
                else throw new HindcastFormatException(source, key,
                    $"unknown key; expected one of {string.Join(", ", Keys.Keys)}, depth_positive, time, units, spectrum, frequency, " +
                    "spectrum_direction, spectrum_direction_to, station_depths_m");
            }
            return new VariableMapping(names, units, towards, positiveUp, time, source)
            {
                Spectrum = spectrum,
                Frequency = frequency,
                SpectrumDirection = spectrumDirection,
                SpectrumDirectionIsTowards = spectrumTowards,
                StationDepths = stationDepths,
            };
        }
    }

    private static string Text(JsonProperty property, string source)
    {
        if (property.Value.ValueKind != JsonValueKind.String || string.IsNullOrWhiteSpace(property.Value.GetString()))
            throw new HindcastFormatException(source, property.Name, "must be a non-empty string");
        return property.Value.GetString()!.Trim();
    }
}
