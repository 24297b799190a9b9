namespace FreqReadout.Readout
{
    /// <summary>
    /// The recent readings the pipeline keeps for deciding an excursion afterwards: a fixed ring
    /// (allocated once) of gate end time and the compensated frequency relative to the pipeline's
    /// origin, plus a mark for readings that belong to a reported event (never used as
    /// baseline again). When full, the oldest reading is overwritten.
    /// </summary>
    internal sealed class ReadingHistory
    {
        private readonly double[] times;
        private readonly double[] values;
        private readonly bool[] excluded;
        private int head;
        private int count;

        public ReadingHistory(int capacity)
        {
            times = new double[capacity];
            values = new double[capacity];
            excluded = new bool[capacity];
        }

        /// <summary>Readings held.</summary>
        public int Count
        {
            get { return count; }
        }

        public void Clear()
        {
            head = 0;
            count = 0;
        }

        public void Add(double timeSeconds, double value)
        {
            int slot;
            if (count == times.Length)
            {
                slot = head;
                head = (head + 1) % times.Length;
            }
            else
            {
                slot = (head + count) % times.Length;
                count++;
            }

            times[slot] = timeSeconds;
            values[slot] = value;
            excluded[slot] = false;
        }


        /// <summary>Time of the i-th oldest reading (0 = oldest).</summary>
        public double TimeAt(int i)
        {
            return times[(head + i) % times.Length];
        }


        public double ValueAt(int i)
        {
            return values[(head + i) % times.Length];
        }

        public bool IsExcluded(int i)
        {
            return excluded[(head + i) % times.Length];
        }

        /// <summary>Marks the readings with from &lt;= t &lt;= to as no longer baseline (part of a reported event, or older than a change of drift rate).</summary>
        public void Exclude(double fromSeconds, double toSeconds)
        {
            for (int i = 0; i < count; i++)
            {
                int slot = (head + i) % times.Length;
                if (times[slot] >= fromSeconds && times[slot] <= toSeconds)
                {
                    excluded[slot] = true;
                }
            }
        }
    }
}
