namespace Atlas.Demo;

/// <summary>What a station record is for in the demo.</summary>
public enum BuoyRole
{
    /// <summary>Used to calibrate the hindcast.</summary>
    Calibration,

    /// <summary>Kept aside for independent validation.</summary>
    Validation,
}

/// <summary>One invented wave buoy of the demo, moored at the centre of a wet cell.</summary>
/// <param name="Name">Station name.</param>
/// <param name="FileName">Name of its record file (CSV).</param>
/// <param name="Role">Calibration or validation.</param>
/// <param name="Instrument">Kind of instrument.</param>
/// <param name="Latitude">Latitude, degrees north (the cell centre).</param>
/// <param name="Longitude">Longitude, degrees east (the cell centre).</param>
/// <param name="DepthMetres">Water depth at the mooring, m (the cell depth).</param>
/// <param name="HsBiasFraction">Known relative bias of its Hs against the truth (0.04 reads 4 % high).</param>
/// <param name="IntervalMinutes">Minutes between records.</param>
public sealed record DemoBuoy(
    string Name,
    string FileName,
    BuoyRole Role,
    string Instrument,
    double Latitude,
    double Longitude,
    double DepthMetres,
    double HsBiasFraction,
    int IntervalMinutes);
