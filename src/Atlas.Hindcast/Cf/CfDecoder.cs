namespace Atlas.Hindcast;

/// <summary>How a wave variable was found in a file.</summary>
public enum VariableMatch
{
    /// <summary>By its CF standard_name.</summary>
    StandardName,
    /// <summary>Named in the dataset's <see cref="VariableMapping"/>.</summary>
    Mapping,
    /// <summary>
    /// By its variable name alone: only the water depth, for a horizontal field with length units named as models name
    /// it (<see cref="CfStandardNames.WaterDepthNames"/>) and no standard_name saying otherwise.
    /// </summary>
    Name,
}

/// <summary>A wave variable located in a file, with how it was found and how it must be decoded.</summary>
/// <param name="Towards">True for a direction the waves travel to (turned into "from" on decoding).</param>
/// <param name="PositiveUp">True for an elevation (depth = -value).</param>
/// <param name="UnitsOverride">Units from the mapping file that replace the variable's own.</param>
/// <param name="Reciprocal">True for a peak frequency read as Tp = 1 / fp.</param>
public sealed record ResolvedVariable(
    WaveParameter Variable,
    NetCdfVariable Source,
    VariableMatch MatchedBy,
    bool Towards,
    bool PositiveUp,
    string? UnitsOverride,
    bool Reciprocal = false)
{
    public string Name => Source.Name;

    /// <summary>The units string used for decoding.</summary>
    public string? Units => UnitsOverride ?? Source.TextAttribute("units");

    /// <summary>Builds the value decoder; throws <see cref="FormatException"/> (problem text) for unusable units or types.</summary>
    public CfValueDecoder CreateDecoder()
    {
        if (!Reciprocal) return CfValueDecoder.Create(Source, CfStandardNames.QuantityOf(Variable), UnitsOverride, PositiveUp, Towards);
        try
        {
            return CfValueDecoder.Create(Source, PhysicalQuantity.Frequency, UnitsOverride, reciprocal: true);
        }
        catch (FormatException e)
        {
            throw new FormatException($"is a peak frequency (standard_name '{Source.TextAttribute("standard_name")}'), so Tp = 1/fp, but it {e.Message}", e);
        }
    }

    /// <summary>How it was found, for the ingest summary: "standard_name 'x'", "the mapping file" or "its name".</summary>
    public string HowFound => MatchedBy switch
    {
        VariableMatch.StandardName => $"standard_name '{Source.TextAttribute("standard_name")}'",
        VariableMatch.Mapping => "the mapping file",
        _ => "its name (a common model name for water depth)",
    };

    /// <summary>
    /// The conversions applied on decoding, in words: unpacking, units, reciprocal, sign and direction turns;
    /// "none" when the values are used as stored. <paramref name="decoder"/> is this variable's decoder.
    /// </summary>
    public string DescribeConversion(CfValueDecoder decoder)
    {
        var parts = new List<string>();
        if (decoder.IsPacked)
            parts.Add($"unpacked from {Source.Type.ToString().ToLowerInvariant()} (scale_factor {Source.NumberAttribute("scale_factor") ?? 1:G6}, add_offset {Source.NumberAttribute("add_offset") ?? 0:G6})");
        string units = Units ?? "";
        string si = CfStandardNames.QuantityOf(Variable) switch
        {
            PhysicalQuantity.Length => "m",
            PhysicalQuantity.Time => "s",
            _ => "degree",
        };
        if (Reciprocal)
            parts.Add($"converted Tp = 1/fp (peak frequency, {units}{(decoder.Units.Factor != 1 ? $", x {decoder.Units.Factor:G6} to Hz" : "")}); fp <= 0 or missing gives a missing step");
        else if (decoder.Units.Factor != 1)
            parts.Add($"units '{units}' to {si} (x {decoder.Units.Factor:G8})");
        else if (!string.Equals(units, si, StringComparison.Ordinal))
            parts.Add($"units '{units}' read as {si}");
        if (PositiveUp) parts.Add("positive up: negated into a depth below the surface");
        if (Towards) parts.Add("direction the waves travel to, turned into the direction they come from (+180 degrees)");
        return parts.Count == 0 ? "none" : string.Join("; ", parts);
    }
}

