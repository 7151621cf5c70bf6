namespace Atlas.Hindcast;

/// <summary>How a wave variable was found in a file.</summary>
public enum VariableMatch
{
    /// <summary>By its CF standard_name.</summary>
    StandardName,
    /// <summary>Named in the dataset's <see cref="VariableMapping"/>.</summary>
    Mapping,
}

/// <summary>A wave variable located in a file, with how it was found and how it must be decoded.</summary>
/// <param name="Towards">True for a direction the waves travel to (turned into "from" on decoding).</param>
/// <param name="PositiveUp">True for an elevation (depth = -value).</param>
/// <param name="UnitsOverride">Units from the mapping file that replace the variable's own.</param>
public sealed record ResolvedVariable(
    WaveVariable Variable,
    NetCdfVariable Source,
    VariableMatch MatchedBy,
    bool Towards,
    bool PositiveUp,
    string? UnitsOverride)
{
    public string Name => Source.Name;

    /// <summary>The units string used for decoding.</summary>
    public string? Units => UnitsOverride ?? Source.TextAttribute("units");

    /// <summary>Builds the value decoder; throws <see cref="FormatException"/> (problem text) for unusable units or types.</summary>
    public CfValueDecoder CreateDecoder() =>
        CfValueDecoder.Create(Source, CfStandardNames.QuantityOf(Variable), UnitsOverride, PositiveUp, Towards);
}

/// <summary>
/// Finds the wave variables of a CF file: by the dataset mapping where it names one, otherwise by standard_name.
/// Variable names alone are never trusted (a "t02" is not a Te); names that look like a wanted variable only
/// appear as hints in the error message.
/// </summary>
public static class CfDecoder
{
    /// <summary>
    /// Locates every wave variable the file has. Hs is required and so is at least one of Te and Tp;
    /// their absence, an ambiguous standard_name, or a mapping naming a missing or contradicting variable throws
    /// <see cref="HindcastFormatException"/> naming the file.
    /// </summary>
    public static IReadOnlyDictionary<WaveVariable, ResolvedVariable> Resolve(NetCdfFile file, VariableMapping? mapping)
    {
        var found = new Dictionary<WaveVariable, ResolvedVariable>();
        foreach (var wave in Enum.GetValues<WaveVariable>())
        {
            var resolved = mapping is not null && mapping.Names.TryGetValue(wave, out var mapped)
                ? FromMapping(file, mapping, wave, mapped)
                : FromStandardName(file, wave, mapping);
            if (resolved is not null) found[wave] = resolved;
        }

        if (!found.ContainsKey(WaveVariable.Hs))
            throw new HindcastFormatException(file.Path, null,
                $"no significant wave height: no variable has standard_name '{CfStandardNames.SignificantHeight}' and Hs is required" +
                Hint(file, WaveVariable.Hs, "hs"));
        if (!found.ContainsKey(WaveVariable.Te) && !found.ContainsKey(WaveVariable.Tp))
            throw new HindcastFormatException(file.Path, null,
                $"neither an energy period Te (standard_name '{CfStandardNames.EnergyPeriod}') nor a peak period Tp " +
                $"(standard_name '{CfStandardNames.PeakPeriod}') was found; one of them is required" +
                OtherPeriodsNote(file) + Hint(file, WaveVariable.Te, "te") + Hint(file, WaveVariable.Tp, "tp"));
        return found;
    }

    private static ResolvedVariable FromMapping(NetCdfFile file, VariableMapping mapping, WaveVariable wave, string name)
    {
        var variable = file.FindVariable(name)
            ?? throw new HindcastFormatException(file.Path, name, $"the mapping '{mapping.Source}' names it for {wave}, but the file has no such variable");
        string? standardName = variable.TextAttribute("standard_name");
        var identified = CfStandardNames.Identify(standardName);
        if (identified is not null && identified != wave)
            throw new HindcastFormatException(file.Path, name,
                $"the mapping '{mapping.Source}' names it for {wave}, but its standard_name '{standardName}' says it is {identified}");
        if (standardName is not null && CfStandardNames.OtherPeriods.TryGetValue(standardName, out var other) &&
            wave is WaveVariable.Te or WaveVariable.Tp)
            throw new HindcastFormatException(file.Path, name,
                $"the mapping '{mapping.Source}' names it for {wave}, but its standard_name '{standardName}' is {other}, which is not {wave}");

        bool towards = wave == WaveVariable.Dir && (mapping.DirectionIsTowards || standardName == CfStandardNames.ToDirection);
        if (wave == WaveVariable.Dir && mapping.DirectionIsTowards && standardName == CfStandardNames.FromDirection)
            throw new HindcastFormatException(file.Path, name,
                $"the mapping '{mapping.Source}' calls it a to-direction (dir_to), but its standard_name is '{standardName}'");
        bool positiveUp = wave == WaveVariable.Depth && (mapping.DepthPositiveUp ?? IsPositiveUp(variable));
        mapping.Units.TryGetValue(wave, out var units);
        return new ResolvedVariable(wave, variable, VariableMatch.Mapping, towards, positiveUp, units);
    }

