namespace FreqReadout.Numerics
{
    /// <summary>
    /// Least squares of a drift that keeps its quadratic and gains a new rate at an unknown time (a kink):
    /// y = c0 + c1 u + c2 u^2 + db h, h = max(0, t - t_k), u = t - origin, fitted to two windows — an early one, all
    /// before t_k, and a late one, all after it — with t_k chosen on a grid to give the least sum of squares.
    /// <para>
    /// The quadratic part is an ordinary <see cref="QuadraticFit"/> of both windows: z = S^-1 T its coefficients and
    /// S^-1 its covariance factors (S, T its normal matrix and right-hand side). For a fixed t_k (d = t_k - origin)
    /// the late points have h = u - d, so the sums the fourth column needs follow from sums kept once over the late
    /// window, A_k = sum u^k (k = 0..3) and B_k = sum u^k y (k = 0, 1): h = [sum h, sum h u, sum h u^2] =
    /// [A1 A2 A3] - d [A0 A1 A2], sum h^2 = A2 - 2 d A1 + d^2 A0, sum h y = B1 - d B0. With w = S^-1 h and the Schur
    /// complement s = sum h^2 - h . w (a partitioned solve of the 4 x 4 normal equations): db = (sum h y - h . z) / s,
    /// c = z - db w, and the residual sum of squares is that of the quadratic alone less (sum h y - h . z)^2 / s, so
    /// the best t_k is the one with the largest such reduction. O(1) per t_k after O(n) accumulation.
    /// Fewer than 5 points, no late point, or a singular system: <see cref="TrySolve"/> returns false and the
    /// coefficients stay 0. Nothing allocates; no struct is made.
    /// </para>
    /// </summary>
    internal sealed class KinkFit
    {
        /// <summary>Most kink times one solve tries (the step is widened for a longer span).</summary>
        public const int MaxSteps = 400;

        private readonly QuadraticFit both = new QuadraticFit();
        private double a0;
        private double a1;
        private double a2;
        private double a3;
        private double b0;
        private double b1;
        private double p0;
        private double p1;
        private double p2;
        private double q0;
        private double q1;
        private double q2;
        private double c0;
        private double c1;
        private double c2;
        private double c3;
        private double kinkSeconds;
        private double reduction;

        /// <summary>Time of the kink of the last solve, s.</summary>
        public double KinkSeconds
        {
            get { return kinkSeconds; }
        }

        /// <summary>The change of rate at the kink of the last solve, per second.</summary>
        public double RateChange
        {
            get { return c3; }
        }

        /// <summary>Forgets the points and sets the time origin (near the points).</summary>
        public void Clear(double originSeconds)
        {
            both.Clear(originSeconds);
            a0 = 0;
            a1 = 0;
            a2 = 0;
            a3 = 0;
            b0 = 0;
            b1 = 0;
            c0 = 0;
            c1 = 0;
            c2 = 0;
            c3 = 0;
        }

        /// <summary>Adds a point of the early window (before any kink tried).</summary>
        public void AddEarly(double timeSeconds, double value)
        {
            both.Add(timeSeconds, value);
        }

        /// <summary>Adds a point of the late window (after any kink tried).</summary>
        public void AddLate(double timeSeconds, double value)
        {
            both.Add(timeSeconds, value);
            double u = timeSeconds - both.OriginSeconds;
            a0 += 1;
            a1 += u;
            a2 += u * u;
            a3 += u * u * u;
            b0 += value;
            b1 += u * value;
        }

        /// <summary>
        /// Tries kink times from fromSeconds to toSeconds in steps of stepSeconds (widened so that at most
        /// <see cref="MaxSteps"/> + 1 are tried; the late window must lie after toSeconds) and keeps the one with the
        /// least residual sum of squares; false when none could be solved.
        /// </summary>
        public bool TrySolve(double fromSeconds, double toSeconds, double stepSeconds)
        {
            if (both.Count < 5 || a0 < 1 || !(stepSeconds > 0) || !both.TrySolve())
            {
                return false;
            }

            // w = p - d q with p = S^-1 [A1 A2 A3], q = S^-1 [A0 A1 A2].
            double i00 = both.ValueVarianceFactor;
            double i01 = both.ValueSlopeCovarianceFactor;
            double i02 = both.ValueCurvatureCovarianceFactor;
            double i11 = both.SlopeVarianceFactor;
            double i12 = both.SlopeCurvatureCovarianceFactor;
            double i22 = both.CurvatureVarianceFactor;
            p0 = (i00 * a1) + (i01 * a2) + (i02 * a3);
            p1 = (i01 * a1) + (i11 * a2) + (i12 * a3);
            p2 = (i02 * a1) + (i12 * a2) + (i22 * a3);
            q0 = (i00 * a0) + (i01 * a1) + (i02 * a2);
            q1 = (i01 * a0) + (i11 * a1) + (i12 * a2);
            q2 = (i02 * a0) + (i12 * a1) + (i22 * a2);

            int steps = (int)(((toSeconds - fromSeconds) / stepSeconds) + 0.5);
            if (steps > MaxSteps)
            {
                stepSeconds = (toSeconds - fromSeconds) / MaxSteps;
                steps = MaxSteps;
            }

            bool found = false;
            double best = 0;
            double bestKink = 0;
            for (int k = 0; k <= steps; k++)
            {
                double tk = fromSeconds + (k * stepSeconds);
                if (SolveAt(tk) && (!found || reduction > best))
                {
                    found = true;
                    best = reduction;
                    bestKink = tk;
                }
            }

            return found && SolveAt(bestKink);
        }

        /// <summary>The fitted rate at a time, c1 + 2 c2 u + db (after t_k; without db before it), per second.</summary>
        public double SlopeAt(double timeSeconds)
        {
            double u = timeSeconds - both.OriginSeconds;
            return c1 + (2.0 * c2 * u) + (timeSeconds > kinkSeconds ? c3 : 0.0);
        }

        /// <summary>The fitted value at a time, c0 + c1 u + c2 u^2 + db max(0, t - t_k).</summary>
        public double Evaluate(double timeSeconds)
        {
            double u = timeSeconds - both.OriginSeconds;
            double h = timeSeconds > kinkSeconds ? timeSeconds - kinkSeconds : 0.0;
            return c0 + (u * (c1 + (u * c2))) + (c3 * h);
        }

        // The fit for one kink time (class summary); false when the Schur complement vanishes.
        private bool SolveAt(double tk)
        {
            double d = tk - both.OriginSeconds;
            double h0 = a1 - (d * a0);
            double h1 = a2 - (d * a1);
            double h2 = a3 - (d * a2);
            double hh = a2 - (2.0 * d * a1) + (d * d * a0);
            double hy = b1 - (d * b0);
            double w0 = p0 - (d * q0);
            double w1 = p1 - (d * q1);
            double w2 = p2 - (d * q2);
            double schur = hh - ((h0 * w0) + (h1 * w1) + (h2 * w2));
            if (!(schur > 1e-12 * (hh > 0 ? hh : 1.0)))
            {
                return false;
            }

            double projection = hy - ((h0 * both.Value) + (h1 * both.Slope) + (h2 * both.HalfCurvature));
            double db = projection / schur;
            c0 = both.Value - (db * w0);
            c1 = both.Slope - (db * w1);
            c2 = both.HalfCurvature - (db * w2);
            c3 = db;
            kinkSeconds = tk;
            reduction = projection * projection / schur;
            return true;
        }
    }
}
