namespace Atlas.Demo;

/// <summary>
/// First-order autoregressive noise with unit variance and an e-folding correlation time counted
/// in steps (hours for the forcing): x(n+1) = phi x(n) + sqrt(1 - phi^2) e, phi = exp(-1 / tau).
/// Starts from a stationary draw.
/// </summary>
public sealed class RedNoise
{
    private readonly Xoshiro256StarStar _random;
    private readonly double _phi, _innovation;
    private double _value;

    /// <summary>Noise with correlation time <paramref name="correlationSteps"/> (in steps) drawing from <paramref name="random"/>.</summary>
    public RedNoise(Xoshiro256StarStar random, double correlationSteps)
    {
        ArgumentNullException.ThrowIfNull(random);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(correlationSteps);
        _random = random;
        _phi = Math.Exp(-1.0 / correlationSteps);
        _innovation = Math.Sqrt(1 - _phi * _phi);
        _value = random.NextGaussian();
    }

    /// <summary>The next value.</summary>
    public double Next()
    {
        double current = _value;
        _value = _phi * _value + _innovation * _random.NextGaussian();
        return current;
    }
}
