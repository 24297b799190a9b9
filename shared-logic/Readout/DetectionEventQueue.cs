using FreqReadout.Detection;

namespace FreqReadout.Readout
{
    /// <summary>Fixed-size FIFO of events (allocated once); when full the oldest is dropped and counted.</summary>
    internal sealed class DetectionEventQueue
    {
        private readonly DetectionEvent[] items;
        private int head;
        private int count;

        public DetectionEventQueue(int capacity)
        {
            items = new DetectionEvent[capacity];
        }

        public int Dropped { get; private set; }

        public void Clear()
        {
            head = 0;
            count = 0;
        }

        public void Enqueue(DetectionEvent item)
        {
            if (count == items.Length)
            {
                head = (head + 1) % items.Length;
                count--;
                Dropped++;
            }

            items[(head + count) % items.Length] = item;
            count++;
        }

        public bool TryDequeue(out DetectionEvent item)
        {
            if (count == 0)
            {
                item = new DetectionEvent();
                return false;
            }

            item = items[head];
            head = (head + 1) % items.Length;
            count--;
            return true;
        }
    }
}
