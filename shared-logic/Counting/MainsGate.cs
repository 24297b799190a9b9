using FreqReadout.Numerics;

namespace FreqReadout.Counting
{
    /// <summary>
    /// Time-gate lengths that cancel a sinusoidal frequency modulation at the mains frequency (a
    /// readout near live wiring picks it up). Pure functions, no state.
    /// <para>
    /// A gate estimate is a weighted mean of the instantaneous frequency over the gate T. The
    /// reciprocal estimate weights it uniformly; its response to a modulation at f_m is
    /// sin(z) / z with z = pi f_m T, zero when the gate spans whole mains periods, T = k / f_m
    /// (common practice, no source). The least-squares (regression) estimate, over edges or over
    /// snapshots, weights it by the parabola 6 t (T - t) / T^3 (Rubiola, Rev. Sci. Instrum. 76,
    /// 054703, 2005: the Omega counter's weight function); its response is the transform of that
    /// parabola, 3 (sin z - z cos z) / z^3, which is not zero at whole periods (it is -12 / (2 pi k)^2
    /// there) but where tan z = z: z_k = 4.4934, 7.7253, 10.9041, ..., just under (k + 1/2) pi (the
    /// zeros of the spherical Bessel function j1; Abramowitz and Stegun 1964, Table 10.6, from
    /// memory; the tests find them again by bisection). So a regression gate spans z_k / pi =
    /// 1.4303, 2.4590, 3.4709, ... mains periods.
    /// </para>
    /// <para>
    /// A gate closes on the first edge (or snapshot) at or after T, so its real span is T plus up to
    /// one recorded period; the residual response grows with that overshoot over the mains period.
    /// </para>
    /// </summary>
    public static class MainsGate
    {
        /// <summary>Lowest mains frequency accepted, Hz (10).</summary>
        public const double MinMainsHz = 10.0;

        /// <summary>Highest mains frequency accepted, Hz (1000).</summary>
        public const double MaxMainsHz = 1000.0;

        /// <summary>
        /// The gate length nearest to <paramref name="gateSeconds"/> that nulls a modulation at
        /// <paramref name="mainsHz"/> for the estimator: reciprocal k / f_m with k = max(1, round(T f_m));
        /// regression and snapshot regression z_k / (pi f_m) with the zero z_k of tan z = z whose
        /// period count z_k / pi is nearest to T f_m (at least the first, 1.4303 periods).
        /// </summary>
        /// <param name="gateSeconds">Requested gate, seconds (&gt; 0).</param>
        /// <param name="mainsHz">Mains frequency, Hz; 0 or less returns <paramref name="gateSeconds"/> unchanged.</param>
        /// <param name="estimator">The estimator whose weighting the gate is matched to.</param>
        /// <returns>The gate length, seconds.</returns>
        public static double GateSecondsFor(double gateSeconds, double mainsHz, EstimatorKind estimator)
        {
            if (!(mainsHz > 0))
            {
                return gateSeconds;
            }

            return MainsPeriodsFor(gateSeconds * mainsHz, estimator) / mainsHz;
        }

        /// <summary>
        /// The number of mains periods a nulling gate spans, nearest to <paramref name="periods"/>:
        /// a whole number for the reciprocal estimate, z_k / pi (tan z_k = z_k) for the regressions.
        /// </summary>
        /// <param name="periods">Requested gate in mains periods (T f_m).</param>
        /// <param name="estimator">The estimator.</param>
        /// <returns>The nulling period count (at least 1 for reciprocal, 1.4303 for regression).</returns>
        public static double MainsPeriodsFor(double periods, EstimatorKind estimator)
        {
            if (estimator == EstimatorKind.Reciprocal)
            {
                long k = ScalarMath.RoundToLong(periods);
                return k < 1 ? 1.0 : k;
            }

            // z_k / pi lies in (k, k + 1/2): the nearest zero is k = round(periods - 0.5) give or take one.
            long guess = ScalarMath.RoundToLong(periods - 0.5);
            if (guess < 1)
            {
                guess = 1;
            }

            double best = ParabolicZeroPeriods(guess);
            if (guess > 1)
            {
                double lower = ParabolicZeroPeriods(guess - 1);
                if (ScalarMath.Abs(lower - periods) < ScalarMath.Abs(best - periods))
                {
                    best = lower;
                }
            }

            double upper = ParabolicZeroPeriods(guess + 1);
            if (ScalarMath.Abs(upper - periods) < ScalarMath.Abs(best - periods))
            {
                best = upper;
            }

            return best;
        }

        /// <summary>
        /// z_k / pi for the k-th positive root of tan z = z (k &gt;= 1): the asymptotic series
        /// z = q - 1/q - 2/(3 q^3) - 13/(15 q^5) - 146/(105 q^7), q = (k + 1/2) pi (from memory), then two
        /// Newton steps on sin z - z cos z (derivative z sin z).
        /// </summary>
        /// <param name="k">Root index, &gt;= 1.</param>
        /// <returns>z_k / pi: 1.4303 for k = 1, 2.4590 for k = 2, ...</returns>
        public static double ParabolicZeroPeriods(long k)
        {
            if (k < 1)
            {
                k = 1;
            }

            double q = (k + 0.5) * ScalarMath.Pi;
            double q2 = q * q;
            double z = q - (1.0 / q) - (2.0 / (3.0 * q * q2)) - (13.0 / (15.0 * q * q2 * q2)) - (146.0 / (105.0 * q * q2 * q2 * q2));
            for (int step = 0; step < 2; step++)
            {
                double x = z / ScalarMath.Pi;
                double s = ScalarMath.SinPi(x);
                double c = ScalarMath.CosPi(x);
                double derivative = z * s;
                if (derivative == 0)
                {
                    break;
                }

                z -= (s - (z * c)) / derivative;
            }

            return z / ScalarMath.Pi;
        }
    }
}
