namespace FreqReadout.Tests.Counting;

/// <summary>Synthetic edge timestamps with a known truth (test data, invented; never a reference).</summary>
internal static class EdgeStreams
{
    /// <summary>
    /// Quantised edges of an exact rational period: t_k = start + floor((phase + k * num) / den),
    /// i.e. period num/den ticks, with no other noise. Exact integer arithmetic (Int128).
    /// </summary>
    public static long QuantisedTick(long start, long phaseNum, long num, long den, long k)
    {
        Int128 v = ((Int128)k * num + phaseNum) / den;
        return start + (long)v;
    }

    /// <summary>Standard normal deviate by Box-Muller from a seeded Random.</summary>
    public static double Gaussian(Random rng)
    {
        double u1 = 1.0 - rng.NextDouble();
        double u2 = rng.NextDouble();
        return Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2.0 * Math.PI * u2);
    }
}
