namespace Atlas.Demo;

/// <summary>
/// Hourly first-order autoregressive noise with unit variance and an e-folding correlation time:
/// x(n+1) = phi x(n) + sqrt(1 - phi^2) e, phi = exp(-1 / tau). Starts from a stationary draw.
/// </summary>
public sealed class RedNoise
{
    private readonly Xoshiro256StarStar _random;
    private readonly double _phi, _innovation;
    private double _value;

    /// <summary>Noise with correlation time <paramref name="correlationHours"/> drawing from <paramref name="random"/>.</summary>
    public RedNoise(Xoshiro256StarStar random, double correlationHours)
    {
        ArgumentNullException.ThrowIfNull(random);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(correlationHours);
        _random = random;
        _phi = Math.Exp(-1.0 / correlationHours);
        _innovation = Math.Sqrt(1 - _phi * _phi);
        _value = random.NextGaussian();
    }

    /// <summary>The next hourly value.</summary>
    public double Next()
    {
        double current = _value;
        _value = _phi * _value + _innovation * _random.NextGaussian();
        return current;
    }
}
