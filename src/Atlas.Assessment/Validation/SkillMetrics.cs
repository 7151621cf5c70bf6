using Atlas.Statistics;

namespace Atlas.Assessment.Validation;

/// <summary>Skill metrics of modelled against observed values (trade definitions; see each field).</summary>
public static class SkillMetrics
{
    /// <summary>
    /// Scores a scalar variable. Pairs where either value is NaN are skipped, and the count says
    /// how many were used. With no pairs every score is NaN and the count is 0.
    /// </summary>
    /// <exception cref="ArgumentException">The spans differ in length.</exception>
    public static SkillScores Compute(ReadOnlySpan<double> observed, ReadOnlySpan<double> modelled)
    {
        RequireSameLength(observed, modelled);
        int n = 0;
        double sumObserved = 0, sumModelled = 0;
        for (int i = 0; i < observed.Length; i++)
        {
            if (double.IsNaN(observed[i]) || double.IsNaN(modelled[i])) continue;
            n++;
            sumObserved += observed[i];
            sumModelled += modelled[i];
        }
        if (n == 0)
            return new SkillScores(0, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN);

        double meanObserved = sumObserved / n, meanModelled = sumModelled / n;
        double bias = meanModelled - meanObserved;
        // Second pass about the means keeps variances accurate when the means are large.
        double sumSquaredError = 0, sumSquaredErrorAboutBias = 0, sxx = 0, syy = 0, sxy = 0, sumObserved2 = 0, sumModelled2 = 0;
        for (int i = 0; i < observed.Length; i++)
        {
            double o = observed[i], m = modelled[i];
            if (double.IsNaN(o) || double.IsNaN(m)) continue;
            double error = m - o;
            sumSquaredError += error * error;
            sumSquaredErrorAboutBias += (error - bias) * (error - bias);
            double dx = o - meanObserved, dy = m - meanModelled;
            sxx += dx * dx;
            syy += dy * dy;
            sxy += dx * dy;
            sumObserved2 += o * o;
            sumModelled2 += m * m;
        }

        double rmse = Math.Sqrt(sumSquaredError / n);
        double errorStd = Math.Sqrt(sumSquaredErrorAboutBias / n);
        double scatterIndex = meanObserved != 0 ? rmse / meanObserved : double.NaN;
        double biasCorrected = meanObserved != 0 ? errorStd / meanObserved : double.NaN;
        double r = n >= 2 && sxx > 0 && syy > 0 ? Math.Clamp(sxy / Math.Sqrt(sxx * syy), -1.0, 1.0) : double.NaN;
        double symmetricSlope = sumObserved2 > 0 ? Math.Sqrt(sumModelled2 / sumObserved2) : double.NaN;
        double slope = n >= 2 && sxx > 0 ? sxy / sxx : double.NaN;
        double intercept = meanModelled - slope * meanObserved;
        return new SkillScores(n, meanObserved, meanModelled, bias, rmse, scatterIndex, biasCorrected, r, symmetricSlope, slope, intercept);
    }

    /// <summary>Scores a scalar matched series.</summary>
    /// <exception cref="ArgumentException">The series holds directions.</exception>
    public static SkillScores Compute(MatchedSeries series)
    {
        ArgumentNullException.ThrowIfNull(series);
        if (series.IsCircular)
            throw new ArgumentException("The series holds directions; use ComputeDirectional.", nameof(series));
        return Compute(series.Observed, series.Modelled);
    }

    /// <summary>
    /// Scores directions in degrees on the circle. Pairs where either value is NaN are skipped.
    /// With no pairs every score is NaN and the count is 0.
    /// </summary>
    /// <exception cref="ArgumentException">The spans differ in length.</exception>
    public static DirectionalSkillScores ComputeDirectional(ReadOnlySpan<double> observedDegrees, ReadOnlySpan<double> modelledDegrees)
    {
        RequireSameLength(observedDegrees, modelledDegrees);
        int n = 0;
        double sinObserved = 0, cosObserved = 0, sinModelled = 0, cosModelled = 0, sinDifference = 0, cosDifference = 0;
        double sumSquared = 0, sumAbsolute = 0;
        for (int i = 0; i < observedDegrees.Length; i++)
        {
            double o = observedDegrees[i], m = modelledDegrees[i];
            if (double.IsNaN(o) || double.IsNaN(m)) continue;
            n++;
            double d = CircularArc.SignedDifference(o, m);
            double oRad = double.DegreesToRadians(o), mRad = double.DegreesToRadians(m), dRad = double.DegreesToRadians(d);
            sinObserved += Math.Sin(oRad); cosObserved += Math.Cos(oRad);
            sinModelled += Math.Sin(mRad); cosModelled += Math.Cos(mRad);
            sinDifference += Math.Sin(dRad); cosDifference += Math.Cos(dRad);
            sumSquared += d * d;
            sumAbsolute += Math.Abs(d);
        }
        if (n == 0)
            return new DirectionalSkillScores(0, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN);

        double bias = CircularMean(sinDifference, cosDifference, n);
        if (bias == -180.0)
            bias = 180.0;
        return new DirectionalSkillScores(
            n,
            CircularStatistics.Normalise(CircularMean(sinObserved, cosObserved, n)),
            CircularStatistics.Normalise(CircularMean(sinModelled, cosModelled, n)),
            bias,
            Math.Sqrt(sumSquared / n),
            sumAbsolute / n);
    }

    /// <summary>Scores a matched series of directions.</summary>
    /// <exception cref="ArgumentException">The series is not circular.</exception>
    public static DirectionalSkillScores ComputeDirectional(MatchedSeries series)
    {
        ArgumentNullException.ThrowIfNull(series);
        if (!series.IsCircular)
            throw new ArgumentException("The series is not a direction; use Compute.", nameof(series));
        return ComputeDirectional(series.Observed, series.Modelled);
    }

    /// <summary>
    /// Mean direction in degrees (-180, 180] from sums of sines and cosines; NaN when the mean
    /// resultant length is negligible (the directions cancel out and no mean exists).
    /// </summary>
    private static double CircularMean(double sumSin, double sumCos, int n)
    {
        double resultant = Math.Sqrt(sumSin * sumSin + sumCos * sumCos) / n;
        return resultant < 1e-12 ? double.NaN : double.RadiansToDegrees(Math.Atan2(sumSin, sumCos));
    }

    private static void RequireSameLength(ReadOnlySpan<double> observed, ReadOnlySpan<double> modelled)
    {
        if (observed.Length != modelled.Length)
            throw new ArgumentException($"{observed.Length} observed but {modelled.Length} modelled values: pairs must line up.");
    }
}
