namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// Paces pulse-counter reads on deadlines of the microsecond timer (on a board, HighResTimer.GetCurrent(), the pulse
    /// counter's own time base) instead of Thread.Sleep, whose shortest sleep is a whole 10 ms system tick; and watches the
    /// loop's health from the reads themselves. Deadlines are period_us apart; a read taken late keeps the schedule
    /// (the next deadline is the missed one + period) unless the loop fell more than one period behind, when the schedule
    /// restarts from that read and the deadlines skipped are counted. A gap between two reads longer than the stall limit
    /// (how a garbage collection or a blocked call shows) is a stall: counted, with the longest gap kept, never taken for a
    /// dropout of the signal. O(1) per call; nothing allocates; times are signed 64-bit microseconds.
    /// </summary>
    public sealed class ReadPacer
    {
        private long periodMicroseconds;
        private long stallLimitMicroseconds;
        private long nextDueMicroseconds;
        private long lastReadMicroseconds;
        private bool started;

        /// <summary>A pacer for reads every <paramref name="periodMicroseconds"/>, calling a gap over <paramref name="stallLimitMicroseconds"/> a stall.</summary>
        /// <param name="periodMicroseconds">Time between reads, us (at least 1).</param>
        /// <param name="stallLimitMicroseconds">Longest gap between reads that is not a stall, us (at least the period).</param>
        public ReadPacer(long periodMicroseconds, long stallLimitMicroseconds)
        {
            this.periodMicroseconds = periodMicroseconds < 1 ? 1 : periodMicroseconds;
            this.stallLimitMicroseconds = stallLimitMicroseconds < this.periodMicroseconds ? this.periodMicroseconds : stallLimitMicroseconds;
        }

        /// <summary>Changes the period and the stall limit (new settings); the counts go on, the next deadline is one new period after the last read.</summary>
        public void Change(long periodMicroseconds, long stallLimitMicroseconds)
        {
            this.periodMicroseconds = periodMicroseconds < 1 ? 1 : periodMicroseconds;
            this.stallLimitMicroseconds = stallLimitMicroseconds < this.periodMicroseconds ? this.periodMicroseconds : stallLimitMicroseconds;
            nextDueMicroseconds = lastReadMicroseconds + this.periodMicroseconds;
        }

        /// <summary>Reads taken.</summary>
        public long Reads { get; private set; }

        /// <summary>Gaps between reads longer than the stall limit.</summary>
        public long Stalls { get; private set; }

        /// <summary>Deadlines skipped because the loop fell more than one period behind.</summary>
        public long MissedDeadlines { get; private set; }

        /// <summary>Longest gap between two reads so far, us (0 before the second read).</summary>
        public long LongestGapMicroseconds { get; private set; }

        /// <summary>True when a read is due at <paramref name="nowMicroseconds"/> (always before the first read).</summary>
        public bool IsDue(long nowMicroseconds)
        {
            return !started || nowMicroseconds >= nextDueMicroseconds;
        }

        /// <summary>How long until the next read is due, us; 0 when it is due now. A loop sleeps only when this is well over a system tick (10 ms).</summary>
        public long MicrosecondsUntilDue(long nowMicroseconds)
        {
            return IsDue(nowMicroseconds) ? 0 : nextDueMicroseconds - nowMicroseconds;
        }

        /// <summary>Records a read taken at <paramref name="nowMicroseconds"/> and sets the next deadline.</summary>
        public void Taken(long nowMicroseconds)
        {
            if (!started)
            {
                started = true;
                nextDueMicroseconds = nowMicroseconds + periodMicroseconds;
            }
            else
            {
                long gap = nowMicroseconds - lastReadMicroseconds;
                if (gap > LongestGapMicroseconds)
                {
                    LongestGapMicroseconds = gap;
                }

                if (gap > stallLimitMicroseconds)
                {
                    Stalls++;
                }

                long behind = nowMicroseconds - nextDueMicroseconds;
                if (behind > periodMicroseconds)
                {
                    MissedDeadlines += behind / periodMicroseconds;
                    nextDueMicroseconds = nowMicroseconds + periodMicroseconds;
                }
                else
                {
                    nextDueMicroseconds += periodMicroseconds;
                }
            }

            lastReadMicroseconds = nowMicroseconds;
            Reads++;
        }
    }
}
