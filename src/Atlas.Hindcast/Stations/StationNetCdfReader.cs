using System.Globalization;
using System.Numerics;
namespace Atlas.Hindcast.Stations;

/// <summary>
/// Reads one station's record from a CF-NetCDF point time series (CF 1.6+ discrete sampling geometry,
/// <c>featureType = "timeSeries"</c>), with the netCDF-C reader of this library and its CF decoding (fill values,
/// valid ranges, packing, units to SI, "to" directions turned into "from").
/// </summary>
/// <remarks>
/// <para>Variables are found by standard name: Hs (<c>sea_surface_wave_significant_height</c>, required), Tp, Te and the
/// direction (as in the hindcast reader). Each must run along the time coordinate alone; dimensions of length 1 (one
/// station) are allowed, several stations in one file are refused. The station position is read from the variables with
/// standard names <c>latitude</c> and <c>longitude</c> when present.</para>
/// <para>Quality flags: the first variable named in Hs's <c>ancillary_variables</c> that runs along time. A row is good
/// when its flag is one whose <c>flag_meanings</c> entry starts with "good"; without <c>flag_meanings</c>, flag 0 is good
/// (the atlas CSV convention). A fill value or a missing flag counts as flagged.</para>
/// <para>A missing Hs (fill value) keeps its row and is counted as missing when matched. Checks, each reported with its
/// index and time: times strictly increase; on good rows Hs is at or above 0 and Tp, Te are above 0.</para>
/// </remarks>
public static class StationNetCdfReader
{
    /// <summary>Reads and checks the record of <paramref name="path"/>; nothing is returned unless all of it is good.</summary>
    /// <param name="path">The file.</param>
    /// <param name="sourceName">The name messages and the result give the file (an upload's own name when
    /// <paramref name="path"/> is a temporary copy); by default the file name of <paramref name="path"/>.</param>
    /// <exception cref="StationFileException">Every problem found, each naming the variable, index and time, or the attribute.</exception>
    public static StationTimeSeries Read(string path, string? sourceName = null)
    {
        var name = sourceName ?? Path.GetFileName(path);
        try
        {
            using var file = NetCdfFile.Open(path);
            return Read(file, name);
        }
        catch (HindcastFormatException e)
        {
            throw new StationFileException(name, [e.Variable is null ? e.Problem : $"variable '{e.Variable}': {e.Problem}"]);
        }
    }

    private static StationTimeSeries Read(NetCdfFile file, string name)
    {
        var problems = new List<string>();
        var featureType = file.GlobalAttribute("featureType")?.Text?.Trim();
        if (!string.Equals(featureType, "timeSeries", StringComparison.OrdinalIgnoreCase))
            throw new StationFileException(name, [
                $"global attribute featureType is {(featureType is null ? "absent" : $"'{featureType}'")}; a station record must be a CF point " +
                "time series (featureType = \"timeSeries\")"]);

        var time = FindTime(file) ?? throw new StationFileException(name, [
            "no time coordinate: no one-dimensional variable has standard_name 'time' (or axis 'T', or the name 'time') with units '<unit> since <date>'"]);
        var timeDimension = time.Dimensions[0];
        var times = DecodeTimes(file, time, problems);

        var hsVariable = FindByStandardName(file, CfStandardNames.SignificantHeight);
        if (hsVariable is null)
            throw new StationFileException(name, [$"no variable has standard_name '{CfStandardNames.SignificantHeight}' (Hs); it is required"]);
        var tpVariable = FindByStandardName(file, CfStandardNames.PeakPeriod);
        var teVariable = FindByStandardName(file, CfStandardNames.EnergyPeriod);
        var dirVariable = FindByStandardName(file, CfStandardNames.FromDirection) ?? FindByStandardName(file, CfStandardNames.ToDirection);

        int n = (int)timeDimension.Length;
        var hs = ReadSeries(file, hsVariable, timeDimension, PhysicalQuantity.Length, false, problems);
        var tp = tpVariable is null ? null : ReadSeries(file, tpVariable, timeDimension, PhysicalQuantity.Time, false, problems);
        var te = teVariable is null ? null : ReadSeries(file, teVariable, timeDimension, PhysicalQuantity.Time, false, problems);
        var dir = dirVariable is null ? null : ReadSeries(file, dirVariable, timeDimension, PhysicalQuantity.Angle,
            dirVariable.TextAttribute("standard_name") == CfStandardNames.ToDirection, problems);
        var qc = ReadQuality(file, hsVariable, timeDimension, problems);
        var latitude = ReadPosition(file, "latitude", problems);
        var longitude = ReadPosition(file, "longitude", problems);
        if (problems.Count > 0 || times is null || hs is null) throw new StationFileException(name, problems);

        var flags = new short[n];
        for (int i = 0; i < n; i++)
        {
            short flag = flags[i] = qc?[i] ?? 0;
            if (flag != 0) continue;
            if (hs[i] < 0) problems.Add($"variable '{hsVariable.Name}' [{i}] ({Iso(times[i])}): Hs {F(hs[i])} m is negative");
            if (tp?[i] <= 0) problems.Add($"variable '{tpVariable!.Name}' [{i}] ({Iso(times[i])}): Tp {F(tp[i])} s must be above 0");
            if (te?[i] <= 0) problems.Add($"variable '{teVariable!.Name}' [{i}] ({Iso(times[i])}): Te {F(te[i])} s must be above 0");
        }
        if (n == 0) problems.Add($"the time dimension '{timeDimension.Name}' is empty: the file holds no observations");
        if (problems.Count > 0) throw new StationFileException(name, problems);
        return new StationTimeSeries(name, times, hs, tp, te, dir, flags, latitude, longitude);
    }

