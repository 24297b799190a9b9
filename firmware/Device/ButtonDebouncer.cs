namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// Debounces one push button from its raw level and the microsecond time, and tells a short press from a long one.
    /// <para>
    /// A change of level counts only once the new level has held for <see cref="DebounceMicroseconds"/> (default
    /// 25 ms: contact bounce of small push buttons settles within a few ms to 20 ms, common practice, no source); a
    /// shorter pulse or a burst of bounces is ignored. The press is timed from the moment its level first became steady.
    /// </para>
    /// <para>
    /// Design (this project's own): a press released before <see cref="LongPressMicroseconds"/> (default 1 s) is a
    /// short press, counted when it is released (<see cref="TryTakeShortPress"/>: re-baseline). A press held that long
    /// toggles <see cref="HoldOn"/> at once, while still held, so the user notices without letting go; its release
    /// then counts as nothing. A press held for minutes toggles once.
    /// </para>
    /// O(1) per update, nothing allocated; feed it at least every few ms (each loop step).
    /// </summary>
    public sealed class ButtonDebouncer
    {
        /// <summary>Default debounce time, us (common practice, no source: 20 to 30 ms).</summary>
        public const long DefaultDebounceMicroseconds = 25000;

        /// <summary>Default long-press time, us.</summary>
        public const long DefaultLongPressMicroseconds = 1000000;

        private readonly long debounceMicroseconds;
        private readonly long longPressMicroseconds;
        private bool started;
        private bool candidateDown;
        private long candidateSinceMicroseconds;
        private bool stableDown;
        private long pressStartMicroseconds;
        private bool longFired;
        private bool shortPending;
        private bool holdOn;

        /// <summary>A debouncer with the default times.</summary>
        public ButtonDebouncer()
            : this(DefaultDebounceMicroseconds, DefaultLongPressMicroseconds)
        {
        }

        /// <summary>A debouncer with the given times, us (debounce &gt;= 0, long press &gt; debounce).</summary>
        public ButtonDebouncer(long debounceMicroseconds, long longPressMicroseconds)
        {
            if (debounceMicroseconds < 0 || longPressMicroseconds <= debounceMicroseconds)
            {
                throw new System.ArgumentOutOfRangeException("longPressMicroseconds", "debounce must be >= 0 us and the long press longer than it");
            }

            this.debounceMicroseconds = debounceMicroseconds;
            this.longPressMicroseconds = longPressMicroseconds;
        }

        /// <summary>The debounce time, us.</summary>
        public long DebounceMicroseconds
        {
            get { return debounceMicroseconds; }
        }

        /// <summary>The long-press time, us.</summary>
        public long LongPressMicroseconds
        {
            get { return longPressMicroseconds; }
        }

        /// <summary>The debounced level: true while the button is steadily pressed.</summary>
        public bool IsDown
        {
            get { return stableDown; }
        }

        /// <summary>The hold state toggled by long presses (false at start).</summary>
        public bool HoldOn
        {
            get { return holdOn; }
        }

        /// <summary>Feeds the raw level (true = pressed) read at <paramref name="nowMicroseconds"/> (a clock that never goes back).</summary>
        public void Update(bool rawDown, long nowMicroseconds)
        {
            if (!started || rawDown != candidateDown)
            {
                started = true;
                candidateDown = rawDown;
                candidateSinceMicroseconds = nowMicroseconds;
            }

            if (candidateDown != stableDown && nowMicroseconds - candidateSinceMicroseconds >= debounceMicroseconds)
            {
                stableDown = candidateDown;
                if (stableDown)
                {
                    pressStartMicroseconds = candidateSinceMicroseconds;
                    longFired = false;
                }
                else if (!longFired)
                {
                    shortPending = true;
                }
            }

            if (stableDown && !longFired && nowMicroseconds - pressStartMicroseconds >= longPressMicroseconds)
            {
                longFired = true;
                holdOn = !holdOn;
            }
        }

        /// <summary>Takes a pending short press (one released before the long-press time); true once per press.</summary>
        public bool TryTakeShortPress()
        {
            bool pending = shortPending;
            shortPending = false;
            return pending;
        }
    }
}
