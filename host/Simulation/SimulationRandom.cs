using System.Runtime.CompilerServices;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// Seeded pseudo-random numbers for the simulator: xoshiro256** (Blackman and Vigna, 2018) seeded through SplitMix64,
/// written out here so the stream never changes with the runtime. Normal deviates by the Marsaglia polar method.
/// The same seed and stream number give the same sequence.
/// </summary>
public sealed class SimulationRandom
{
    private ulong _s0, _s1, _s2, _s3;
    private bool _haveSpare;
    private double _spare;

    /// <summary>Creates stream <paramref name="stream"/> of seed <paramref name="seed"/> (independent streams per noise source).</summary>
    public SimulationRandom(long seed, int stream)
    {
        ulong x = unchecked((ulong)seed ^ (0x9E3779B97F4A7C15UL * (ulong)(stream + 1)));
        _s0 = SplitMix(ref x);
        _s1 = SplitMix(ref x);
        _s2 = SplitMix(ref x);
        _s3 = SplitMix(ref x);
    }

    /// <summary>Next 64 random bits.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
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

    /// <summary>Uniform in [0, 1) with 53 random bits.</summary>
    public double NextDouble() => (NextUInt64() >> 11) * (1.0 / 9007199254740992.0);

    /// <summary>Standard normal deviate (mean 0, variance 1).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double NextGaussian()
    {
        if (_haveSpare)
        {
            _haveSpare = false;
            return _spare;
        }

        double u, v, s;
        do
        {
            u = 2.0 * NextDouble() - 1.0;
            v = 2.0 * NextDouble() - 1.0;
            s = u * u + v * v;
        }
        while (s >= 1.0 || s == 0.0);

        double f = Math.Sqrt(-2.0 * Math.Log(s) / s);
        _spare = v * f;
        _haveSpare = true;
        return u * f;
    }

    /// <summary>Exponential deviate with the given mean (mean &gt; 0); +infinity when the mean is infinite.</summary>
    public double NextExponential(double mean)
    {
        if (double.IsPositiveInfinity(mean))
        {
            return double.PositiveInfinity;
        }

        return -mean * Math.Log(1.0 - NextDouble());
    }

    private static ulong RotateLeft(ulong x, int k) => (x << k) | (x >> (64 - k));

    private static ulong SplitMix(ref ulong x)
    {
        x += 0x9E3779B97F4A7C15UL;
        ulong z = x;
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
        return z ^ (z >> 31);
    }
}
