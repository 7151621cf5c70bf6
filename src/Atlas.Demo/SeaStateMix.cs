namespace Atlas.Demo;

/// <summary>
/// Combines wave systems into one bulk sea state the way their spectra add: energies (Hs^2) add;
/// Te = m-1 / m0 is the energy-weighted mean of the systems' Te; the peak period is that of the
/// system with the highest spectral peak, taken as proportional to Hs^2 Tp for spectra of similar
/// shape; the mean direction and the spread come from the energy-weighted mean resultant vector,
/// each system contributing a resultant of length 1 - sigma^2 / 2 (sigma its spread in radians),
/// so two systems from different directions widen the combined spread.
/// </summary>
public struct SeaStateMix
{
    private double _energy, _energyTimesTe, _east, _north, _bestPeak, _peakPeriod;

    /// <summary>Adds one system; a height of zero or less adds nothing.</summary>
    public void Add(double heightMetres, double peakPeriodSeconds, double energyPeriodSeconds, double fromDegrees, double spreadDegrees)
    {
        (double sin, double cos) = Math.SinCos(fromDegrees * Math.PI / 180.0);
        Add(heightMetres, peakPeriodSeconds, energyPeriodSeconds, sin, cos, spreadDegrees);
    }

    /// <summary>
    /// Adds one system whose direction is given as the unit "from" vector (east, north), which
    /// spares callers that have it a round trip through angles.
    /// </summary>
    public void Add(double heightMetres, double peakPeriodSeconds, double energyPeriodSeconds, double fromEast, double fromNorth, double spreadDegrees)
    {
        if (!(heightMetres > 0)) return;
        double energy = heightMetres * heightMetres;
        _energy += energy;
        _energyTimesTe += energy * energyPeriodSeconds;
        double sigma = spreadDegrees * Math.PI / 180.0;
        double resultant = Math.Max(0.0, 1.0 - 0.5 * sigma * sigma);
        _east += energy * resultant * fromEast;
        _north += energy * resultant * fromNorth;
        double peak = energy * peakPeriodSeconds;
        if (peak > _bestPeak) { _bestPeak = peak; _peakPeriod = peakPeriodSeconds; }
    }

    /// <summary>
    /// Hs (m), Tp (s), Te (s), mean direction (degrees true, coming from, in [0, 360)) and spread
    /// (degrees). All NaN when nothing was added.
    /// </summary>
    public readonly (double Hs, double Tp, double Te, double FromDegrees, double SpreadDegrees) Result()
    {
        if (_energy <= 0) return (double.NaN, double.NaN, double.NaN, double.NaN, double.NaN);
        double direction = Math.Atan2(_east, _north) * 180.0 / Math.PI;
        if (direction < 0) direction += 360.0;
        if (direction >= 360.0) direction -= 360.0;
        double spread = SpreadFromResultant(Math.Sqrt(_east * _east + _north * _north) / _energy);
        return (Math.Sqrt(_energy), _peakPeriod, _energyTimesTe / _energy, direction, spread);
    }

    /// <summary>The circular spread sigma = sqrt(2 (1 - R)), degrees, of a mean resultant length R (0 for R at or above 1).</summary>
    public static double SpreadFromResultant(double resultant) =>
        Math.Sqrt(2.0 * Math.Max(0.0, 1.0 - resultant)) * 180.0 / Math.PI;
}