/// <summary>
/// Finds the wave variables of a CF file: by the dataset mapping where it names one, otherwise by standard_name.
/// Variable names alone are not trusted for wave fields (a "t02" is not a Te); names that look like a wanted variable
/// only appear as hints in the error message. The water depth is the one exception: a horizontal field with length
/// units named as models name it ("dpt", "depth", "wdepth", "deptho") is taken when no standard name finds a depth,
/// and is reported as matched by its name. A peak frequency (standard_name or frequency units) becomes Tp = 1/fp.
/// </summary>
public static class CfDecoder
{
    /// <summary>
    /// Locates every wave variable the file has. Hs is required and so is at least one of Te and Tp;
    /// their absence, an ambiguous standard_name, or a mapping naming a missing or contradicting variable throws
    /// <see cref="HindcastFormatException"/> naming the file.
    /// </summary>
    public static IReadOnlyDictionary<WaveParameter, ResolvedVariable> Resolve(NetCdfFile file, VariableMapping? mapping)
    {
        var found = new Dictionary<WaveParameter, ResolvedVariable>();
        foreach (var wave in WaveParameterGroups.HindcastFields)
        {
            var resolved = mapping is not null && mapping.Names.TryGetValue(wave, out var mapped)
                ? FromMapping(file, mapping, wave, mapped)
                : FromStandardName(file, wave, mapping, found.GetValueOrDefault(WaveParameter.Hs)?.Source);
            if (resolved is not null) found[wave] = resolved;
        }

        if (!found.ContainsKey(WaveParameter.Hs))
            throw new HindcastFormatException(file.Path, null,
                $"no significant wave height: no variable has standard_name '{CfStandardNames.SignificantHeight}' and Hs is required" +
                Hint(file, WaveParameter.Hs, "hs"));
        if (!found.ContainsKey(WaveParameter.Te) && !found.ContainsKey(WaveParameter.Tp))
            throw new HindcastFormatException(file.Path, null,
                $"neither an energy period Te (standard_name '{CfStandardNames.EnergyPeriod}') nor a peak period Tp " +
                $"(standard_name '{CfStandardNames.PeakPeriod}', or a peak frequency with standard_name '{CfStandardNames.PeakFrequency}') " +
                "was found; one of them is required" +
                OtherPeriodsNote(file) + Hint(file, WaveParameter.Te, "te") + Hint(file, WaveParameter.Tp, "tp"));
        return found;
    }

    private static ResolvedVariable FromMapping(NetCdfFile file, VariableMapping mapping, WaveParameter wave, string name)
    {
        var variable = file.FindVariable(name)
            ?? throw new HindcastFormatException(file.Path, name, $"the mapping '{mapping.Source}' names it for {wave}, but the file has no such variable");
        string? standardName = variable.TextAttribute("standard_name");
        var identified = CfStandardNames.Identify(standardName);
        if (identified is not null && identified != wave)
            throw new HindcastFormatException(file.Path, name,
                $"the mapping '{mapping.Source}' names it for {wave}, but its standard_name '{standardName}' says it is {identified}");
        if (standardName is not null && CfStandardNames.OtherPeriods.TryGetValue(standardName, out var other) &&
            wave is WaveParameter.Te or WaveParameter.Tp)
            throw new HindcastFormatException(file.Path, name,
                $"the mapping '{mapping.Source}' names it for {wave}, but its standard_name '{standardName}' is {other}, which is not {wave}");

        bool towards = wave == WaveParameter.Dir && (mapping.DirectionIsTowards || standardName == CfStandardNames.ToDirection);
        if (wave == WaveParameter.Dir && mapping.DirectionIsTowards && standardName == CfStandardNames.FromDirection)
            throw new HindcastFormatException(file.Path, name,
                $"the mapping '{mapping.Source}' calls it a to-direction (dir_to), but its standard_name is '{standardName}'");
        bool positiveUp = wave == WaveParameter.Depth && (mapping.DepthPositiveUp ?? IsPositiveUp(variable));
        mapping.Units.TryGetValue(wave, out var units);
        return new ResolvedVariable(wave, variable, VariableMatch.Mapping, towards, positiveUp, units,
            Reciprocal: wave == WaveParameter.Tp && IsFrequency(variable, units));
    }

    /// <summary>
    /// A Tp candidate is a peak frequency when its standard_name says so, or when its units are a frequency (a "tp"
    /// in s-1 cannot be a period).
    /// </summary>
    private static bool IsFrequency(NetCdfVariable variable, string? unitsOverride) =>
        CfStandardNames.PeakFrequencies.Contains(variable.TextAttribute("standard_name") ?? "") ||
        UnitConversion.TryToSi(unitsOverride ?? variable.TextAttribute("units"), PhysicalQuantity.Frequency, out _);

