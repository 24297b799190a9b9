namespace FreqReadout.Numerics
{
    /// <summary>
    /// Median and median absolute deviation on caller-supplied arrays (no allocation; the caller owns
    /// the scratch space). Sorting is insertion sort: O(n^2), intended for the few hundred values of a
    /// baseline capture, never per reading.
    /// </summary>
    public static class RobustStatistics
    {
        /// <summary>
        /// Scale factor from the median absolute deviation to sigma for normal data:
        /// 1.482602218505602 = 1 / Phi^-1(3/4) (Hampel, JASA 69:383, 1974; Rousseeuw and Croux,
        /// JASA 88:1273, 1993 — from memory; the constant is standard).
        /// </summary>
        public const double MadToSigma = 1.482602218505602;

        /// <summary>Sorts the first <paramref name="count"/> values ascending in place (insertion sort).</summary>
        public static void SortAscending(double[] values, int count)
        {
            for (int i = 1; i < count; i++)
            {
                double v = values[i];
                int j = i - 1;
                while (j >= 0 && values[j] > v)
                {
                    values[j + 1] = values[j];
                    j--;
                }

                values[j + 1] = v;
            }
        }

        /// <summary>
        /// Median of already sorted values: the middle value (odd count) or the mean of the two middle
        /// values (even count). Returns 0 for count &lt;= 0.
        /// </summary>
        public static double MedianOfSorted(double[] sorted, int count)
        {
            if (count <= 0)
            {
                return 0.0;
            }

            int mid = count / 2;
            if ((count & 1) == 1)
            {
                return sorted[mid];
            }

            return 0.5 * (sorted[mid - 1] + sorted[mid]);
        }

        /// <summary>
        /// Median of values[0..count): copies into <paramref name="scratch"/> (length &gt;= count), sorts the
        /// copy and takes <see cref="MedianOfSorted"/>. The input is not changed. Returns 0 for count &lt;= 0.
        /// </summary>
        public static double Median(double[] values, int count, double[] scratch)
        {
            for (int i = 0; i < count; i++)
            {
                scratch[i] = values[i];
            }

            SortAscending(scratch, count);
            return MedianOfSorted(scratch, count);
        }

        /// <summary>
        /// Robust sigma: MadToSigma * median_i |values[i] - center| over values[0..count), using
        /// <paramref name="scratch"/> (length &gt;= count). Unbiased for large normal samples when center
        /// is the sample median; breakdown point 50 %. Returns 0 for count &lt;= 0.
        /// </summary>
        public static double MadSigma(double[] values, int count, double center, double[] scratch)
        {
            for (int i = 0; i < count; i++)
            {
                scratch[i] = ScalarMath.Abs(values[i] - center);
            }

            SortAscending(scratch, count);
            return MadToSigma * MedianOfSorted(scratch, count);
        }
    }
}
