using MathNet.Numerics.Distributions;

namespace FreqReadout.Tests.Simulation;

/// <summary>
/// Overlapping Allan variance from phase data and its confidence interval, for the simulator's statistics tests.
/// <para>Estimator (NIST SP 1065, W. J. Riley, Handbook of Frequency Stability Analysis, 2008, eq. 11):
/// sigma_y^2(m tau0) = 1 / (2 (N - 2m) (m tau0)^2) sum_{i=1}^{N-2m} (x_{i+2m} - 2 x_{i+m} + x_i)^2, x the phase (time
/// deviation, s) at N points tau0 apart; NaN when N &lt;= 2m. Checked against SP 1065 Tables 30 and 31.</para>
/// <para>Equivalent degrees of freedom (SP 1065 section 5.3, the simple formulae for the overlapping Allan variance; from
/// memory): white FM [3(N-1)/(2m) - 2(N-2)/N] 4m^2/(4m^2+5); flicker FM 2(N-2)^2/(2.3N-4.9) for m = 1 and
/// 5N^2/(4m(N+3m)) for m &gt;= 2. The variance estimate times edf over the true variance is chi-square with edf degrees of
/// freedom (SP 1065 section 5.3; quantiles from MathNet.Numerics).</para>
/// </summary>
internal static class OverlappingAllanDeviation
{
    /// <summary>Overlapping Allan variance at tau = m tau0 from phase x (s); NaN when the data are too short.</summary>
    public static double Variance(IReadOnlyList<double> phaseS, int m, double tau0S)
    {
        int n = phaseS.Count;
        if (n <= 2 * m)
        {
            return double.NaN;
        }

        double sum = 0;
        for (int i = 0; i + 2 * m < n; i++)
        {
            double d = phaseS[i + 2 * m] - (2 * phaseS[i + m]) + phaseS[i];
            sum += d * d;
        }

        double tau = m * tau0S;
        return sum / (2.0 * (n - 2 * m) * tau * tau);
    }

    /// <summary>Phase from fractional frequency data: x_0 = 0, x_{i+1} = x_i + y_i tau0 (SP 1065, section 4).</summary>
    public static double[] PhaseFromFrequency(IReadOnlyList<double> y, double tau0S)
    {
        var x = new double[y.Count + 1];
        for (int i = 0; i < y.Count; i++)
        {
            x[i + 1] = x[i] + (y[i] * tau0S);
        }

        return x;
    }

    /// <summary>Equivalent degrees of freedom for white FM, N phase points, averaging factor m.</summary>
    public static double WhiteFmEdf(int n, int m) => ((3.0 * (n - 1) / (2.0 * m)) - (2.0 * (n - 2) / n)) * (4.0 * m * m) / ((4.0 * m * m) + 5.0);

    /// <summary>Equivalent degrees of freedom for flicker FM, N phase points, averaging factor m.</summary>
    public static double FlickerFmEdf(int n, int m) => m == 1 ? 2.0 * (n - 2) * (n - 2) / ((2.3 * n) - 4.9) : 5.0 * n * n / (4.0 * m * (n + (3.0 * m)));

    /// <summary>
    /// Two-sided interval of the true variance at confidence <paramref name="confidence"/> from an estimate with
    /// <paramref name="edf"/> degrees of freedom: [v edf / chi2(1 - a/2), v edf / chi2(a/2)], a = 1 - confidence.
    /// </summary>
    public static (double Low, double High) VarianceInterval(double variance, double edf, double confidence)
    {
        double a = 1.0 - confidence;
        return (variance * edf / ChiSquared.InvCDF(edf, 1.0 - (a / 2.0)), variance * edf / ChiSquared.InvCDF(edf, a / 2.0));
    }

    /// <summary>
    /// Two-sided bounds of the ratio of two independent variance estimates of the same true variance (edf1, edf2 degrees
    /// of freedom): the ratio is F(edf1, edf2) distributed; bounds at confidence <paramref name="confidence"/>.
    /// </summary>
    public static (double Low, double High) RatioBounds(double edf1, double edf2, double confidence)
    {
        double a = 1.0 - confidence;
        return (FisherSnedecor.InvCDF(edf1, edf2, a / 2.0), FisherSnedecor.InvCDF(edf1, edf2, 1.0 - (a / 2.0)));
    }
}
