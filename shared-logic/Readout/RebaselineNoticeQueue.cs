using FreqReadout.Tracking;

namespace FreqReadout.Readout
{
    /// <summary>Fixed-size FIFO of re-baseline notices (allocated once); when full the oldest is dropped and counted.</summary>
    internal sealed class RebaselineNoticeQueue
    {
        private readonly RebaselineNotice[] items;
        private int head;
        private int count;

        public RebaselineNoticeQueue(int capacity)
        {
            items = new RebaselineNotice[capacity];
        }

        public int Dropped { get; private set; }

        public void Clear()
        {
            head = 0;
            count = 0;
        }

        public void Enqueue(RebaselineNotice item)
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

        public bool TryDequeue(out RebaselineNotice item)
        {
            if (count == 0)
            {
                item = new RebaselineNotice();
                return false;
            }

            item = items[head];
            head = (head + 1) % items.Length;
            count--;
            return true;
        }
    }
}
