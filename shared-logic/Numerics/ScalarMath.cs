namespace FreqReadout.Numerics
{
    /// <summary>
    /// Scalar helpers for device code, which has no System.Math (nanoFramework mscorlib). Pure
    /// functions, no state, no allocation. Accuracy is that of the device's double (which on some
    /// boards is computed in single precision).
    /// </summary>
    public static class ScalarMath
    {
        /// <summary>ln 2.</summary>
        public const double Ln2 = 0.69314718055994530942;

        /// <summary>|x|. NaN stays NaN.</summary>
        public static double Abs(double x)
        {
            return x < 0 ? -x : x;
        }

        /// <summary>The larger of a and b (a when either is NaN and a is not compared false).</summary>
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
        /// Square root by Newton's iteration y &lt;- (y + x / y) / 2 after scaling x by powers of 4 into
        /// [0.5, 2) (so six iterations from y0 = (1 + x) / 2 reach full double precision).
        /// Returns 0 for x &lt;= 0 (and for -0), NaN for NaN, +infinity for +infinity.
        /// </summary>
        public static double Sqrt(double x)
        {
            if (!(x > 0))
            {
                return double.IsNaN(x) ? x : 0.0;
            }

            if (x > double.MaxValue)
            {
                return x;
            }

            double scale = 1.0;
            while (x >= 1.8446744073709552e19)
            {
                x *= 5.421010862427522e-20; // 4^-32
                scale *= 4294967296.0; // 2^32
            }

            while (x < 5.421010862427522e-20)
            {
                x *= 1.8446744073709552e19;
                scale *= 2.3283064365386963e-10;
            }

            while (x >= 2.0)
            {
                x *= 0.25;
                scale *= 2.0;
            }

            while (x < 0.5)
            {
                x *= 4.0;
                scale *= 0.5;
            }

            double y = 0.5 * (1.0 + x);
            for (int i = 0; i < 6; i++)
            {
                y = 0.5 * (y + x / y);
            }

            return y * scale;
        }

        /// <summary>
        /// e^x by range reduction x = k ln2 + r, |r| &lt;= ln2 / 2, a Taylor series of e^r to the 16th
        /// power (truncation below 1e-17 relative), then scaling by 2^k. Returns 0 below -745,
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

            while (k > 0)
            {
                sum *= 2.0;
                k--;
            }

            while (k < 0)
            {
                sum *= 0.5;
                k++;
            }

            return sum;
        }
    }
}