    private static NetCdfVariable? FindTime(NetCdfFile file)
    {
        bool HasTimeUnits(NetCdfVariable v) => v.Rank == 1 && (v.TextAttribute("units")?.Contains(" since ", StringComparison.OrdinalIgnoreCase) ?? false);
        return file.Variables.FirstOrDefault(v => HasTimeUnits(v) && v.TextAttribute("standard_name") == "time")
            ?? file.Variables.FirstOrDefault(v => HasTimeUnits(v) && string.Equals(v.TextAttribute("axis"), "T", StringComparison.OrdinalIgnoreCase))
            ?? (file.FindVariable("time") is { } named && HasTimeUnits(named) ? named : null);
    }

    private static NetCdfVariable? FindByStandardName(NetCdfFile file, string standardName) =>
        file.Variables.FirstOrDefault(v => v.TextAttribute("standard_name") == standardName);

    /// <summary>Unix seconds of every step, or null (with a problem) when the axis cannot be decoded or does not increase.</summary>
    private static long[]? DecodeTimes(NetCdfFile file, NetCdfVariable time, List<string> problems)
    {
        try
        {
            var parsed = CfTime.Parse(time.TextAttribute("units"), time.TextAttribute("calendar"));
            var values = file.ReadAll<double>(time);
            if (time.NumberAttribute("_FillValue") is { } fill)
            {
                double stored = time.Type == NetCdfType.Float ? (float)fill : fill;
                if (Array.IndexOf(values, stored) is var missing and >= 0)
                    throw new FormatException($"time[{missing}] is the fill value; every observation needs a time");
            }
            var utc = parsed.ToUtc(values);
            var seconds = utc.Select(t => (long)Math.Round((t - DateTime.UnixEpoch).TotalSeconds)).ToArray();
            for (int i = 1; i < seconds.Length; i++)
                if (seconds[i] <= seconds[i - 1])
                    problems.Add($"variable '{time.Name}' [{i}] = {Iso(seconds[i])} {(seconds[i] == seconds[i - 1] ? "duplicates" : "is before")} " +
                                 $"[{i - 1}] = {Iso(seconds[i - 1])}; times must strictly increase");
            return seconds;
        }
        catch (FormatException e)
        {
            problems.Add($"variable '{time.Name}': {e.Message}");
            return null;
        }
    }

    /// <summary>The decoded values of a variable along time, or null (with a problem) when it has other dimensions or bad units.</summary>
    private static float[]? ReadSeries(NetCdfFile file, NetCdfVariable variable, NetCdfDimension time, PhysicalQuantity quantity, bool towards,
        List<string> problems)
    {
        if (!RunsAlong(variable, time, problems)) return null;
        CfValueDecoder decoder;
        try
        {
            decoder = CfValueDecoder.Create(variable, quantity, towards: towards);
        }
        catch (FormatException e)
        {
            problems.Add($"variable '{variable.Name}': {e.Message}");
            return null;
        }
        var values = new float[time.Length];
        switch (variable.Type)
        {
            case NetCdfType.Float:
                file.Read(variable, new long[variable.Rank], variable.Shape, values.AsSpan());
                decoder.DecodeInPlace(values);
                break;
            case NetCdfType.Short: Decode<short>(file, variable, decoder, values); break;
            case NetCdfType.UShort: Decode<ushort>(file, variable, decoder, values); break;
            case NetCdfType.Int: Decode<int>(file, variable, decoder, values); break;
            case NetCdfType.UInt: Decode<uint>(file, variable, decoder, values); break;
            case NetCdfType.Byte: Decode<sbyte>(file, variable, decoder, values); break;
            case NetCdfType.UByte: Decode<byte>(file, variable, decoder, values); break;
            default: Decode<double>(file, variable, decoder, values); break; // double and 64-bit integers
        }
        return values;
    }

