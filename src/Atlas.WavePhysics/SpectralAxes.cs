namespace Atlas.WavePhysics;

/// <summary>
/// The frequency and direction axes of a discrete directional spectrum S(f, theta), with the integration weights used
/// everywhere a spectrum is integrated.
/// </summary>
/// <remarks>
/// <para>
/// Frequency integrals use the trapezoidal rule over the given frequencies, which may be unevenly spaced (geometric
/// grids are the rule in wave models): the weight of frequency i is half the distance between its neighbours (half the
/// distance to the one neighbour at either end), and nothing is added for the tails beyond the first and last frequency.
/// This is the rule of <see cref="SpectralMoments"/>, written as weights so that one pass per step does every moment.
/// </para>
/// <para>
/// Directions are bin centres, degrees the waves come from, equally spaced around the whole circle and stored in
/// increasing order from the smallest; each bin has the width 360 / n degrees (2 pi / n radians), so a direction integral
/// is a sum times the bin width. A spectrum with no direction axis has <see cref="DirectionCount"/> 0.
/// </para>
/// </remarks>
public sealed class SpectralAxes
{
    private readonly double[] _frequencies;
    private readonly double[] _weights;
    private readonly double[] _directions;

    /// <param name="frequenciesHz">Frequencies, Hz: at least two, positive, finite, strictly increasing.</param>
    /// <param name="directionsFromDegrees">
    /// Bin-centre directions the waves come from, degrees in [0, 360), increasing, equally spaced around the circle;
    /// empty for a frequency spectrum.
    /// </param>
    /// <exception cref="ArgumentException">An axis is not usable; the message says which value and why.</exception>
    public SpectralAxes(ReadOnlySpan<double> frequenciesHz, ReadOnlySpan<double> directionsFromDegrees)
    {
        if (frequenciesHz.Length < 2)
            throw new ArgumentException($"A spectrum needs at least two frequencies; {frequenciesHz.Length} given.", nameof(frequenciesHz));
        for (int i = 0; i < frequenciesHz.Length; i++)
        {
            double f = frequenciesHz[i];
            if (!(f > 0) || double.IsInfinity(f))
                throw new ArgumentException($"Frequency {i} is {f} Hz; frequencies must be positive and finite.", nameof(frequenciesHz));
            if (i > 0 && !(f > frequenciesHz[i - 1]))
                throw new ArgumentException($"Frequency {i} ({f} Hz) does not increase on frequency {i - 1} ({frequenciesHz[i - 1]} Hz).", nameof(frequenciesHz));
        }
        _frequencies = frequenciesHz.ToArray();
        _weights = TrapezoidWeights(_frequencies);

        int nd = directionsFromDegrees.Length;
        if (nd is 1 or 2)
            throw new ArgumentException($"A directional spectrum needs at least three directions around the circle; {nd} given.", nameof(directionsFromDegrees));
        _directions = directionsFromDegrees.ToArray();
        if (nd > 0)
        {
            double width = 360.0 / nd;
            for (int j = 0; j < nd; j++)
            {
                double d = _directions[j];
                if (!(d >= 0 && d < 360))
                    throw new ArgumentException($"Direction {j} is {d} degrees; directions must lie in [0, 360).", nameof(directionsFromDegrees));
                if (j > 0 && Math.Abs(d - _directions[j - 1] - width) > 1e-3 * width)
                    throw new ArgumentException(
                        $"Directions {j - 1} and {j} are {d - _directions[j - 1]:0.###} degrees apart; {nd} directions must cover the circle " +
                        $"in equal steps of {width:0.###} degrees.", nameof(directionsFromDegrees));
            }
            // The step from the last back to the first closes the circle.
            double closing = _directions[0] + 360 - _directions[nd - 1];
            if (Math.Abs(closing - width) > 1e-3 * width)
                throw new ArgumentException(
                    $"The directions run from {_directions[0]:0.###} to {_directions[nd - 1]:0.###} degrees and do not close the circle " +
                    $"in steps of {width:0.###} degrees (the gap is {closing:0.###} degrees).", nameof(directionsFromDegrees));
        }
    }

    /// <summary>Frequencies, Hz, increasing.</summary>
    public ReadOnlySpan<double> Frequencies => _frequencies;

    /// <summary>Trapezoidal weights of the frequencies, Hz: an integral over f is the weighted sum.</summary>
    public ReadOnlySpan<double> FrequencyWeights => _weights;

    /// <summary>Bin-centre directions the waves come from, degrees, increasing; empty for a frequency spectrum.</summary>
    public ReadOnlySpan<double> DirectionsFrom => _directions;

    public int FrequencyCount => _frequencies.Length;

    public int DirectionCount => _directions.Length;

    public bool IsDirectional => _directions.Length > 0;

    /// <summary>Width of a direction bin, radians (0 for a frequency spectrum).</summary>
    public double DirectionBinRadians => IsDirectional ? 2 * Math.PI / _directions.Length : 0;

    /// <summary>The trapezoidal weights of an increasing axis: half the distance between each point's neighbours.</summary>
    public static double[] TrapezoidWeights(ReadOnlySpan<double> axis)
    {
        int n = axis.Length;
        var weights = new double[n];
        for (int i = 1; i < n; i++)
        {
            double half = 0.5 * (axis[i] - axis[i - 1]);
            weights[i - 1] += half;
            weights[i] += half;
        }
        return weights;
    }
}
