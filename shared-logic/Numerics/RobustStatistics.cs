namespace FreqReadout.Numerics
{
    /// <summary>
    /// Median and median absolute deviation on caller-supplied arrays (no allocation; the caller owns
    /// the scratch space). Order statistics come from an in-place selection (<see cref="SelectInPlace(double[], int, int)"/>):
    /// expected O(n), at worst O(n log n), never the O(n^2) of a sort by insertion, so the gate that
    /// completes a baseline capture stays within the device budget.
    /// </summary>
    public static class RobustStatistics
    {
        /// <summary>
        /// Scale factor from the median absolute deviation to sigma for normal data:
        /// 1.482602218505602 = 1 / Phi^-1(3/4) (Hampel, JASA 69:383, 1974; Rousseeuw and Croux,
        /// JASA 88:1273, 1993 — from memory; the constant is standard).
        /// </summary>
        public const double MadToSigma = 1.482602218505602;

        /// <summary>
        /// The k-th smallest (0-based) of values[0..count), found in place: afterwards values[k] holds it,
        /// every value at an index below k is &lt;= it and every value above k is &gt;= it (the array is
        /// reordered, no value is lost).
        /// <para>
        /// Method: Hoare's selection (FIND; Hoare, CACM 4:321, 1961 — from memory) with a median-of-three
        /// pivot, narrowing [lo, hi] to the side that holds k; after 2 floor(log2 count) + 2 rounds without
        /// finishing, the remaining range is heap-sorted instead. Loop bounds (for the device budget): at
        /// most 2 floor(log2 count) + 2 partition rounds of at most count + 2 steps each, then one heapsort
        /// of at most count values (at most 2 count floor(log2 count) sift steps).
        /// </para>
        /// </summary>
        /// <param name="values">Values (finite, or at least not NaN); reordered in place.</param>
        /// <param name="count">How many leading values take part (&gt;= 1).</param>
        /// <param name="k">Rank wanted, 0 &lt;= k &lt; count.</param>
        public static double SelectInPlace(double[] values, int count, int k)
        {
            return SelectInPlace(values, count, k, (2 * FloorLog2(count)) + 2);
        }

        // The same with a given limit of partition rounds before the heapsort (tests force the heapsort with 0).
        internal static double SelectInPlace(double[] values, int count, int k, int limit)
        {
            int lo = 0;
            int hi = count - 1;
            int rounds = 0;
            while (hi > lo && rounds < limit)
            {
                rounds++;
                int mid = lo + ((hi - lo) / 2);
                if (values[mid] < values[lo])
                {
                    Swap(values, mid, lo);
                }

                if (values[hi] < values[lo])
                {
                    Swap(values, hi, lo);
                }

                if (values[hi] < values[mid])
                {
                    Swap(values, hi, mid);
                }

                double pivot = values[mid];
                int i = lo;
                int j = hi;

                // Hoare's partition written as one loop: every pass moves i up, j down, or both (at most
                // hi - lo + 2 passes), so the step count is bounded without nested scans.
                while (i <= j)
                {
                    if (values[i] < pivot)
                    {
                        i++;
                    }
                    else if (values[j] > pivot)
                    {
                        j--;
                    }
                    else
                    {
                        Swap(values, i, j);
                        i++;
                        j--;
                    }
                }

                if (k <= j)
                {
                    hi = j;
                }
                else if (k >= i)
                {
                    lo = i;
                }
                else
                {
                    return values[k];
                }
            }

            if (hi > lo)
            {
                // Too many unbalanced rounds: finish the remaining range by heapsort (once).
                HeapSort(values, lo, hi);
            }

            return values[k];
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
        /// Median of values[0..count): the middle value (odd count) or the mean of the two middle values
        /// (even count) of the sorted values, found by selection on a copy in <paramref name="scratch"/>
        /// (length &gt;= count). The input is not changed. Returns 0 for count &lt;= 0.
        /// </summary>
        public static double Median(double[] values, int count, double[] scratch)
        {
            for (int i = 0; i < count; i++)
            {
                scratch[i] = values[i];
            }

            return MedianInPlace(scratch, count);
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

            return MadToSigma * MedianInPlace(scratch, count);
        }

        // Median of a[0..count) by selection (reorders a): the upper middle by SelectInPlace, and for an even
        // count the lower middle as the largest value below it (all of them are <= it after the selection).
        private static double MedianInPlace(double[] a, int count)
        {
            if (count <= 0)
            {
                return 0.0;
            }

            int mid = count / 2;
            double upper = SelectInPlace(a, count, mid);
            if ((count & 1) == 1)
            {
                return upper;
            }

            double lower = a[0];
            for (int i = 1; i < mid; i++)
            {
                if (a[i] > lower)
                {
                    lower = a[i];
                }
            }

            return 0.5 * (lower + upper);
        }

        private static int FloorLog2(int n)
        {
            int log = 0;
            while (n > 1)
            {
                n >>= 1;
                log++;
            }

            return log;
        }

        private static void Swap(double[] a, int i, int j)
        {
            double t = a[i];
            a[i] = a[j];
            a[j] = t;
        }

        // Ascending heapsort of a[lo..hi] (inclusive), in place.
        private static void HeapSort(double[] a, int lo, int hi)
        {
            int n = hi - lo + 1;
            for (int start = (n / 2) - 1; start >= 0; start--)
            {
                SiftDown(a, lo, start, n);
            }

            for (int end = n - 1; end > 0; end--)
            {
                Swap(a, lo, lo + end);
                SiftDown(a, lo, 0, end);
            }
        }

        // Max-heap sift-down of the heap a[lo .. lo + n) from heap position root.
        private static void SiftDown(double[] a, int lo, int root, int n)
        {
            while (true)
            {
                int child = (2 * root) + 1;
                if (child >= n)
                {
                    return;
                }

                if (child + 1 < n && a[lo + child + 1] > a[lo + child])
                {
                    child++;
                }

                if (a[lo + root] >= a[lo + child])
                {
                    return;
                }

                Swap(a, lo + root, lo + child);
                root = child;
            }
        }
    }
}