    private static void Decode<T>(NetCdfFile file, NetCdfVariable variable, CfValueDecoder decoder, float[] destination) where T : unmanaged, INumberBase<T> =>
        decoder.Decode<T>(file.ReadAll<T>(variable), destination);

    /// <summary>True when every dimension of the variable but time has length 1 (a single station).</summary>
    private static bool RunsAlong(NetCdfVariable variable, NetCdfDimension time, List<string> problems)
    {
        var others = variable.Dimensions.Where(d => d.Id != time.Id).ToArray();
        if (variable.Dimensions.Count(d => d.Id == time.Id) == 1 && others.All(d => d.Length == 1)) return true;
        var shape = string.Join(", ", variable.Dimensions.Select(d => $"{d.Name}={d.Length}"));
        problems.Add(others.Any(d => d.Length > 1)
            ? $"variable '{variable.Name}' has dimensions ({shape}): it holds several stations; a file may hold one station only"
            : $"variable '{variable.Name}' has dimensions ({shape}) and does not run along the time dimension '{time.Name}'");
        return false;
    }

    /// <summary>The quality flag per step: 0 where good, 1 where the file's flag is not a good one; null without a flag variable.</summary>
    private static short[]? ReadQuality(NetCdfFile file, NetCdfVariable hs, NetCdfDimension time, List<string> problems)
    {
        var names = hs.TextAttribute("ancillary_variables")?.Split(' ', StringSplitOptions.RemoveEmptyEntries) ?? [];
        var flagVariable = names.Select(file.FindVariable).FirstOrDefault(v => v is not null && v.Dimensions.Any(d => d.Id == time.Id));
        if (names.Length > 0 && flagVariable is null)
        {
            problems.Add($"variable '{hs.Name}': ancillary_variables names {string.Join(", ", names.Select(x => $"'{x}'"))} but none is a variable along time");
            return null;
        }
        if (flagVariable is null || !RunsAlong(flagVariable, time, problems)) return null;

        var good = new HashSet<double>();
        var meanings = flagVariable.TextAttribute("flag_meanings")?.Split(' ', StringSplitOptions.RemoveEmptyEntries);
        var flagValues = flagVariable.Attribute("flag_values")?.Values;
        if (meanings is null) good.Add(0);
        else if (flagValues is null || flagValues.Count != meanings.Length)
        {
            problems.Add($"variable '{flagVariable.Name}': flag_meanings has {meanings.Length} entries but flag_values has {flagValues?.Count ?? 0}; they must pair up");
            return null;
        }
        else
        {
            for (int k = 0; k < meanings.Length; k++)
                if (meanings[k].StartsWith("good", StringComparison.OrdinalIgnoreCase)) good.Add(flagValues[k]);
            if (good.Count == 0)
            {
                problems.Add($"variable '{flagVariable.Name}': no flag_meanings entry starts with 'good' ({string.Join(" ", meanings)}), so no row could be used");
                return null;
            }
        }
        var raw = file.ReadAll<double>(flagVariable);
        var fill = flagVariable.NumberAttribute("_FillValue");
        return [.. raw.Select(v => (short)(good.Contains(v) && v != fill ? 0 : 1))];
    }

    /// <summary>The value of a one-value coordinate with the given standard name; null when absent or with a problem.</summary>
    private static double? ReadPosition(NetCdfFile file, string standardName, List<string> problems)
    {
        var variable = FindByStandardName(file, standardName);
        if (variable is null) return null;
        if (variable.Length != 1)
        {
            problems.Add($"variable '{variable.Name}' ({standardName}) holds {variable.Length} values; a file may hold one station only");
            return null;
        }
        var value = file.ReadAll<double>(variable)[0];
        var bound = standardName == "latitude" ? 90 : 180;
        if (!double.IsFinite(value) || Math.Abs(value) > (standardName == "latitude" ? 90 : 360))
        {
            problems.Add($"variable '{variable.Name}' ({standardName}) is {F(value)}, outside -{bound}..{bound} degrees");
            return null;
        }
        // Longitudes written 0..360 are brought into -180..180 like the cell positions.
        return standardName == "longitude" && value > 180 ? value - 360 : value;
    }

    private static string Iso(long unixSeconds) => CfTime.Iso(DateTime.UnixEpoch.AddSeconds(unixSeconds));

    private static string F(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);
}
