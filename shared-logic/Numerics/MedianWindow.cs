namespace FreqReadout.Numerics
{
    /// <summary>
    /// Running median over the last <see cref="Capacity"/> values: a ring buffer in arrival order plus
    /// a sorted copy kept by insertion, so <see cref="Add"/> costs O(Capacity) moves and allocates
    /// nothing (both arrays are allocated in the constructor).
    /// </summary>
    public sealed class MedianWindow
    {
        private readonly double[] ring;
        private readonly double[] sorted;
        private int head;
        private int count;

        /// <summary>Creates an empty window.</summary>
        /// <param name="capacity">Values kept (&gt;= 1).</param>
        public MedianWindow(int capacity)
        {
            if (capacity < 1)
            {
                throw new System.ArgumentException("capacity must be >= 1");
            }

            ring = new double[capacity];
            sorted = new double[capacity];
        }

        /// <summary>Values kept at most.</summary>
        public int Capacity
        {
            get { return ring.Length; }
        }

        /// <summary>Values held now.</summary>
        public int Count
        {
            get { return count; }
        }

        /// <summary>Forgets every value.</summary>
        public void Clear()
        {
            head = 0;
            count = 0;
        }

        /// <summary>Adds a value; when full, the oldest value leaves first. NaN is ignored.</summary>
        public void Add(double value)
        {
            if (double.IsNaN(value))
            {
                return;
            }

            if (count == ring.Length)
            {
                double oldest = ring[head];
                RemoveSorted(oldest);
                ring[head] = value;
                head = (head + 1) % ring.Length;
            }
            else
            {
                ring[(head + count) % ring.Length] = value;
                count++;
            }

            InsertSorted(value);
        }

        /// <summary>
        /// Median of the values held: the middle value (odd count) or the mean of the two middle ones
        /// (even count). Returns 0 when empty.
        /// </summary>
        public double Median()
        {
            return RobustStatistics.MedianOfSorted(sorted, count);
        }

        private void RemoveSorted(double value)
        {
            // The sorted part holds count values; find one equal to value and close the gap.
            int n = count;
            int i = 0;
            while (i < n && sorted[i] != value)
            {
                i++;
            }

            for (int j = i; j < n - 1; j++)
            {
                sorted[j] = sorted[j + 1];
            }

            // Keep the count as is: the caller inserts a new value right after.
            sorted[n - 1] = double.MaxValue;
        }

        private void InsertSorted(double value)
        {
            // count already includes the new value; the sorted part holds count - 1 values.
            int j = count - 2;
            while (j >= 0 && sorted[j] > value)
            {
                sorted[j + 1] = sorted[j];
                j--;
            }

            sorted[j + 1] = value;
        }
    }
}
