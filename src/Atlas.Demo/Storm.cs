namespace Atlas.Demo;

/// <summary>
/// One invented Atlantic low passing the coast. Its wind rises and falls as sin^2 over
/// <see cref="DurationHours"/>, veering from <see cref="StartFromDegrees"/> to
/// <see cref="EndFromDegrees"/> (south-west round to west or north-west, as lows passing to the
/// north do); after the peak it leaves a decaying long-period swell from the end direction.
/// </summary>
/// <param name="StartHour">Hours after the forcing origin at which the wind starts to rise.</param>
/// <param name="DurationHours">Length of the wind event, h (24 to 72).</param>
/// <param name="PeakWindMetresPerSecond">Added wind speed at the peak, m/s.</param>
/// <param name="StartFromDegrees">Wind direction (coming from) at the start, degrees true.</param>
/// <param name="EndFromDegrees">Wind direction (coming from) at the end, degrees true.</param>
/// <param name="SwellHeightMetres">Height of the swell left behind, m, at its start.</param>
/// <param name="SwellPeakPeriodSeconds">Peak period of that swell, s, at its start.</param>
public sealed record Storm(
    double StartHour,
    double DurationHours,
    double PeakWindMetresPerSecond,
    double StartFromDegrees,
    double EndFromDegrees,
    double SwellHeightMetres,
    double SwellPeakPeriodSeconds)
{
    /// <summary>Hour of the wind peak.</summary>
    public double PeakHour => StartHour + DurationHours / 2;
}
