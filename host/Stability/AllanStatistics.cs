namespace FreqReadout.Host.Stability;

/// <summary>
/// Two-sample frequency-stability statistics from phase (time-error) data x_i, in seconds, sampled every tau0 seconds
/// (W. J. Riley, "Handbook of Frequency Stability Analysis", NIST Special Publication 1065, 2008):
/// <list type="bullet">
/// <item>overlapping Allan variance (eq. 11): sigma_y^2(tau) = sum_{i=1}^{N-2m} (x_{i+2m} - 2 x_{i+m} + x_i)^2 / (2 (N - 2m) tau^2),
/// tau = m tau0, N phase points;</item>
/// <item>Allan variance without overlap (eq. 7 in phase form): the same sum over i = 1, 1 + m, 1 + 2m, ... with its own count;</item>
/// <item>modified Allan variance (eq. 14): Mod sigma_y^2(tau) = sum_{j=1}^{N-3m+1} (sum_{i=j}^{j+m-1} (x_{i+2m} - 2 x_{i+m} + x_i))^2
/// / (2 m^2 tau^2 (N - 3m + 1)), computed in O(N) with a running inner sum.</item>
/// </list>
/// Deviations are the square roots. Each returns NaN when there are too few points for the averaging factor
/// (N &lt; 2m + 1, or N &lt; 3m for the modified one) and for m &lt; 1. Frequency data y_i convert to phase with
/// x_0 = 0, x_{i+1} = x_i + y_i tau0 (<see cref="PhaseFromFrequency"/>).
/// </summary>
public static class AllanStatistics
{
    /// <summary>Phase from frequency (fractional or absolute) data: x_0 = 0, x_{i+1} = x_i + y_i tau0; one point more than y.</summary>
    public static double[] PhaseFromFrequency(IReadOnlyList<double> y, double tau0)
    {
        var x = new double[y.Count + 1];
        for (int i = 0; i < y.Count; i++)
        {
            x[i + 1] = x[i] + (y[i] * tau0);
        }

        return x;
    }

    /// <summary>Overlapping Allan deviation at tau = m tau0 (SP 1065 eq. 11).</summary>
    public static double OverlappingDeviation(IReadOnlyList<double> x, double tau0, int m)
    {
        int n = x.Count;
        if (m < 1 || n < (2 * m) + 1)
        {
            return double.NaN;
        }

        double sum = 0;
        for (int i = 0; i + (2 * m) < n; i++)
        {
            double d = x[i + (2 * m)] - (2 * x[i + m]) + x[i];
            sum += d * d;
        }

        double tau = m * tau0;
        return Math.Sqrt(sum / (2.0 * (n - (2 * m)) * tau * tau));
    }

    /// <summary>Allan deviation without overlap at tau = m tau0: second differences at stride m.</summary>
    public static double Deviation(IReadOnlyList<double> x, double tau0, int m)
    {
        int n = x.Count;
        if (m < 1 || n < (2 * m) + 1)
        {
            return double.NaN;
        }

        double sum = 0;
        int terms = 0;
        for (int i = 0; i + (2 * m) < n; i += m)
        {
            double d = x[i + (2 * m)] - (2 * x[i + m]) + x[i];
            sum += d * d;
            terms++;
        }

        double tau = m * tau0;
        return Math.Sqrt(sum / (2.0 * terms * tau * tau));
    }

    /// <summary>Modified Allan deviation at tau = m tau0 (SP 1065 eq. 14), O(N).</summary>
    public static double ModifiedDeviation(IReadOnlyList<double> x, double tau0, int m)
    {
        int n = x.Count;
        if (m < 1 || n < 3 * m)
        {
            return double.NaN;
        }

        int outer = n - (3 * m) + 1;
        double inner = 0;
        for (int i = 0; i < m; i++)
        {
            inner += x[i + (2 * m)] - (2 * x[i + m]) + x[i];
        }

        double sum = inner * inner;
        for (int j = 1; j < outer; j++)
        {
            if (j % 4096 == 0)
            {
                // Summed afresh now and then, so that rounding in the running sum cannot build up over millions of steps.
                inner = 0;
                for (int i = j; i < j + m; i++)
                {
                    inner += x[i + (2 * m)] - (2 * x[i + m]) + x[i];
                }

                sum += inner * inner;
                continue;
            }

            int leaving = j - 1;
            int entering = j + m - 1;
            inner += (x[entering + (2 * m)] - (2 * x[entering + m]) + x[entering]) - (x[leaving + (2 * m)] - (2 * x[leaving + m]) + x[leaving]);
            sum += inner * inner;
        }

        double tau = m * tau0;
        return Math.Sqrt(sum / (2.0 * m * m * tau * tau * outer));
    }
}
