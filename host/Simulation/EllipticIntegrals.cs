namespace FreqReadout.Host.Simulation;

/// <summary>
/// Complete elliptic integrals of the first and second kind by the arithmetic-geometric mean
/// (MathNet.Numerics 5.0.0 has no elliptic integrals). Parameter convention: m = k^2.
/// </summary>
public static class EllipticIntegrals
{
    /// <summary>
    /// K(m) = integral_0^{pi/2} dt / sqrt(1 - m sin^2 t) = pi / (2 AGM(1, sqrt(1 - m))).
    /// Valid for 0 &lt;= m &lt; 1; m = 1 gives +infinity; outside [0, 1] throws.
    /// </summary>
    public static double CompleteK(double m)
    {
        Check(m);
        if (m == 1.0)
        {
            return double.PositiveInfinity;
        }

        double a = 1.0;
        double b = Math.Sqrt(1.0 - m);
        for (int i = 0; i < 64 && Math.Abs(a - b) > 1e-16 * a; i++)
        {
            double an = 0.5 * (a + b);
            b = Math.Sqrt(a * b);
            a = an;
        }

        return Math.PI / (a + b);
    }

    /// <summary>
    /// E(m) = integral_0^{pi/2} sqrt(1 - m sin^2 t) dt = K(m) (1 - sum_{n&gt;=0} 2^(n-1) c_n^2) with the AGM
    /// sequence a_0 = 1, b_0 = sqrt(1 - m), c_0 = sqrt(m), c_{n+1} = (a_n - b_n)/2. Valid for 0 &lt;= m &lt;= 1
    /// (E(1) = 1); outside [0, 1] throws.
    /// </summary>
    public static double CompleteE(double m)
    {
        Check(m);
        if (m == 1.0)
        {
            return 1.0;
        }

        double a = 1.0;
        double b = Math.Sqrt(1.0 - m);
        double sum = 0.5 * m; // 2^(-1) c_0^2
        double weight = 0.5;
        for (int i = 0; i < 64; i++)
        {
            double c = 0.5 * (a - b);
            double an = 0.5 * (a + b);
            b = Math.Sqrt(a * b);
            a = an;
            weight *= 2.0;
            double term = weight * c * c;
            sum += term;
            if (term <= 1e-17 * sum)
            {
                break;
            }
        }

        double k = Math.PI / (2.0 * a);
        return k * (1.0 - sum);
    }

    private static void Check(double m)
    {
        if (!(m >= 0.0 && m <= 1.0))
        {
            throw new ArgumentOutOfRangeException(nameof(m), m, "elliptic parameter m = k^2 must lie in [0, 1]");
        }
    }
}
