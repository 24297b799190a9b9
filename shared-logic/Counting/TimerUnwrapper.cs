namespace FreqReadout.Counting
{
    /// <summary>
    /// Unwraps raw hardware timer values, recorded modulo 2^bits, into a monotonic 64-bit tick.
    /// <para>
    /// Assumption: less than one wrap between consecutive values (the step from one value to the
    /// next is (raw - previous) mod 2^bits). The first value accepted becomes tick 0: every
    /// unwrapped tick is the time since the first value, <c>tick = (raw - FirstRaw) + wraps x 2^bits</c>,
    /// so it stays small (at 80 MHz a long lasts about 3,600 years) wherever in the range the
    /// timer started; <see cref="FirstRaw"/> keeps the offset for a caller that needs the raw scale.
    /// </para>
    /// <para>
    /// Timestamps (the default): a repeated value cannot be right (two edges at the same tick, or
    /// exactly one whole wrap), so it is rejected; with 64 bits the values must strictly increase.
    /// Pulse-counter counts (<c>allowRepeats = true</c>): an unchanged count is normal; with 64 bits
    /// the counts must not decrease. The same class therefore unwraps the <c>count_bits</c> column
    /// of a snapshot capture: <c>new TimerUnwrapper(countBits, true)</c>.
    /// </para>
    /// <para>
    /// A wrap that happens within fewer than <see cref="MinIntervalsPerWrap"/> expected intervals
    /// lets a dropout hide inside one wrap (it would be read as a short gap), and a signal whose
    /// period is longer than one wrap is read at a wrong (aliased) frequency: see
    /// <see cref="WrapsTooFast"/> and <see cref="TryGetWrapWarning"/>.
    /// </para>
    /// <para>
    /// Backward steps: with <see cref="ExpectedIntervalTicks"/> set (the caller's running period), a
    /// narrow-timer value that lies a little below the previous one — at most
    /// <see cref="MaxBackwardIntervals"/> expected intervals back, and nearer backwards than forwards —
    /// is a step back in time (rows out of order, a timer reset), not a near-full wrap: it is rejected
    /// and <see cref="LastBackwardTicks"/> says how far back it was. Longer forward gaps are unchanged.
    /// Without an expected interval (0, the default) every step is taken as forward, as before.
    /// </para>
    /// </summary>
    public sealed class TimerUnwrapper
    {
        /// <summary>The timer should wrap no sooner than after this many expected intervals, else a warning is due.</summary>
        public const int MinIntervalsPerWrap = 8;

        /// <summary>A value at most this many expected intervals below the previous one is a backward step (see <see cref="ExpectedIntervalTicks"/>).</summary>
        public const int MaxBackwardIntervals = 8;

        private readonly ulong _mask;
        private readonly bool _allowRepeats;
        private bool _started;
        private ulong _firstRaw;
        private ulong _lastRaw;
        private long _lastTick;
        private long _wraps;
        private long _rejected;
        private bool _wrapWarned;
        private double _expectedInterval;
        private long _lastBackward;
        private long _backwardSteps;

        /// <summary>
        /// An unwrapper for timestamps (repeated values rejected).
        /// </summary>
        /// <param name="bits">Timer width: 16, 24, 32 or 64.</param>
        /// <exception cref="System.ArgumentException">Any other width.</exception>
        public TimerUnwrapper(int bits)
            : this(bits, false)
        {
        }

        /// <summary>
        /// An unwrapper for timestamps (<paramref name="allowRepeats"/> false) or cumulative counts (true).
        /// </summary>
        /// <param name="bits">Timer or counter width: 16, 24, 32 or 64.</param>
        /// <param name="allowRepeats">True when an unchanged value is valid (pulse-counter counts).</param>
        /// <exception cref="System.ArgumentException">A width other than 16, 24, 32 or 64.</exception>
        public TimerUnwrapper(int bits, bool allowRepeats)
        {
            if (bits != 16 && bits != 24 && bits != 32 && bits != 64)
            {
                throw new System.ArgumentException("timer_bits must be 16, 24, 32 or 64 (got " + bits.ToString() + ")");
            }

            Bits = bits;
            _allowRepeats = allowRepeats;
            _mask = bits == 64 ? ulong.MaxValue : (1UL << bits) - 1UL;
        }

        /// <summary>Timer width in bits (16, 24, 32 or 64).</summary>
        public int Bits { get; }

        /// <summary>True when an unchanged value is accepted (counts), false for timestamps.</summary>
        public bool AllowRepeats
        {
            get { return _allowRepeats; }
        }

        /// <summary>Largest raw value the timer can hold, 2^bits - 1.</summary>
        public ulong MaxRaw
        {
            get { return _mask; }
        }

        /// <summary>Ticks per wrap, 2^bits, as a double (2^64 = 1.8446744073709552e19 for a 64-bit timer).</summary>
        public double WrapTicks
        {
            get { return (double)_mask + 1.0; }
        }

        /// <summary>True once a first value has been accepted.</summary>
        public bool HasValue
        {
            get { return _started; }
        }

        /// <summary>The first accepted raw value (tick 0); 0 before any.</summary>
        public ulong FirstRaw
        {
            get { return _firstRaw; }
        }

        /// <summary>The last accepted raw value; 0 before any.</summary>
        public ulong LastRaw
        {
            get { return _lastRaw; }
        }

        /// <summary>The last unwrapped tick handed out; 0 before any.</summary>
        public long LastTick
        {
            get { return _lastTick; }
        }

        /// <summary>Wraps seen so far (steps where the raw value fell back).</summary>
        public long Wraps
        {
            get { return _wraps; }
        }

        /// <summary>
        /// Expected ticks between consecutive values (for timestamps the running period, for counts the
        /// counts per read), used to tell a small backward step from a near-full wrap; 0 or less (the
        /// default) means unknown and turns the backward-step check off. A plain field write, O(1).
        /// </summary>
        public double ExpectedIntervalTicks
        {
            get { return _expectedInterval; }
            set { _expectedInterval = value; }
        }

        /// <summary>
        /// How many ticks back the most recently rejected value lay when it was rejected as a backward
        /// step (below the previous value); 0 when the most recent rejection had another reason, or none.
        /// </summary>
        public long LastBackwardTicks
        {
            get { return _lastBackward; }
        }

        /// <summary>Values rejected as backward steps so far (included in <see cref="Rejected"/>).</summary>
        public long BackwardSteps
        {
            get { return _backwardSteps; }
        }

        /// <summary>Values rejected by <see cref="TryUnwrap"/> so far.</summary>
        public long Rejected
        {
            get { return _rejected; }
        }

        /// <summary>
        /// Unwraps one raw value. The first accepted value gives tick 0; each later one adds
        /// (raw - previous raw) mod 2^bits.
        /// </summary>
        /// <param name="raw">Raw timer value, which must be below 2^bits.</param>
        /// <param name="tick">The unwrapped tick; on failure the last good tick (0 before any).</param>
        /// <returns>
        /// False, leaving the state unchanged, when the value cannot be right: raw &gt;= 2^bits; a
        /// repeated timestamp; a 64-bit value below the previous one (or, for timestamps, equal to
        /// it); a narrow-timer backward step (see <see cref="ExpectedIntervalTicks"/>): back = 2^bits -
        /// ((raw - previous) mod 2^bits) with back &lt;= MaxBackwardIntervals x ExpectedIntervalTicks and
        /// back &lt; the forward step; or a step that would overflow the 64-bit tick.
        /// </returns>
        public bool TryUnwrap(ulong raw, out long tick)
        {
            tick = _lastTick;
            _lastBackward = 0;
            if (raw > _mask)
            {
                _rejected++;
                return false;
            }

            if (!_started)
            {
                _started = true;
                _firstRaw = raw;
                _lastRaw = raw;
                _lastTick = 0;
                tick = 0;
                return true;
            }

            if (Bits == 64 && raw < _lastRaw)
            {
                _rejected++;
                _backwardSteps++;
                _lastBackward = (long)(_lastRaw - raw > (ulong)long.MaxValue ? (ulong)long.MaxValue : _lastRaw - raw);
                return false;
            }

            ulong delta = unchecked(raw - _lastRaw) & _mask;
            if (delta == 0 && !_allowRepeats)
            {
                _rejected++;
                return false;
            }

            if (Bits < 64 && delta != 0 && _expectedInterval > 0)
            {
                // The same raw value read backwards: back = 2^bits - delta ticks before the previous one.
                ulong back = _mask - delta + 1UL;
                if (back < delta && (double)back <= MaxBackwardIntervals * _expectedInterval)
                {
                    _rejected++;
                    _backwardSteps++;
                    _lastBackward = (long)back;
                    return false;
                }
            }

            if (delta > (ulong)(long.MaxValue - _lastTick))
            {
                _rejected++;
                return false;
            }

            if (raw < _lastRaw)
            {
                _wraps++;
            }

            _lastRaw = raw;
            _lastTick += (long)delta;
            tick = _lastTick;
            return true;
        }

        /// <summary>
        /// Unwraps a run of plain forward steps from an array, exactly as <see cref="TryUnwrap"/> one by one would, and
        /// stops before the first value that is not one: a plain step is at most <paramref name="maxStep"/> ticks, and
        /// for a narrow timer at most half a wrap (so the backward-step check, and with it
        /// <see cref="ExpectedIntervalTicks"/>, cannot reject it); it is not a repeat (unless repeats are allowed), not
        /// above 2^bits - 1, for 64 bits not below the previous value, and does not overflow the tick. Before the first
        /// value nothing is taken. The caller hands the value it stopped at to <see cref="TryUnwrap"/>, with
        /// ExpectedIntervalTicks as it would have been. Nothing is allocated; at most count passes.
        /// </summary>
        /// <param name="raw">Raw timer values.</param>
        /// <param name="offset">Index of the first value in raw.</param>
        /// <param name="count">Values available from offset (0 or more).</param>
        /// <param name="maxStep">Largest step to take, ticks (a caller that acts on longer gaps stops there).</param>
        /// <param name="ticks">Receives the unwrapped ticks of the values taken.</param>
        /// <param name="ticksOffset">Index in ticks for the first value taken.</param>
        /// <returns>Values taken (0 to count); ticks[ticksOffset ..] holds their ticks.</returns>
        /// <exception cref="System.ArgumentNullException">raw or ticks is null.</exception>
        /// <exception cref="System.ArgumentOutOfRangeException">offset, count or ticksOffset outside the arrays.</exception>
        public int UnwrapRun(ulong[] raw, int offset, int count, ulong maxStep, long[] ticks, int ticksOffset)
        {
            if (raw == null)
            {
                throw new System.ArgumentNullException("raw");
            }

            if (ticks == null)
            {
                throw new System.ArgumentNullException("ticks");
            }

            if (offset < 0 || count < 0 || offset > raw.Length - count || ticksOffset < 0 || ticksOffset > ticks.Length - count)
            {
                throw new System.ArgumentOutOfRangeException("count");
            }

            if (!_started)
            {
                return 0;
            }

            ulong mask = _mask;
            bool wide = Bits == 64;
            ulong limit = maxStep;
            if (!wide)
            {
                // back = 2^bits - delta is below delta only for delta above half a wrap.
                ulong half = (mask >> 1) + 1UL;
                if (limit > half)
                {
                    limit = half;
                }
            }

            ulong least = _allowRepeats ? 0UL : 1UL;
            ulong last = _lastRaw;
            long lastTick = _lastTick;
            long wraps = _wraps;
            int k = 0;
            while (k < count)
            {
                ulong value = raw[offset + k];
                if (value > mask || (wide && value < last))
                {
                    break;
                }

                ulong delta = unchecked(value - last) & mask;
                if (delta < least || delta > limit || delta > (ulong)(long.MaxValue - lastTick))
                {
                    break;
                }

                if (value < last)
                {
                    wraps++;
                }

                last = value;
                lastTick += (long)delta;
                ticks[ticksOffset + k] = lastTick;
                k++;
            }

            if (k > 0)
            {
                _lastRaw = last;
                _lastTick = lastTick;
                _wraps = wraps;
                _lastBackward = 0;
            }

            return k;
        }

        /// <summary>
        /// True when the timer wraps within fewer than <see cref="MinIntervalsPerWrap"/> expected
        /// intervals: WrapTicks &lt; 8 x <paramref name="expectedIntervalTicks"/>. Then a dropout of
        /// more than one wrap reads as a short gap and cannot be seen.
        /// </summary>
        /// <param name="expectedIntervalTicks">Expected ticks between values (e.g. EdgeCounter.RunningPeriodTicks); 0 or less: unknown, gives false.</param>
        public bool WrapsTooFast(double expectedIntervalTicks)
        {
            if (!(expectedIntervalTicks > 0))
            {
                return false;
            }

            return WrapTicks < MinIntervalsPerWrap * expectedIntervalTicks;
        }

        /// <summary>
        /// Gives the fast-wrap warning once (until <see cref="Reset"/>): true, with the text, the first
        /// time <see cref="WrapsTooFast"/> holds for the given expected interval; false otherwise
        /// (warning null). Allocates only the one warning string.
        /// </summary>
        /// <param name="expectedIntervalTicks">Expected ticks between values; 0 or less: unknown, no warning.</param>
        /// <param name="warning">The warning naming the timer width, the wrap and the interval; null when none is due.</param>
        public bool TryGetWrapWarning(double expectedIntervalTicks, out string warning)
        {
            warning = null;
            if (_wrapWarned || !WrapsTooFast(expectedIntervalTicks))
            {
                return false;
            }

            _wrapWarned = true;
            long interval = (long)(expectedIntervalTicks + 0.5);
            long perWrap10 = (long)(10.0 * WrapTicks / expectedIntervalTicks);
            warning = "timer_bits = " + Bits.ToString() + ": the timer wraps every " + ((long)WrapTicks).ToString()
                + " ticks, only " + (perWrap10 / 10).ToString() + "." + (perWrap10 % 10).ToString()
                + " expected intervals of about " + interval.ToString() + " ticks (fewer than "
                + MinIntervalsPerWrap.ToString() + "): a dropout longer than one wrap would go unseen, and the frequency may be aliased"
                + " (a signal whose true period is longer than one wrap reads as a steady, wrong, higher frequency;"
                + " give search_hz to have it checked, or use a wider timer, a slower clock or a larger prescale)";
            return true;
        }

        /// <summary>Forgets all values and the warning; the next accepted value is tick 0 again.</summary>
        public void Reset()
        {
            _started = false;
            _firstRaw = 0;
            _lastRaw = 0;
            _lastTick = 0;
            _wraps = 0;
            _rejected = 0;
            _wrapWarned = false;
            _expectedInterval = 0;
            _lastBackward = 0;
            _backwardSteps = 0;
        }
    }
}