    private static ResolvedVariable? FromStandardName(NetCdfFile file, WaveVariable wave, VariableMapping? mapping)
    {
        var names = CfStandardNames.For(wave);
        var candidates = file.Variables
            .Where(v => names.Contains(v.TextAttribute("standard_name") ?? "") && !IsCoordinateVariable(v))
            .ToList();
        if (wave == WaveVariable.Depth && candidates.Count > 1)
        {
            // A bathymetry given both ways: the depth (positive down) is the one CF defines for the purpose.
            var down = candidates.Where(v => !IsPositiveUp(v)).ToList();
            if (down.Count > 0) candidates = down;
        }
        if (candidates.Count == 0) return null;
        if (candidates.Count > 1)
            throw new HindcastFormatException(file.Path, null,
                $"{wave} is ambiguous: variables {string.Join(", ", candidates.Select(c => $"'{c.Name}'"))} all have a standard_name for it; " +
                $"name the one to use in a mapping file ({{ \"{wave.ToString().ToLowerInvariant()}\": \"{candidates[0].Name}\" }})");
        var variable = candidates[0];
        string? units = null;
        mapping?.Units.TryGetValue(wave, out units);
        return new ResolvedVariable(wave, variable, VariableMatch.StandardName,
            Towards: variable.TextAttribute("standard_name") == CfStandardNames.ToDirection,
            PositiveUp: wave == WaveVariable.Depth && (mapping?.DepthPositiveUp ?? IsPositiveUp(variable)),
            UnitsOverride: units);
    }

    /// <summary>
    /// Elevation standard names are positive up; depth names are positive down whatever a stray positive
    /// attribute says; a variable with no recognised standard name follows its positive attribute (default down).
    /// </summary>
    private static bool IsPositiveUp(NetCdfVariable variable)
    {
        string? standardName = variable.TextAttribute("standard_name");
        if (standardName is not null && CfStandardNames.ElevationPositiveUp.Contains(standardName)) return true;
        if (standardName is not null && CfStandardNames.DepthPositiveDown.Contains(standardName)) return false;
        return string.Equals(variable.TextAttribute("positive"), "up", StringComparison.OrdinalIgnoreCase);
    }

    private static bool IsCoordinateVariable(NetCdfVariable v) => v.Rank == 1 && v.Dimensions[0].Name == v.Name;

    private static string Hint(NetCdfFile file, WaveVariable wave, string key)
    {
        var hints = CfStandardNames.NameHints(wave);
        var lookalike = file.Variables.FirstOrDefault(v =>
            hints.Contains(v.Name, StringComparer.OrdinalIgnoreCase) && CfStandardNames.Identify(v.TextAttribute("standard_name")) is null &&
            !(v.TextAttribute("standard_name") is { } sn && CfStandardNames.OtherPeriods.ContainsKey(sn)));
        return lookalike is null ? ""
            : $"; variable '{lookalike.Name}' looks like {wave} by its name only; if it is, name it in a mapping file: {{ \"{key}\": \"{lookalike.Name}\" }}";
    }

    private static string OtherPeriodsNote(NetCdfFile file)
    {
        var others = file.Variables
            .Select(v => (v.Name, StandardName: v.TextAttribute("standard_name") ?? ""))
            .Where(v => CfStandardNames.OtherPeriods.ContainsKey(v.StandardName))
            .Select(v => $"'{v.Name}' is {CfStandardNames.OtherPeriods[v.StandardName]} (standard_name '{v.StandardName}')")
            .ToList();
        return others.Count == 0 ? "" : "; " + string.Join(", ", others) + ", which is not taken for Te or Tp";
    }
}
