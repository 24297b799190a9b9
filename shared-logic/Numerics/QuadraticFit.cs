namespace FreqReadout.Numerics
{
    /// <summary>
    /// Unweighted least-squares quadratic y = c0 + c1 u + c2 u^2 in u = t - origin, accumulated point by
    /// point into running sums (O(1) per point, no allocation) and solved once (3 x 3 normal equations by
    /// Cramer's rule). The origin is chosen by the caller near the points (for example the newest time),
    /// so the sums stay well conditioned.
    /// <para>
    /// Sums: S_k = sum u^k (k = 0..4), T_k = sum u^k y (k = 0..2); normal equations
    /// [S0 S1 S2; S1 S2 S3; S2 S3 S4] c = [T0; T1; T2]. Empty input, or points that do not determine a
    /// quadratic (fewer than 3 distinct times, a singular system): <see cref="TrySolve"/> returns false
    /// and leaves the coefficients 0. Variance of c2 for white noise sigma^2 is sigma^2 times the
    /// (3,3) element of the inverse normal matrix (<see cref="CurvatureVarianceFactor"/>).
    /// </para>
    /// </summary>
    public sealed class QuadraticFit
    {
        private double origin;
        private double s0;
        private double s1;
        private double s2;
        private double s3;
        private double s4;
        private double t0;
        private double t1;
        private double t2;
        private double c0;
        private double c1;
        private double c2;
        private double curvatureFactor;
        private double i00;
        private double i01;
        private double i02;
        private double i11;
        private double i12;


        /// <summary>Points added since the last <see cref="Clear"/>.</summary>
        public int Count
        {
            get { return (int)s0; }
        }

        /// <summary>Value at the origin, c0.</summary>
        public double Value
        {
            get { return c0; }
        }

        /// <summary>Slope at the origin, c1 (per second).</summary>
        public double Slope
        {
            get { return c1; }
        }

        /// <summary>Half the second derivative, c2 (per second squared).</summary>
        public double HalfCurvature
        {
            get { return c2; }
        }

        /// <summary>Var(c2) / sigma^2 of the last solve (0 before a successful solve).</summary>
        public double CurvatureVarianceFactor
        {
            get { return curvatureFactor; }
        }

        /// <summary>Var(c0) / sigma^2 of the last solve: the value at the origin (0 before a successful solve).</summary>
        public double ValueVarianceFactor
        {
            get { return i00; }
        }

        /// <summary>Var(c1) / sigma^2 of the last solve: the slope at the origin (0 before a successful solve).</summary>
        public double SlopeVarianceFactor
        {
            get { return i11; }
        }

        /// <summary>Cov(c0, c1) / sigma^2 of the last solve (0 before a successful solve).</summary>
        public double ValueSlopeCovarianceFactor
        {
            get { return i01; }
        }

        /// <summary>Cov(c0, c2) / sigma^2 of the last solve (0 before a successful solve).</summary>
        public double ValueCurvatureCovarianceFactor
        {
            get { return i02; }
        }

        /// <summary>Cov(c1, c2) / sigma^2 of the last solve (0 before a successful solve).</summary>
        public double SlopeCurvatureCovarianceFactor
        {
            get { return i12; }
        }

        /// <summary>The time origin of u, s.</summary>
        public double OriginSeconds
        {
            get { return origin; }
        }

        /// <summary>Forgets the points and sets the time origin.</summary>
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
            c0 = 0;
            c1 = 0;
            c2 = 0;
            curvatureFactor = 0;
        }

        /// <summary>Adds one point (time s, value).</summary>
        public void Add(double timeSeconds, double value)
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
        }

        /// <summary>
        /// Adds another fit's points (its sums; both must have the same origin, which is not checked): a fit of the union
        /// of two sets of points in O(1).
        /// </summary>
        public void Merge(QuadraticFit other)
        {
            s0 += other.s0;
            s1 += other.s1;
            s2 += other.s2;
            s3 += other.s3;
            s4 += other.s4;
            t0 += other.t0;
            t1 += other.t1;
            t2 += other.t2;
        }

        /// <summary>Solves the normal equations; false (coefficients 0) when they are singular.</summary>
        public bool TrySolve()
        {
            c0 = 0;
            c1 = 0;
            c2 = 0;
            curvatureFactor = 0;
            i00 = 0;
            i01 = 0;
            i02 = 0;
            i11 = 0;
            i12 = 0;
            if (s0 < 3)
            {
                return false;
            }

            // Cofactors of the symmetric matrix [a b c; b d e; c e f].
            double a = s0;
            double b = s1;
            double c = s2;
            double d = s2;
            double e = s3;
            double f = s4;
            double m00 = (d * f) - (e * e);
            double m01 = (c * e) - (b * f);
            double m02 = (b * e) - (c * d);
            double m11 = (a * f) - (c * c);
            double m12 = (b * c) - (a * e);
            double m22 = (a * d) - (b * b);
            double det = (a * m00) + (b * m01) + (c * m02);
            double scale = ScalarMath.Abs(a * d * f) + ScalarMath.Abs(b * e * c) + ScalarMath.Abs(c * c * d);
            if (!(ScalarMath.Abs(det) > 1e-12 * scale))
            {
                return false;
            }

            c0 = ((m00 * t0) + (m01 * t1) + (m02 * t2)) / det;
            c1 = ((m01 * t0) + (m11 * t1) + (m12 * t2)) / det;
            c2 = ((m02 * t0) + (m12 * t1) + (m22 * t2)) / det;
            curvatureFactor = m22 / det;
            i00 = m00 / det;
            i01 = m01 / det;
            i02 = m02 / det;
            i11 = m11 / det;
            i12 = m12 / det;
            return true;
        }

        /// <summary>The fitted value at a time, c0 + c1 u + c2 u^2.</summary>
        public double Evaluate(double timeSeconds)
        {
            double u = timeSeconds - origin;
            return c0 + (u * (c1 + (u * c2)));
        }

        /// <summary>
        /// Var(fitted value at a time) / sigma^2 for white noise: v' (X'X)^-1 v with v = [1, u, u^2], the
        /// factor that grows as u^4 when the fit is extrapolated. 0 before a successful solve.
        /// </summary>
        public double PredictionVarianceFactor(double timeSeconds)
        {
            double u = timeSeconds - origin;
            double u2 = u * u;
            return i00 + (2.0 * u * i01) + (u2 * ((2.0 * i02) + i11)) + (2.0 * u2 * u * i12) + (u2 * u2 * curvatureFactor);
        }
    }
}
