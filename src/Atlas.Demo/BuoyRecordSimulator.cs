namespace Atlas.Demo;

/// <summary>
/// Turns the model's truth at a buoy's cell into what a buoy would have logged: independent
/// sampling noise on each record (a half-hour record of a random sea estimates Hs to about 5-8 %,
/// Tp worse; common practice, from memory), slowly varying local departures the 2 km cells do not
/// resolve (red noise with an 18 h memory), so that the hindcast meets the buoys with the scatter
/// index of about 0.1-0.15 of a well-calibrated regional model, the buoy's known Hs bias, the peak
/// period quantised to the 0.005 Hz frequency resolution of a typical on-board spectrum, values
/// rounded to the logged resolution, a few gaps (mooring and service outages, rows absent) and a handful of flagged
/// rows: suspect spikes (qc 1) and dropouts with no values (qc 2).
/// </summary>
public static class BuoyRecordSimulator
{
    /// <summary>Relative (log-normal) noise of Hs.</summary>
    public const double HsNoise = 0.06;

    /// <summary>Relative noise of Te.</summary>
    public const double TeNoise = 0.035;

    /// <summary>Relative noise of Tp before quantisation.</summary>
    public const double TpNoise = 0.05;

    /// <summary>Relative (log-normal) size of the unresolved local departures of Hs.</summary>
    public const double HsLocalVariability = 0.07;

    /// <summary>Relative size of the unresolved local departures of Te.</summary>
    public const double TeLocalVariability = 0.03;

    /// <summary>Size of the unresolved local departures of the direction, degrees.</summary>
    public const double DirectionLocalVariabilityDegrees = 5.0;

    /// <summary>Memory of the unresolved local departures, hours.</summary>
    public const double LocalVariabilityHours = 18.0;

    /// <summary>Noise of the mean direction, degrees.</summary>
    public const double DirectionNoiseDegrees = 7.0;

    /// <summary>Frequency resolution of the on-board spectrum, Hz.</summary>
    public const double FrequencyResolutionHertz = 0.005;

    /// <summary>Number of outages (runs of absent rows).</summary>
    public const int GapCount = 3;

    /// <summary>Number of suspect spikes (qc 1).</summary>
    public const int SpikeCount = 4;

    /// <summary>Number of dropouts (qc 2).</summary>
    public const int DropoutCount = 3;

    /// <summary>
    /// The record of <paramref name="buoy"/> at wet cell <paramref name="cell"/> from
    /// <paramref name="start"/> to <paramref name="end"/> (exclusive), drawing its noise from
    /// <paramref name="random"/>.
    /// </summary>
    public static IReadOnlyList<BuoyObservation> Simulate(
        SeaStateModel model, int cell, DemoBuoy buoy, DateTime start, DateTime end, Xoshiro256StarStar random)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(buoy);
        ArgumentNullException.ThrowIfNull(random);
        var interval = TimeSpan.FromMinutes(buoy.IntervalMinutes);
        int count = (int)((end - start).Ticks / interval.Ticks);
        if (count < 10 * (GapCount + SpikeCount + DropoutCount))
            throw new ArgumentOutOfRangeException(nameof(end), end, "The period is too short for a buoy record with gaps and flagged rows.");

        var absent = new bool[count];
        int longestGap = Math.Max(1, count / 40);
        for (int g = 0; g < GapCount; g++)
        {
            int length = 1 + random.NextInt(longestGap);
            int first = random.NextInt(count - length);
            for (int i = first; i < first + length; i++) absent[i] = true;
        }
        var quality = new int[count];
        for (int f = 0; f < SpikeCount + DropoutCount; f++)
        {
            int at;
            do at = random.NextInt(count); while (absent[at] || quality[at] != 0);
            quality[at] = f < SpikeCount ? 1 : 2;
        }

        // Red noise advances hourly; at other intervals it is drawn once per record with the
        // memory scaled to keep the same e-folding time.
        double memory = LocalVariabilityHours * 60.0 / buoy.IntervalMinutes;
        var localHs = new RedNoise(random, memory);
        var localTe = new RedNoise(random, memory);
        var localDirection = new RedNoise(random, memory);
        var rows = new List<BuoyObservation>(count);
        double originHours = (start - model.Forcing.Origin).TotalHours;
        for (int i = 0; i < count; i++)
        {
            // Draw the noise for every slot, delivered or not, so a gap leaves the rest unchanged.
            double eHs = random.NextGaussian(), eTe = random.NextGaussian(), eTp = random.NextGaussian(), eDir = random.NextGaussian();
            double lHs = localHs.Next(), lTe = localTe.Next(), lDir = localDirection.Next();
            if (absent[i]) continue;
            var time = start + i * interval;
            if (quality[i] == 2)
            {
                rows.Add(new BuoyObservation(time, double.NaN, double.NaN, double.NaN, double.NaN, 2));
                continue;
            }
            var truth = model.Evaluate(cell, originHours + i * interval.TotalHours);
            double hs = truth.Hs * (1 + buoy.HsBiasFraction) * Math.Exp(HsNoise * eHs + HsLocalVariability * lHs);
            if (quality[i] == 1) hs *= 1.8 + 0.4 * random.NextDouble();
            double te = truth.Te * Math.Exp(TeNoise * eTe + TeLocalVariability * lTe);
            double tp = QuantisePeakPeriod(truth.Tp * Math.Exp(TpNoise * eTp));
            double direction = truth.FromDegrees + DirectionNoiseDegrees * eDir + DirectionLocalVariabilityDegrees * lDir;
            direction -= 360.0 * Math.Floor(direction / 360.0);
            direction = Math.Round(direction, 1);
            if (direction >= 360.0) direction = 0.0;
            rows.Add(new BuoyObservation(time, Math.Round(hs, 2), Math.Round(tp, 2), Math.Round(te, 2), direction, quality[i]));
        }
        return rows;
    }

    /// <summary>The period of the spectral bin nearest to 1 / <paramref name="periodSeconds"/>.</summary>
    public static double QuantisePeakPeriod(double periodSeconds)
    {
        double bins = Math.Max(1.0, Math.Round(1.0 / (periodSeconds * FrequencyResolutionHertz)));
        return 1.0 / (bins * FrequencyResolutionHertz);
    }
}
