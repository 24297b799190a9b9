namespace FreqReadout.Numerics
{
    /// <summary>
    /// Scalar helpers for shared-logic, which may not use System.Math (the nanoFramework mscorlib has
    /// none). Pure functions, no state, no allocation.
    /// </summary>
    public static class ScalarMath
    {
        private const double TwoTo64 = 18446744073709551616.0;
        private const double TwoToMinus64 = 1.0 / 18446744073709551616.0;
        private const double TwoTo32 = 4294967296.0;
        private const double TwoToMinus32 = 1.0 / 4294967296.0;

        /// <summary>
        /// Square root by Newton's iteration y &lt;- (y + m / y) / 2 on the mantissa m scaled into [1, 4)
        /// by exact powers of four, then one correction y + (m - y^2) / (2 y); within one ulp of the exact root.
        /// </summary>
        /// <param name="x">The radicand.</param>
        /// <returns>sqrt(x); 0 for x = 0; NaN for x &lt; 0 or NaN; +infinity for +infinity.</returns>
        public static double Sqrt(double x)
        {
            if (x == 0)
            {
                return 0;
            }

            if (!(x > 0))
            {
                return double.NaN;
            }

            if (x > double.MaxValue)
            {
                return x;
            }

            // Scale m into [1, 4) by exact powers of four, coarse steps first, so every loop is short
            // (at most 16, 3, 3 and 1 passes downwards; the same upwards) whatever the exponent.
            double m = x;
            double scale = 1;
            while (m >= TwoTo64)
            {
                m *= TwoToMinus64;
                scale *= TwoTo32;
            }

            while (m < TwoToMinus64)
            {
                m *= TwoTo64;
                scale *= TwoToMinus32;
            }

            while (m >= 65536.0)
            {
                m *= 1.0 / 65536.0;
                scale *= 256.0;
            }

            while (m < 1.0 / 65536.0)
            {
                m *= 65536.0;
                scale *= 1.0 / 256.0;
            }

            while (m >= 16.0)
            {
                m *= 0.0625;
                scale *= 4.0;
            }

            while (m < 0.0625)
            {
                m *= 16.0;
                scale *= 0.25;
            }

            while (m >= 4)
            {
                m *= 0.25;
                scale *= 2;
            }

            while (m < 1)
            {
                m *= 4;
                scale *= 0.5;
            }

            // m in [1, 4): start at (1 + m) / 2 (an over-estimate, so Newton decreases monotonically).
            double y = 0.5 * (1 + m);
            for (int k = 0; k < 8; k++)
            {
                double next = 0.5 * (y + (m / y));
                if (next >= y)
                {
                    break;
                }

                y = next;
            }

            // One correction in residual form: y + (m - y^2) / (2 y) recovers the last ulp.
            y += (m - (y * y)) / (2.0 * y);
            return y * scale;
        }

        /// <summary>Absolute value |x| of a double (NaN stays NaN).</summary>
        public static double Abs(double x)
        {
            return x < 0 ? -x : x;
        }

        /// <summary>Absolute value |x| of a long (long.MinValue has none and is returned unchanged).</summary>
        public static long Abs(long x)
        {
            return x < 0 ? -x : x;
        }

        /// <summary>Nearest long to x, halves away from zero. x must lie within the long range (not checked).</summary>
        public static long RoundToLong(double x)
        {
            return x >= 0 ? (long)(x + 0.5) : -(long)(-x + 0.5);
        }

        /// <summary>
        /// Smallest long &gt;= x, where a value within a relative 1e-12 above a whole number counts as that
        /// whole number (so 0.1 s x 80 MHz = 8000000.000000001 gives 8000000). x must lie within the long range.
        /// </summary>
        public static long CeilingToLongTolerant(double x)
        {
            long r = RoundToLong(x);
            double tol = 1e-12 * Abs(x);
            if (Abs(x - r) <= tol)
            {
                return r;
            }

            long t = (long)x; // truncates toward zero
            if (t < x)
            {
                t++;
            }

            return t;
        }

        /// <summary>ln 2.</summary>
        public const double Ln2 = 0.69314718055994530942;

        /// <summary>Largest whole number &lt;= x, as a double (x within the long range, not checked).</summary>
        public static double Floor(double x)
        {
            long t = (long)x; // truncates toward zero
            if (t > x)
            {
                t--;
            }

            return t;
        }

        /// <summary>pi.</summary>
        public const double Pi = 3.14159265358979323846;

        /// <summary>
        /// sin(pi x): x reduced to [-1, 1] by whole multiples of 2, folded into [-1/2, 1/2] by
        /// sin(pi x) = sin(pi (1 - x)), then the Taylor series of sin y, y = pi x in [-pi/2, pi/2], to
        /// y^19 (truncation below 1e-15). Exact 0 at whole x. For |x| below 2^52; NaN for NaN or infinity.
        /// </summary>
        public static double SinPi(double x)
        {
            if (!IsFinite(x))
            {
                return double.NaN;
            }

            double half = x * 0.5;
            if (half > 4.0e15 || half < -4.0e15)
            {
                return 0.0;
            }

            x -= 2.0 * RoundToLong(half);
            if (x > 0.5)
            {
                x = 1.0 - x;
            }
            else if (x < -0.5)
            {
                x = -1.0 - x;
            }

            double y = Pi * x;
            double y2 = y * y;
            double term = y;
            double sum = y;
            for (int n = 1; n <= 9; n++)
            {
                term *= -y2 / ((2.0 * n) * ((2.0 * n) + 1.0));
                sum += term;
            }

            return sum;
        }

        /// <summary>cos(pi x) = sin(pi (x + 1/2)) (see <see cref="SinPi"/>).</summary>
        public static double CosPi(double x)
        {
            return SinPi(x + 0.5);
        }

        /// <summary>The larger of a and b.</summary>
        public static double Max(double a, double b)
        {
            return a >= b ? a : b;
        }

        /// <summary>The smaller of a and b.</summary>
        public static double Min(double a, double b)
        {
            return a <= b ? a : b;
        }

        /// <summary>x limited to [lo, hi] (lo &lt;= hi).</summary>
        public static double Clamp(double x, double lo, double hi)
        {
            if (x < lo)
            {
                return lo;
            }

            return x > hi ? hi : x;
        }

        /// <summary>True when x is neither NaN nor infinite.</summary>
        public static bool IsFinite(double x)
        {
            // NaN fails every comparison; infinities fail the bounds.
            return x >= -double.MaxValue && x <= double.MaxValue;
        }

        /// <summary>
        /// e^x by range reduction x = k ln2 + r, |r| &lt;= ln2 / 2, a Taylor series of e^r to the 16th
        /// power (truncation below 1e-17 relative), then scaling by 2^k through the binary digits of k
        /// (O(log |k|) exact multiplications by powers of two). Returns 0 below -745,
        /// +infinity above 709.78, NaN for NaN.
        /// </summary>
        public static double Exp(double x)
        {
            if (double.IsNaN(x))
            {
                return x;
            }

            if (x < -745.0)
            {
                return 0.0;
            }

            if (x > 709.78)
            {
                return double.PositiveInfinity;
            }

            double kd = x / Ln2;
            long k = (long)(kd >= 0 ? kd + 0.5 : kd - 0.5);
            double r = x - (k * Ln2);
            double term = 1.0;
            double sum = 1.0;
            for (int n = 1; n <= 16; n++)
            {
                term *= r / n;
                sum += term;
            }

            // Scaling by 2^k through the bits of |k| (at most 11 passes): factor 2^(2^i) or 2^-(2^i).
            // Below k = -1000 the scaling is split in two so no factor underflows on its own.
            if (k < -1000)
            {
                sum *= TwoToMinus64;
                k += 64;
            }

            double factor = k >= 0 ? 2.0 : 0.5;
            long bits = k >= 0 ? k : -k;
            while (bits > 0)
            {
                if ((bits & 1) == 1)
                {
                    sum *= factor;
                }

                bits >>= 1;
                if (bits > 0)
                {
                    factor *= factor;
                }
            }

            return sum;
        }
    }
}
