namespace Atlas.Demo;

/// <summary>
/// The two invented buoys and the invented device of the demo. Each buoy is moored at the centre
/// of the wet cell nearest to a chosen spot in the local kilometre frame: Gannetby Deep about
/// 20 km off the open coast in some 50 m of water (the calibration station, unbiased), and
/// Quellmouth Approach between the hook of Corrack Head and Feltrum Isle in the partly sheltered
/// approach to the bay (the validation station, whose Hs reads 4 % high).
/// </summary>
public static class DemoStations
{
    private sealed record Mooring(string Name, string FileName, BuoyRole Role, string Instrument, double XKm, double YKm, double HsBias, ulong Stream);

    private static readonly Mooring[] Moorings =
    [
        new("Gannetby Deep", "buoy-gannetby-deep.csv", BuoyRole.Calibration,
            "directional wave buoy (heave, pitch and roll)", 140.0, 42.0, 0.0, 11),
        new("Quellmouth Approach", "buoy-quellmouth-approach.csv", BuoyRole.Validation,
            "2.5 m discus buoy with a motion reference unit", 146.0, 86.0, 0.04, 12),
    ];

    /// <summary>The device whose power matrix the demo writes.</summary>
    public static DemoDevice Device { get; } = new(
        "Tarnlow HF-380", "heave float", 380.0, "power-matrix-tarnlow-hf380.csv");

    /// <summary>Resonance (energy) period of the device, s.</summary>
    public const double DeviceResonancePeriodSeconds = 8.0;

    /// <summary>Largest capture width of the device, m.</summary>
    public const double DevicePeakCaptureWidthMetres = 11.0;

    /// <summary>The device's power matrix.</summary>
    public static DevicePowerMatrix DevicePowerMatrix() =>
        Atlas.Demo.DevicePowerMatrix.PointAbsorber(Device.Name, Device.RatedKilowatts, DeviceResonancePeriodSeconds, DevicePeakCaptureWidthMetres);

    /// <summary>The buoys placed on <paramref name="grid"/>, each with its wet-cell index and random stream.</summary>
    public static IReadOnlyList<(DemoBuoy Buoy, int WetCell, ulong Stream)> Place(DemoGrid grid, int intervalMinutes)
    {
        ArgumentNullException.ThrowIfNull(grid);
        var placed = new List<(DemoBuoy, int, ulong)>();
        foreach (var m in Moorings)
        {
            int best = grid.NearestWetCellKm(m.XKm, m.YKm);
            var buoy = new DemoBuoy(m.Name, m.FileName, m.Role, m.Instrument,
                grid.LatitudeOf(best), grid.LongitudeOf(best), grid.DepthMetres[best], m.HsBias, intervalMinutes);
            placed.Add((buoy, best, m.Stream));
        }
        return placed;
    }
}
