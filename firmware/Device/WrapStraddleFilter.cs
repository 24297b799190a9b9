namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// Mends pulse-counter reads that straddle a wrap of the hardware counter. The ESP32 unit counts 16 bits and its
    /// driver extends the count in an overflow interrupt; a read that races that interrupt is off by the counter's span
    /// (32767 counts on that driver) one way or the other. Between two reads of a running signal the count only grows,
    /// by less than half the span (a read every 1-10 ms of a signal of at most a few hundred kHz), so a step outside
    /// [0, span / 2) that the span brings back inside it is a straddle: the read is mended by -+span and counted; any other
    /// step out of range is dropped and counted, and the state stays where the last good read left it. O(1), nothing
    /// allocates. Limit: a wrong read that is ahead by less than half the span passes as a burst of the signal, and the
    /// reads after it are dropped until the true count catches up (tested in DeviceLoopHealthTests' sibling cases).
    /// </summary>
    public sealed class WrapStraddleFilter
    {
        private readonly long spanCounts;
        private long lastCount;
        private bool started;

        /// <summary>A filter for a counter whose reads can be off by <paramref name="spanCounts"/> (32767 on the ESP32 driver).</summary>
        /// <param name="spanCounts">The counter's span, counts (at least 2).</param>
        public WrapStraddleFilter(long spanCounts)
        {
            this.spanCounts = spanCounts < 2 ? 2 : spanCounts;
        }

        /// <summary>Reads mended by the span.</summary>
        public long Mended { get; private set; }

        /// <summary>Reads dropped: a step no span explains.</summary>
        public long Dropped { get; private set; }

        /// <summary>Checks one read; true with the count to use (mended when it straddled a wrap), false when it is dropped.</summary>
        /// <param name="count">The count read.</param>
        /// <param name="accepted">The count to use.</param>
        /// <returns>False when the read is dropped.</returns>
        public bool TryAccept(long count, out long accepted)
        {
            accepted = count;
            if (!started)
            {
                started = true;
                lastCount = count;
                return true;
            }

            long step = count - lastCount;
            long half = spanCounts / 2;
            if (step < 0 || step >= half)
            {
                long mended = step < 0 ? step + spanCounts : step - spanCounts;
                if (mended < 0 || mended >= half)
                {
                    Dropped++;
                    return false;
                }

                accepted = lastCount + mended;
                Mended++;
            }

            lastCount = accepted;
            return true;
        }
    }
}
