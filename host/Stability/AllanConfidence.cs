using MathNet.Numerics.Distributions;

namespace FreqReadout.Host.Stability;

/// <summary>
/// Confidence intervals of the overlapping Allan deviation from its equivalent degrees of freedom (edf). The edf are the
/// simple approximations of D. A. Howe, D. W. Allan and J. A. Barnes, "Properties of signal sources and measurement
/// methods" (35th Annual Frequency Control Symposium, 1981), as NIST SP 1065 (W. J. Riley, 2008) section 5.3 gives
/// them, for N phase points and averaging factor m (from memory):
/// <list type="bullet">
/// <item>white PM: (N + 1)(N - 2m) / (2 (N - m));</item>
/// <item>flicker PM: exp( sqrt( ln((N - 1) / (2m)) ln((2m + 1)(N - 1) / 4) ) );</item>
/// <item>white FM: (3 (N - 1) / (2m) - 2 (N - 2) / N) 4m^2 / (4m^2 + 5);</item>
/// <item>flicker FM: 2 (N - 2) / (2.3 N - 4.9) for m = 1, else 5 N^2 / (4m (N + 3m));</item>
/// <item>random-walk FM: (N - 2) / m ((N - 1)^2 - 3m (N - 1) + 4m^2) / (N - 3)^2.</item>
/// </list>
/// The interval of the variance is [s^2 edf / chi2(1 - a/2; edf), s^2 edf / chi2(a/2; edf)] (SP 1065 section 5.3.1),
/// chi-square quantiles from MathNet.Numerics; the deviation's interval is its square root. An unknown noise type is
/// taken as white FM (the middle of the range). Fewer than one degree of freedom gives NaN bounds.
/// </summary>
public static class AllanConfidence
{
    /// <summary>Equivalent degrees of freedom of the overlapping Allan variance for <paramref name="points"/> phase points at averaging factor <paramref name="m"/>.</summary>
    public static double EquivalentDegreesOfFreedom(NoiseType noise, long points, int m)
    {
        double n = points;
        return noise switch
        {
            NoiseType.WhitePhase => (n + 1) * (n - (2 * m)) / (2 * (n - m)),
            NoiseType.FlickerPhase => Math.Exp(Math.Sqrt(Math.Log((n - 1) / (2.0 * m)) * Math.Log(((2.0 * m) + 1) * (n - 1) / 4))),
            NoiseType.FlickerFrequency => m == 1 ? 2 * (n - 2) / ((2.3 * n) - 4.9) : 5 * n * n / (4.0 * m * (n + (3.0 * m))),
            NoiseType.RandomWalkFrequency => (n - 2) / m * (((n - 1) * (n - 1)) - (3.0 * m * (n - 1)) + (4.0 * m * m)) / ((n - 3) * (n - 3)),
            _ => ((3 * (n - 1) / (2.0 * m)) - (2 * (n - 2) / n)) * 4.0 * m * m / ((4.0 * m * m) + 5),
        };
    }

    /// <summary>The two-sided interval of a deviation at confidence <paramref name="confidence"/> (e.g. 0.683) for <paramref name="edf"/> degrees of freedom.</summary>
    public static void Interval(double deviation, double edf, double confidence, out double low, out double high)
    {
        if (!(edf >= 1) || double.IsNaN(deviation))
        {
            low = double.NaN;
            high = double.NaN;
            return;
        }

        double alpha = 1 - confidence;
        double variance = deviation * deviation;
        low = Math.Sqrt(variance * edf / ChiSquared.InvCDF(edf, 1 - (alpha / 2)));
        high = Math.Sqrt(variance * edf / ChiSquared.InvCDF(edf, alpha / 2));
    }
}
