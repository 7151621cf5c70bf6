namespace Atlas.Demo;

/// <summary>
/// The xoshiro256** generator (Blackman and Vigna, 2018), seeded through SplitMix64.
/// The demo owns its generator instead of using <see cref="Random"/> so that a seed gives the
/// same numbers on every runtime version; each purpose (swell, wind, storms, each buoy) takes
/// its own stream so that changing one does not shift the others.
/// </summary>
public sealed class Xoshiro256StarStar
{
    private ulong _s0, _s1, _s2, _s3;
    private double _spareGaussian;
    private bool _hasSpare;

    /// <summary>Creates the stream <paramref name="stream"/> of the scenario seed <paramref name="seed"/>.</summary>
    public Xoshiro256StarStar(ulong seed, ulong stream)
    {
        ulong state = seed ^ (0x9E3779B97F4A7C15UL * (stream + 1));
        _s0 = SplitMix64(ref state);
        _s1 = SplitMix64(ref state);
        _s2 = SplitMix64(ref state);
        _s3 = SplitMix64(ref state);
    }

    /// <summary>The next 64 random bits.</summary>
    public ulong NextUInt64()
    {
        ulong result = RotateLeft(_s1 * 5, 7) * 9;
        ulong t = _s1 << 17;
        _s2 ^= _s0;
        _s3 ^= _s1;
        _s1 ^= _s2;
        _s0 ^= _s3;
        _s2 ^= t;
        _s3 = RotateLeft(_s3, 45);
        return result;
    }

    /// <summary>A uniform deviate in [0, 1) with 53 random bits.</summary>
    public double NextDouble() => (NextUInt64() >> 11) * (1.0 / (1UL << 53));

    /// <summary>A uniform deviate in [<paramref name="low"/>, <paramref name="high"/>).</summary>
    public double NextUniform(double low, double high) => low + (high - low) * NextDouble();

    /// <summary>A uniform integer in [0, <paramref name="count"/>).</summary>
    public int NextInt(int count)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(count);
        return (int)(NextDouble() * count);
    }

    /// <summary>A standard normal deviate (Marsaglia polar method).</summary>
    public double NextGaussian()
    {
        if (_hasSpare)
        {
            _hasSpare = false;
            return _spareGaussian;
        }
        double u, v, s;
        do
        {
            u = 2 * NextDouble() - 1;
            v = 2 * NextDouble() - 1;
            s = u * u + v * v;
        } while (s >= 1 || s == 0);
        double factor = Math.Sqrt(-2 * Math.Log(s) / s);
        _spareGaussian = v * factor;
        _hasSpare = true;
        return u * factor;
    }

    private static ulong SplitMix64(ref ulong state)
    {
        ulong z = state += 0x9E3779B97F4A7C15UL;
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
        return z ^ (z >> 31);
    }

    private static ulong RotateLeft(ulong x, int k) => (x << k) | (x >> (64 - k));
}