    private static ResolvedVariable? FromStandardName(NetCdfFile file, WaveParameter wave, VariableMapping? mapping, NetCdfVariable? hs)
    {
        var names = CfStandardNames.For(wave);
        var candidates = file.Variables
            .Where(v => names.Contains(v.TextAttribute("standard_name") ?? "") && !IsCoordinateVariable(v))
            .ToList();
        var matchedBy = VariableMatch.StandardName;
        if (wave == WaveParameter.Depth)
        {
            // The sea-floor and elevation names say what they are; the plain CF "depth" (also a vertical coordinate or
            // the depth of a sensor) counts only as a horizontal field like Hs, and only when no sea-floor name is present.
            var seaFloor = candidates.Where(v => v.TextAttribute("standard_name") != CfStandardNames.Depth).ToList();
            candidates = seaFloor.Count > 0 ? seaFloor : candidates.Where(v => hs is not null && IsHorizontalField(v, hs)).ToList();
            if (candidates.Count == 0 && hs is not null)
            {
                candidates = ByWaterDepthName(file, hs, mapping);
                matchedBy = VariableMatch.Name;
            }
        }
        if (wave == WaveParameter.Depth && candidates.Count > 1)
        {
            // A bathymetry given both ways: the depth (positive down) is the one CF defines for the purpose.
            var down = candidates.Where(v => !IsPositiveUp(v)).ToList();
            if (down.Count > 0) candidates = down;
        }
        if (wave == WaveParameter.Tp && candidates.Count > 1)
        {
            // A file with both a peak period and a peak frequency: the period is used as written.
            var periods = candidates.Where(v => v.TextAttribute("standard_name") == CfStandardNames.PeakPeriod).ToList();
            if (periods.Count > 0) candidates = periods;
        }
        if (candidates.Count == 0) return null;
        if (candidates.Count > 1)
            throw new HindcastFormatException(file.Path, null,
                $"{wave} is ambiguous: variables {string.Join(", ", candidates.Select(c => $"'{c.Name}'"))} all have a standard_name for it; " +
                $"name the one to use in a mapping file ({{ \"{wave.ToString().ToLowerInvariant()}\": \"{candidates[0].Name}\" }})");
        var variable = candidates[0];
        string? units = null;
        mapping?.Units.TryGetValue(wave, out units);
        return new ResolvedVariable(wave, variable, matchedBy,
            Towards: variable.TextAttribute("standard_name") == CfStandardNames.ToDirection,
            PositiveUp: wave == WaveParameter.Depth && (mapping?.DepthPositiveUp ?? IsPositiveUp(variable)),
            UnitsOverride: units,
            Reciprocal: wave == WaveParameter.Tp && IsFrequency(variable, units));
    }

    /// <summary>
    /// Variables named as models name the water depth, with no standard_name of their own (or the plain "depth"), a
    /// length unit (given by the file or the mapping) and the horizontal dimensions of Hs. A look-alike that fails one
    /// of these is not taken; <see cref="WaterDepthLookalike"/> names it for the summary.
    /// </summary>
    private static List<NetCdfVariable> ByWaterDepthName(NetCdfFile file, NetCdfVariable hs, VariableMapping? mapping)
    {
        string? unitsOverride = null;
        mapping?.Units.TryGetValue(WaveParameter.Depth, out unitsOverride);
        return file.Variables.Where(v =>
                CfStandardNames.WaterDepthNames.Contains(v.Name, StringComparer.OrdinalIgnoreCase) &&
                v.TextAttribute("standard_name") is null or CfStandardNames.Depth &&
                !IsCoordinateVariable(v) && v.Type.IsNumeric() && IsHorizontalField(v, hs) &&
                UnitConversion.TryToSi(unitsOverride ?? v.TextAttribute("units"), PhysicalQuantity.Length, out _))
            .ToList();
    }

    /// <summary>
    /// A variable that looks like the water depth by its name but was not taken (no length unit, or not a horizontal
    /// field), with the reason; null when there is none. For the "depth: none found" line of the ingest summary.
    /// </summary>
    public static DepthLookalike? WaterDepthLookalike(NetCdfFile file)
    {
        var hs = file.Variables.FirstOrDefault(v => v.TextAttribute("standard_name") == CfStandardNames.SignificantHeight);
        foreach (var v in file.Variables)
        {
            if (!CfStandardNames.WaterDepthNames.Contains(v.Name, StringComparer.OrdinalIgnoreCase) || IsCoordinateVariable(v)) continue;
            if (CfStandardNames.Identify(v.TextAttribute("standard_name")) is { } other && other != WaveParameter.Depth) continue;
            bool onGrid = hs is null || IsHorizontalField(v, hs);
            string? units = v.TextAttribute("units");
            string reason = !onGrid ? "it is not a horizontal field like Hs"
                : string.IsNullOrWhiteSpace(units) ? "it has no units"
                : UnitConversion.TryToSi(units, PhysicalQuantity.Length, out _) ? "it was not taken"
                : $"its units '{units}' are not a length";
            return new DepthLookalike(v.Name, reason, onGrid);
        }
        return null;
    }

    /// <summary>
    /// True when every dimension of <paramref name="v"/> is one of Hs's or has length 1, and it spans all of Hs's
    /// dimensions but at most one (the time): a static or time-varying field on the wave grid.
    /// </summary>
    private static bool IsHorizontalField(NetCdfVariable v, NetCdfVariable hs)
    {
        int shared = 0;
        foreach (var d in v.Dimensions)
        {
            if (hs.Dimensions.Contains(d)) shared++;
            else if (d.Length != 1) return false;
        }
        return shared >= hs.Rank - 1 && shared >= 1;
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

    private static string Hint(NetCdfFile file, WaveParameter wave, string key)
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
