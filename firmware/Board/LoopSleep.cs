namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// How the board's read loop waits for the next read deadline. nanoFramework's Thread.Sleep, timers and tick count
    /// advance in 10 ms system ticks, so a sleep lasts at least one tick whatever it asks for and may end up to a tick
    /// late. So the loop sleeps only when the deadline is further away than a tick and a margin, and then for whole
    /// milliseconds that end at least one tick before the deadline; otherwise it yields (Thread.Sleep(0)) and looks at
    /// the microsecond timer again, which lets other threads (the link writer) run. Pure arithmetic, tested on the host.
    /// </summary>
    public static class LoopSleep
    {
        /// <summary>The system tick, us: the shortest sleep nanoFramework gives, and how far a sleep can overrun.</summary>
        public const long SystemTickMicroseconds = 10000;

        /// <summary>The loop sleeps only when the next read is further away than this, us: one tick and a 2 ms margin.</summary>
        public const long SleepAboveMicroseconds = 12000;

        /// <summary>
        /// Milliseconds to sleep when the next read is <paramref name="untilDueMicroseconds"/> away: 0 means yield and
        /// look again (the deadline is within a tick and the margin, or due now); otherwise the sleep ends at least one
        /// system tick before the deadline.
        /// </summary>
        public static int MillisecondsToSleep(long untilDueMicroseconds)
        {
            if (untilDueMicroseconds <= SleepAboveMicroseconds)
            {
                return 0;
            }

            long milliseconds = (untilDueMicroseconds - SystemTickMicroseconds) / 1000;
            return milliseconds > int.MaxValue ? int.MaxValue : (int)milliseconds;
        }
    }
}
