namespace FreqReadout.Numerics
{
    /// <summary>
    /// Running median over the last <see cref="Capacity"/> values, O(log Capacity) per
    /// <see cref="Add"/> and O(1) per <see cref="Median"/>, allocation-free after the constructor.
    /// <para>
    /// Method: the values live in a ring (arrival order); the ring slots are split between two binary
    /// heaps, a max-heap "low" holding the smaller ceil(count / 2) values and a min-heap "high" holding
    /// the rest, with every value in low &lt;= every value in high. Each slot knows its heap and position,
    /// so when the window is full the oldest slot takes the new value in place and is sifted up or down in
    /// its own heap (at most log2(Capacity) swaps); then, if the top of low exceeds the top of high, the
    /// two tops change heaps and both sift down (one exchange always restores the order, since only one
    /// value changed). While the window fills, a value joins low or high by comparison with the top of
    /// low and the sizes are rebalanced by moving one top.
    /// </para>
    /// <para>
    /// Median: the top of low when the count is odd, else (top of low + top of high) / 2 — the middle
    /// value or the mean of the two middle values of the sorted window, exactly as a sorted copy gives.
    /// Empty window: 0. NaN values are ignored.
    /// </para>
    /// <para>
    /// Loop bounds (for the device budget): each sift loop runs at most floor(log2(Capacity)) + 1 times.
    /// </para>
    /// </summary>
    public sealed class MedianWindow
    {
        private readonly double[] values;   // ring of values, by slot
        private readonly int[] slotHeap;    // per slot: 0 = in low, 1 = in high
        private readonly int[] slotPos;     // per slot: its position in its heap
        private readonly int[] low;         // max-heap of slots
        private readonly int[] high;        // min-heap of slots
        private int lowCount;
        private int highCount;
        private int head;                   // oldest slot when full
        private int count;

        /// <summary>Creates an empty window.</summary>
        /// <param name="capacity">Values kept (&gt;= 1).</param>
        public MedianWindow(int capacity)
        {
            if (capacity < 1)
            {
                throw new System.ArgumentException("capacity must be >= 1");
            }

            values = new double[capacity];
            slotHeap = new int[capacity];
            slotPos = new int[capacity];
            low = new int[capacity];
            high = new int[capacity];
        }

        /// <summary>Values kept at most.</summary>
        public int Capacity
        {
            get { return values.Length; }
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
            lowCount = 0;
            highCount = 0;
        }

        /// <summary>Adds a value; when full, the oldest value leaves first. NaN is ignored.</summary>
        public void Add(double value)
        {
            if (double.IsNaN(value))
            {
                return;
            }

            if (count == values.Length)
            {
                int slot = head;
                head = (head + 1) % values.Length;
                values[slot] = value;
                if (slotHeap[slot] == 0)
                {
                    LowSiftUp(slotPos[slot]);
                    LowSiftDown(slotPos[slot]);
                }
                else
                {
                    HighSiftUp(slotPos[slot]);
                    HighSiftDown(slotPos[slot]);
                }

                ExchangeTopsIfCrossed();
                return;
            }

            int fresh = count;
            count++;
            values[fresh] = value;
            if (lowCount == 0 || value <= values[low[0]])
            {
                Place(low, fresh, 0, lowCount);
                lowCount++;
                LowSiftUp(lowCount - 1);
            }
            else
            {
                Place(high, fresh, 1, highCount);
                highCount++;
                HighSiftUp(highCount - 1);
            }

            // low holds ceil(count / 2) values.
            if (lowCount > highCount + 1)
            {
                int moved = low[0];
                RemoveLowTop();
                Place(high, moved, 1, highCount);
                highCount++;
                HighSiftUp(highCount - 1);
            }
            else if (highCount > lowCount)
            {
                int moved = high[0];
                RemoveHighTop();
                Place(low, moved, 0, lowCount);
                lowCount++;
                LowSiftUp(lowCount - 1);
            }
        }

        /// <summary>
        /// Median of the values held: the middle value (odd count) or the mean of the two middle ones
        /// (even count). Returns 0 when empty.
        /// </summary>
        public double Median()
        {
            if (count == 0)
            {
                return 0.0;
            }

            if ((count & 1) == 1)
            {
                return values[low[0]];
            }

            return 0.5 * (values[low[0]] + values[high[0]]);
        }

        private void Place(int[] heap, int slot, int heapId, int position)
        {
            heap[position] = slot;
            slotHeap[slot] = heapId;
            slotPos[slot] = position;
        }

        private void ExchangeTopsIfCrossed()
        {
            if (highCount == 0 || lowCount == 0 || values[low[0]] <= values[high[0]])
            {
                return;
            }

            int a = low[0];
            int b = high[0];
            Place(low, b, 0, 0);
            Place(high, a, 1, 0);
            LowSiftDown(0);
            HighSiftDown(0);
        }

        private void RemoveLowTop()
        {
            lowCount--;
            if (lowCount > 0)
            {
                Place(low, low[lowCount], 0, 0);
                LowSiftDown(0);
            }
        }

        private void RemoveHighTop()
        {
            highCount--;
            if (highCount > 0)
            {
                Place(high, high[highCount], 1, 0);
                HighSiftDown(0);
            }
        }

        private void LowSiftUp(int position)
        {
            int slot = low[position];
            double v = values[slot];
            while (position > 0)
            {
                int parent = (position - 1) / 2;
                int parentSlot = low[parent];
                if (values[parentSlot] >= v)
                {
                    break;
                }

                Place(low, parentSlot, 0, position);
                position = parent;
            }

            Place(low, slot, 0, position);
        }

        private void LowSiftDown(int position)
        {
            int slot = low[position];
            double v = values[slot];
            while (true)
            {
                int child = (2 * position) + 1;
                if (child >= lowCount)
                {
                    break;
                }

                if (child + 1 < lowCount && values[low[child + 1]] > values[low[child]])
                {
                    child++;
                }

                if (values[low[child]] <= v)
                {
                    break;
                }

                Place(low, low[child], 0, position);
                position = child;
            }

            Place(low, slot, 0, position);
        }

        private void HighSiftUp(int position)
        {
            int slot = high[position];
            double v = values[slot];
            while (position > 0)
            {
                int parent = (position - 1) / 2;
                int parentSlot = high[parent];
                if (values[parentSlot] <= v)
                {
                    break;
                }

                Place(high, parentSlot, 1, position);
                position = parent;
            }

            Place(high, slot, 1, position);
        }

        private void HighSiftDown(int position)
        {
            int slot = high[position];
            double v = values[slot];
            while (true)
            {
                int child = (2 * position) + 1;
                if (child >= highCount)
                {
                    break;
                }

                if (child + 1 < highCount && values[high[child + 1]] < values[high[child]])
                {
                    child++;
                }

                if (values[high[child]] >= v)
                {
                    break;
                }

                Place(high, high[child], 1, position);
                position = child;
            }

            Place(high, slot, 1, position);
        }
    }
}
