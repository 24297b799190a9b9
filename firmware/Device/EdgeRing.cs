using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// A fixed-size ring of raw edge timestamps between an event handler (producer) and the device
    /// loop (consumer). Allocation-free after construction; when full, the newest edge is dropped and
    /// counted (the counter then sees a gap and reports a dropout rather than a wrong frequency).
    /// </summary>
    public sealed class EdgeRing : IEdgeSource
    {
        private readonly ulong[] items;
        private readonly object gate = new object();
        private int head;
        private int count;
        private long dropped;

        /// <summary>Creates a ring that holds <paramref name="capacity"/> edges (&gt;= 2).</summary>
        public EdgeRing(int capacity)
        {
            if (capacity < 2)
            {
                throw new System.ArgumentOutOfRangeException("capacity", "capacity must be >= 2");
            }

            items = new ulong[capacity];
        }

        /// <summary>Edges dropped because the ring was full.</summary>
        public long Dropped
        {
            get { return dropped; }
        }

        /// <summary>Adds one edge (called from the pin event handler).</summary>
        public void Add(ulong rawTick)
        {
            lock (gate)
            {
                if (count == items.Length)
                {
                    dropped++;
                    return;
                }

                int tail = head + count;
                if (tail >= items.Length)
                {
                    tail -= items.Length;
                }

                items[tail] = rawTick;
                count++;
            }
        }

        /// <inheritdoc />
        public bool TryReadEdge(out ulong rawTick)
        {
            lock (gate)
            {
                if (count == 0)
                {
                    rawTick = 0;
                    return false;
                }

                rawTick = items[head];
                head++;
                if (head == items.Length)
                {
                    head = 0;
                }

                count--;
                return true;
            }
        }
    }
}
