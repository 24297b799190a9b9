using FreqReadout.Detection;

namespace FreqReadout.Readout
{
    /// <summary>
    /// Fixed-size FIFO of events: the slots are objects allocated once, and items are copied in and out
    /// (no allocation, no struct copies on the device); when full the oldest is dropped and counted.
    /// </summary>
    internal sealed class DetectionEventQueue
    {
        private readonly DetectionEvent[] items;
        private readonly int capacity;
        private int head;
        private int count;

        public DetectionEventQueue(int capacity)
        {
            // One spare slot: the slot after the newest item is always free to be filled before Commit.
            this.capacity = capacity;
            items = new DetectionEvent[capacity + 1];
            for (int i = 0; i < items.Length; i++)
            {
                items[i] = new DetectionEvent();
            }
        }

        public int Dropped { get; private set; }

        public void Clear()
        {
            head = 0;
            count = 0;
        }

        /// <summary>The free slot that the next <see cref="Commit"/> publishes: fill it in place, then commit (or leave it, and nothing changes).</summary>
        public DetectionEvent NextSlot()
        {
            return items[(head + count) % items.Length];
        }

        /// <summary>Publishes the slot returned by <see cref="NextSlot"/>; when the queue already holds its capacity, the oldest item is dropped and counted.</summary>
        public void Commit()
        {
            if (count == capacity)
            {
                head = (head + 1) % items.Length;
                Dropped++;
                return;
            }

            count++;
        }

        /// <summary>Copies the oldest item into <paramref name="into"/> and removes it; false (into unchanged) when empty.</summary>
        public bool TryDequeue(DetectionEvent into)
        {
            if (count == 0)
            {
                return false;
            }

            into.CopyFrom(items[head]);
            head = (head + 1) % items.Length;
            count--;
            return true;
        }
    }
}
