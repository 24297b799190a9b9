namespace FreqReadout.Numerics
{
    /// <summary>
    /// Least squares of a drift that keeps its quadratic and gains a new rate at an unknown time (a kink):
    /// y = c0 + c1 u + c2 u^2 + db h, h = max(0, t - t_k), u = t - origin, fitted to two windows — an early one, all
    /// before t_k, and a late one, all after it — with t_k chosen on a grid to give the least sum of squares.
    /// <para>
    /// For a fixed t_k (d = t_k - origin) the late points have h = u - d, so every sum the 4 x 4 normal equations need
    /// follows from running sums kept once: S_k = sum u^k (k = 0..4) and T_k = sum u^k y (k = 0..2) over both windows,
    /// A_k = sum u^k (k = 0..3) and B_k = sum u^k y (k = 0, 1) over the late one, and Y = sum y^2 — for example
    /// sum h = A_1 - d A_0, sum h^2 = A_2 - 2 d A_1 + d^2 A_0, sum h y = B_1 - d B_0. The residual sum of squares is
    /// Y - c . r (r the right-hand side). The 3 x 3 block of the quadratic does not depend on t_k: it is inverted once
    /// (cofactors), and each t_k is solved by the Schur complement of that block (the formulas at SolveAt), O(1) each
    /// after O(n) accumulation. Empty input, fewer than 5 points, no late point, or a singular system:
    /// <see cref="TrySolve"/> returns false and the coefficients stay 0.
    /// </para>
    /// Nothing allocates; no struct is made.
    /// </summary>
    internal sealed class KinkFit
    {
        /// <summary>Most kink times one solve tries (the step is widened for a longer span).</summary>
        public const int MaxSteps = 400;

        private double origin;
        private double s0;
        private double s1;
        private double s2;
        private double s3;
        private double s4;
        private double t0;
        private double t1;
        private double t2;
        private double a0;
        private double a1;
        private double a2;
        private double a3;
        private double b0;
        private double b1;
        private double y2;
        private double i00;
        private double i01;
        private double i02;
        private double i11;
        private double i12;
        private double i22;
        private double z0;
        private double z1;
        private double z2;
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
        private double residualSquares;

        /// <summary>Time of the kink of the last solve, s.</summary>
        public double KinkSeconds
        {
            get { return kinkSeconds; }
        }

        /// <summary>Residual sum of squares of the last solve.</summary>
        public double ResidualSquares
        {
            get { return residualSquares; }
        }

        /// <summary>The change of rate at the kink of the last solve, per second.</summary>
        public double RateChange
        {
            get { return c3; }
        }

        /// <summary>Forgets the points and sets the time origin (near the points).</summary>
        public void Clear(double originSeconds)
        {
            origin = originSeconds;
            s0 = 0;
            s1 = 0;
            s2 = 0;
            s3 = 0;
            s4 = 0;
            t0 = 0;
            t1 = 0;
            t2 = 0;
            a0 = 0;
            a1 = 0;
            a2 = 0;
            a3 = 0;
            b0 = 0;
            b1 = 0;
            y2 = 0;
            c0 = 0;
            c1 = 0;
            c2 = 0;
            c3 = 0;
        }

        /// <summary>Adds a point of the early window (before any kink tried).</summary>
        public void AddEarly(double timeSeconds, double value)
        {
            double u = timeSeconds - origin;
            double u2 = u * u;
            s0 += 1;
            s1 += u;
            s2 += u2;
            s3 += u2 * u;
            s4 += u2 * u2;
            t0 += value;
            t1 += u * value;
            t2 += u2 * value;
            y2 += value * value;
        }

        /// <summary>Adds a point of the late window (after any kink tried).</summary>
        public void AddLate(double timeSeconds, double value)
        {
            AddEarly(timeSeconds, value);
            double u = timeSeconds - origin;
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
            bool found = false;
            double best = 0;
            double bestKink = 0;
            if (s0 < 5 || a0 < 1 || !(stepSeconds > 0) || !Prepare())
            {
                return false;
            }

            int steps = (int)(((toSeconds - fromSeconds) / stepSeconds) + 0.5);
            if (steps > MaxSteps)
            {
                stepSeconds = (toSeconds - fromSeconds) / MaxSteps;
                steps = MaxSteps;
            }

            for (int k = 0; k <= steps; k++)
            {
                double tk = fromSeconds + (k * stepSeconds);
                if (SolveAt(tk) && (!found || residualSquares < best))
                {
                    found = true;
                    best = residualSquares;
                    bestKink = tk;
                }
            }

            if (!found)
            {
                return false;
            }

            return SolveAt(bestKink);
        }

        /// <summary>The fitted value at a time, c0 + c1 u + c2 u^2 + db max(0, t - t_k).</summary>
        public double Evaluate(double timeSeconds)
        {
            double u = timeSeconds - origin;
            double h = timeSeconds > kinkSeconds ? timeSeconds - kinkSeconds : 0.0;
            return c0 + (u * (c1 + (u * c2))) + (c3 * h);
        }

        // Inverse of the 3 x 3 block [S0 S1 S2; S1 S2 S3; S2 S3 S4] (which no kink time changes) and the three solves
        // that every kink time reuses: z1 = S^-1 T, p = S^-1 [A1 A2 A3], q = S^-1 [A0 A1 A2]; false when singular.
        private bool Prepare()
        {
            double m00 = (s2 * s4) - (s3 * s3);
            double m01 = (s2 * s3) - (s1 * s4);
            double m02 = (s1 * s3) - (s2 * s2);
            double m11 = (s0 * s4) - (s2 * s2);
            double m12 = (s1 * s2) - (s0 * s3);
            double m22 = (s0 * s2) - (s1 * s1);
            double det = (s0 * m00) + (s1 * m01) + (s2 * m02);
            double scale = ScalarMath.Abs(s0 * s2 * s4) + ScalarMath.Abs(s1 * s3 * s2) + ScalarMath.Abs(s2 * s2 * s2);
            if (!(ScalarMath.Abs(det) > 1e-12 * scale))
            {
                return false;
            }

            i00 = m00 / det;
            i01 = m01 / det;
            i02 = m02 / det;
            i11 = m11 / det;
            i12 = m12 / det;
            i22 = m22 / det;
            z0 = (i00 * t0) + (i01 * t1) + (i02 * t2);
            z1 = (i01 * t0) + (i11 * t1) + (i12 * t2);
            z2 = (i02 * t0) + (i12 * t1) + (i22 * t2);
            p0 = (i00 * a1) + (i01 * a2) + (i02 * a3);
            p1 = (i01 * a1) + (i11 * a2) + (i12 * a3);
            p2 = (i02 * a1) + (i12 * a2) + (i22 * a3);
            q0 = (i00 * a0) + (i01 * a1) + (i02 * a2);
            q1 = (i01 * a0) + (i11 * a1) + (i12 * a2);
            q2 = (i02 * a0) + (i12 * a1) + (i22 * a2);
            return true;
        }

        // The fit for one kink time by the Schur complement of the 3 x 3 block: with h = [sum h, sum h u, sum h u^2]
        // = [A1 A2 A3] - d [A0 A1 A2], w = S^-1 h = p - d q, db = (sum h y - h . z) / (sum h^2 - h . w), c = z - db w,
        // RSS = Y - c . T - db sum h y. O(1).
        private bool SolveAt(double tk)
        {
            double d = tk - origin;
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

            double db = (hy - ((h0 * z0) + (h1 * z1) + (h2 * z2))) / schur;
            c0 = z0 - (db * w0);
            c1 = z1 - (db * w1);
            c2 = z2 - (db * w2);
            c3 = db;
            kinkSeconds = tk;
            residualSquares = y2 - ((c0 * t0) + (c1 * t1) + (c2 * t2) + (c3 * hy));
            return true;
        }
    }
}
