using FreqReadout.Numerics;

namespace FreqReadout.Counting
{
    /// <summary>
    /// Gate-by-gate frequency from hardware pulse-counter snapshots (read tick, cumulative count),
    /// combined by least-squares regression of count on time over the gate; the result has the same
    /// shape as an edge gate (<see cref="EstimatorKind.SnapshotRegression"/>, ReciprocalHz = 0,
    /// Edges = snapshots used).
    /// <para>
    /// Input: unwrapped ticks and unwrapped counts. A hardware counter of count_bits width is
    /// unwrapped with <c>new TimerUnwrapper(countBits, true)</c> (an unchanged count is valid), the
    /// read time with <c>new TimerUnwrapper(timerBits)</c>. The counts expected per read are
    /// <see cref="RunningIntervalTicks"/> / <see cref="RunningCountPeriodTicks"/>; pass that to the count
    /// unwrapper's <see cref="TimerUnwrapper.TryGetWrapWarning"/> (a narrow counter at a high rate can
    /// wrap within a few reads, and a missed read could then hide a whole wrap).
    /// </para>
    /// <para>
    /// Gates as for edges: they share their boundary snapshot; a time gate closes on the first
    /// snapshot at or after GateSeconds from its opening snapshot, an edge-mode gate after GateEdges
    /// snapshot intervals, any gate after <see cref="MaxGateIntervals"/>. Time 0 is the first
    /// accepted snapshot.
    /// </para>
    /// <para>
    /// Sums: with x_k = t_k - t_0 and y_k = c_k - c_0 for the gate's snapshots k = 0..n-1, residuals
    /// against integer nominals Q0 (ticks per read) and C0 (counts per read), u_k = x_k - k Q0 and
    /// v_k = y_k - k C0, are summed as 64-bit integers (sum u, v, k u, k v, u u, u v); a residual
    /// beyond 2^22 moves its nominal by u_k / k with the sums corrected exactly. At gate close, in
    /// double, with A_ab = n sum(a b) - sum(a) sum(b) (A_kk = n^2 (n^2 - 1) / 12):
    /// n^2 Cov(x, y) = Q0 C0 A_kk + Q0 A_kv + C0 A_ku + A_uv, n^2 Var(x) = Q0^2 A_kk + 2 Q0 A_ku + A_uu,
    /// slope s = Cov / Var counts per tick, frequency = Prescale x ClockHz x s.
    /// </para>
    /// <para>
    /// Error model: read-time resolution 1/12 ticks^2 (one tick) and read jitter JitterTicks^2 are white,
    /// turned into counts by the slope: s^2 (1/12 + JitterTicks^2) / Sxx, Sxx = sum (x_k - mean x)^2 =
    /// n Var(x) ticks^2. The whole-count quantisation is not white when the reads are strictly periodic:
    /// the count c_k = floor(phase + k R) of R counts per read repeats a sawtooth pattern fixed by frac(R),
    /// so its error follows <see cref="QuantisationErrorModel"/> (in counts, per read index), dithered
    /// only by how irregular the latch times really are: the rms scatter of the read ticks about their
    /// straight line in k, sigma_t^2 = RSS / (n - 2), less what the read jitter and tick resolution
    /// explain, with a margin for the estimate's own scatter:
    /// sigma_L^2 = max(0, sigma_t^2 - (1/12 + J^2) (1 + 3 sqrt(2 / (n - 2)))), dither J_c = s sigma_L counts.
    /// Count part: (sigma_w^2(J_c) - J_c^2) / Sxx (the latch irregularity is no error of the count) + (deterministic part at frac(R) over n read indices) / Q^2, with Q
    /// the mean read interval in ticks. Var(s) = time part + count part;
    /// ErrorHz = Prescale x ClockHz x sqrt(Var(s)). Irregular reads (J_c of a count or more) give the
    /// white model of old: about sqrt(12) sigma_y / (T sqrt(M)) Hz for M snapshots over a gate T,
    /// sigma_y^2 = 1/12 + s^2 (1/12 + J^2), whatever the frequency; strictly periodic reads at a ratio
    /// where the sawtooth lines up get the larger, real figure (a conservative 1-sigma, see the model).
    /// </para>
    /// <para>
    /// Guards: a snapshot whose tick does not increase or whose count falls is rejected and counted in
    /// <see cref="GlitchesTotal"/> and the gate's Glitches (state Glitch); a merely early read is valid data and kept. Read interval: the
    /// first interval of a run bootstraps it, then each accepted interval d moves it by (d - Q) / 16. A
    /// read gap above DropoutPeriods x Q, or of at least NoSignalSeconds, is a dropout: the gate closes
    /// at the last good snapshot (state Dropout when it holds at least 2, else no result) and the
    /// snapshot after the gap opens the next gate. Count stall: the running count period (ticks per
    /// count, from one count change to the next, bootstrapped by the first and moved by 1/16 of each
    /// new one) sets how long the count may stand still; a read whose count has not moved for more
    /// than DropoutPeriods count periods is a dropout too (the signal stopped): the gate closes at
    /// the previous read, and the next gate opens at the first read after the count moves again.
    /// No signal: when the count has not changed for
    /// NoSignalSeconds of read time, a NoSignal result (no frequency) is returned, once per
    /// NoSignalSeconds, and the open gate is abandoned; a gate whose count did not change at all also
    /// gives NoSignal. Empty input: a gate needs at least 2 snapshots; before that no result is
    /// made. Nothing allocates per snapshot or per gate.
    /// </para>
    /// </summary>
    public sealed class SnapshotCounter
    {
        /// <summary>A gate closes after at most this many snapshot intervals (2^16) so its integer sums stay in range.</summary>
        public const int MaxGateIntervals = 1 << 16;

        /// <summary>Longest time gate, ticks (2^40).</summary>
        public const long MaxGateTicks = 1L << 40;

        private const long ResidualLimit = 1L << 22;
        private const double IntervalWeight = 1.0 / 16.0;

        private readonly double _clockHz;
        private readonly int _prescale;
        private readonly SignalKind _signal;
        private readonly GateMode _mode;
        private readonly long _gateTicks;
        private readonly int _gateIntervals;
        private readonly double _timeVar;
        private readonly double _dropoutPeriods;
        private readonly long _noSignalTicks;
        private readonly double _jitter2;
        private readonly QuantisationErrorModel _countModel;

        private bool _hasFirst;
        private long _firstTick;
        private bool _hasLast;
        private long _lastTick;
        private long _lastCount;
        private bool _hasInterval;
        private double _interval;
        private long _changeRef;
        private long _changeTick;
        private long _changeCount;
        private bool _hasTpc;
        private double _tpc;
        private bool _stalled;

        private long _t0;
        private long _c0;
        private long _q0;
        private long _k0;
        private int _n;
        private long _su;
        private long _sv;
        private long _sku;
        private long _skv;
        private long _suu;
        private long _suv;
        private bool _gateAfterGap;
        private int _gateGlitches;

        private long _glitchesTotal;
        private long _dropoutsTotal;
        private long _snapshotsTotal;
        private long _gatesTotal;

        /// <summary>
        /// A counter for the given settings (read once here). Estimator is ignored: the result is always
        /// <see cref="EstimatorKind.SnapshotRegression"/>; GlitchFraction is not used (see the class notes).
        /// </summary>
        /// <param name="settings">Valid settings (see <see cref="CounterSettings.TryValidate"/>); JitterTicks is the read jitter.</param>
        /// <exception cref="System.ArgumentNullException">settings is null.</exception>
        /// <exception cref="System.ArgumentException">An invalid setting, named with its allowed range.</exception>
        public SnapshotCounter(CounterSettings settings)
        {
            if (settings == null)
            {
                throw new System.ArgumentNullException("settings");
            }

            string error;
            if (!settings.TryValidate(out error))
            {
                throw new System.ArgumentException(error);
            }

            double gateTicks = MainsGate.GateSecondsFor(settings.GateSeconds, settings.MainsHz, EstimatorKind.SnapshotRegression) * settings.ClockHz;
            if (settings.Mode == GateMode.Time && !(gateTicks <= MaxGateTicks))
            {
                throw new System.ArgumentException("gate seconds x clock_hz must be at most 2^40 ticks");
            }

            double noSignalTicks = settings.NoSignalSeconds * settings.ClockHz;
            if (!(noSignalTicks <= 4.0e18))
            {
                throw new System.ArgumentException("no-signal seconds x clock_hz must be below 4e18 ticks");
            }

            Settings = settings;
            _clockHz = settings.ClockHz;
            _prescale = settings.Prescale;
            _signal = settings.Signal;
            _mode = settings.Mode;
            _gateTicks = settings.Mode == GateMode.Time ? ScalarMath.CeilingToLongTolerant(gateTicks) : 0;
            if (_gateTicks < 1)
            {
                _gateTicks = 1;
            }

            _gateIntervals = settings.GateEdges < MaxGateIntervals ? settings.GateEdges : MaxGateIntervals;
            _timeVar = (1.0 / 12.0) + (settings.JitterTicks * settings.JitterTicks);
            _jitter2 = settings.JitterTicks * settings.JitterTicks;
            _countModel = new QuantisationErrorModel(0);
            _dropoutPeriods = settings.DropoutPeriods;
            _noSignalTicks = ScalarMath.CeilingToLongTolerant(noSignalTicks);
            if (_noSignalTicks < 1)
            {
                _noSignalTicks = 1;
            }
        }

        /// <summary>The settings the counter was made with.</summary>
        public CounterSettings Settings { get; }

        /// <summary>Snapshots rejected (tick not increasing or count falling) since construction or <see cref="Reset"/>.</summary>
        public long GlitchesTotal
        {
            get { return _glitchesTotal; }
        }

        /// <summary>Read gaps that closed a gate since construction or <see cref="Reset"/>.</summary>
        public long DropoutsTotal
        {
            get { return _dropoutsTotal; }
        }

        /// <summary>Accepted snapshots since construction or <see cref="Reset"/>.</summary>
        public long SnapshotsTotal
        {
            get { return _snapshotsTotal; }
        }

        /// <summary>Gate results with a frequency handed out since construction or <see cref="Reset"/>.</summary>
        public long GatesTotal
        {
            get { return _gatesTotal; }
        }

        /// <summary>The running count period, ticks per count (0 while unknown).</summary>
        public double RunningCountPeriodTicks
        {
            get { return _hasTpc ? _tpc : 0; }
        }

        /// <summary>The running read interval, ticks (0 while unknown).</summary>
        public double RunningIntervalTicks
        {
            get { return _hasInterval ? _interval : 0; }
        }

        /// <summary>
        /// Feeds one snapshot.
        /// </summary>
        /// <param name="tick">Unwrapped read tick.</param>
        /// <param name="count">Unwrapped cumulative count.</param>
        /// <param name="result">Caller-owned; filled with the gate this snapshot (or the gap before it) closed, or a NoSignal result; unchanged when false is returned.</param>
        /// <returns>True when a result is due: a gate with a frequency (Ok, Glitch or Dropout), or NoSignal (HasFrequency false).</returns>
        public bool AddSnapshot(long tick, long count, GateResult result)
        {
            if (!_hasLast)
            {
                if (!_hasFirst)
                {
                    _hasFirst = true;
                    _firstTick = tick;
                }

                _changeRef = tick;
                _changeTick = tick;
                _changeCount = count;
                _hasTpc = false;
                _stalled = false;
                OpenGate(tick, count);
                Accept(tick, count);
                return false;
            }

            if (tick <= _lastTick || count < _lastCount)
            {
                _glitchesTotal++;
                _gateGlitches++;
                return false;
            }

            bool changed = count != _lastCount;
            if (!changed && tick - _changeRef >= _noSignalTicks)
            {
                long start = _changeRef;
                _changeRef = tick;
                _stalled = true;
                _hasInterval = false;
                OpenGate(tick, count);
                Accept(tick, count);
                NoSignal(start, tick, result);
                return true;
            }

            if (changed)
            {
                _changeRef = tick;
            }

            long d = tick - _lastTick;
            bool longGap = d >= _noSignalTicks;
            if (longGap || (_hasInterval && d > _dropoutPeriods * _interval))
            {
                _dropoutsTotal++;
                bool closed = false;
                if (_n >= 2)
                {
                    closed = TryCloseGate(GateState.Dropout, 1, result);
                }
                else if (_gateAfterGap)
                {
                    _hasInterval = false;
                }

                if (longGap)
                {
                    _hasInterval = false;
                    _hasTpc = false;
                }

                OpenGate(tick, count);
                _gateAfterGap = true;
                _changeTick = tick;
                _changeCount = count;
                Accept(tick, count);
                return closed;
            }

            UpdateInterval(d);
            if (_stalled)
            {
                // The count stood still; the gate restarts at each read until the count moves, and the
                // first read after it moves opens the next gate (the signal came back somewhere before it).
                if (changed)
                {
                    _stalled = false;
                    _hasTpc = false;
                    _changeTick = tick;
                    _changeCount = count;
                }

                OpenGate(tick, count);
                Accept(tick, count);
                return false;
            }

            if (!changed && _hasTpc && (tick - _changeTick) > _dropoutPeriods * _tpc)
            {
                // Count stall: no count for more than DropoutPeriods expected count periods.
                _dropoutsTotal++;
                bool closed = _n >= 2 && TryCloseGate(GateState.Dropout, 1, result);
                _stalled = true;
                OpenGate(tick, count);
                Accept(tick, count);
                return closed;
            }

            if (changed)
            {
                double tpc = (tick - _changeTick) / (double)(count - _changeCount);
                if (_hasTpc)
                {
                    _tpc += (tpc - _tpc) * IntervalWeight;
                }
                else
                {
                    _tpc = tpc;
                    _hasTpc = true;
                }

                _changeTick = tick;
                _changeCount = count;
            }

            Append(tick, count);
            Accept(tick, count);
            int intervals = _n - 1;
            bool close = intervals >= MaxGateIntervals
                || (_mode == GateMode.Time ? (tick - _t0) >= _gateTicks : intervals >= _gateIntervals);
            if (!close)
            {
                return false;
            }

            bool got = TryCloseGate(_gateGlitches > 0 ? GateState.Glitch : GateState.Ok, 0, result);
            OpenGate(tick, count);
            return got;
        }

        /// <summary>Forgets all state, totals and the time origin.</summary>
        public void Reset()
        {
            _hasFirst = false;
            _firstTick = 0;
            _hasLast = false;
            _lastTick = 0;
            _lastCount = 0;
            _hasInterval = false;
            _interval = 0;
            _changeRef = 0;
            _changeTick = 0;
            _changeCount = 0;
            _hasTpc = false;
            _tpc = 0;
            _stalled = false;
            OpenGate(0, 0);
            _glitchesTotal = 0;
            _dropoutsTotal = 0;
            _snapshotsTotal = 0;
            _gatesTotal = 0;
        }

        private void UpdateInterval(long d)
        {
            if (_hasInterval)
            {
                _interval += (d - _interval) * IntervalWeight;
            }
            else
            {
                _interval = d;
                _hasInterval = true;
            }
        }

        private void Accept(long tick, long count)
        {
            _hasLast = true;
            _lastTick = tick;
            _lastCount = count;
            _snapshotsTotal++;
        }

        private void OpenGate(long tick, long count)
        {
            _t0 = tick;
            _c0 = count;
            _q0 = 0;
            _k0 = 0;
            _n = 1;
            _su = 0;
            _sv = 0;
            _sku = 0;
            _skv = 0;
            _suu = 0;
            _suv = 0;
            _gateAfterGap = false;
            _gateGlitches = 0;
        }

        private void Append(long tick, long count)
        {
            long k = _n;
            if (k == 1)
            {
                _q0 = ScalarMath.RoundToLong(_interval);
                _k0 = count - _c0;
            }

            long sumK = (k * (k - 1)) / 2;
            long sumKK = ((k - 1) * k * ((2 * k) - 1)) / 6;
            long u = (tick - _t0) - (k * _q0);
            if (u > ResidualLimit || u < -ResidualLimit)
            {
                long d = u / k;
                _q0 += d;
                _suu += (d * d * sumKK) - (2 * d * _sku);
                _su -= d * sumK;
                _sku -= d * sumKK;
                _suv -= d * _skv;
                u -= d * k;
            }

            long v = (count - _c0) - (k * _k0);
            if (v > ResidualLimit || v < -ResidualLimit)
            {
                long d = v / k;
                _k0 += d;
                _sv -= d * sumK;
                _skv -= d * sumKK;
                _suv -= d * _sku;
                v -= d * k;
            }

            _su += u;
            _sv += v;
            _sku += k * u;
            _skv += k * v;
            _suu += u * u;
            _suv += u * v;
            _n++;
        }

        private double Seconds(long tick)
        {
            return _hasFirst ? (tick - _firstTick) / _clockHz : 0;
        }

        private void NoSignal(long start, long end, GateResult result)
        {
            result.Set(
                GateState.NoSignal,
                EstimatorKind.SnapshotRegression,
                _signal,
                false,
                0,
                0,
                0,
                0,
                0,
                _prescale,
                start,
                end,
                Seconds(start),
                Seconds(end),
                0,
                0,
                0,
                0);
        }

        private bool TryCloseGate(GateState state, int dropouts, GateResult result)
        {
            if (_lastCount == _c0)
            {
                NoSignal(_t0, _lastTick, result);
                return true;
            }

            double n = _n;
            double sumK = n * (n - 1) / 2.0;
            double akk = n * n * ((n * n) - 1.0) / 12.0;
            double aku = (n * _sku) - (sumK * _su);
            double akv = (n * _skv) - (sumK * _sv);
            double auu = (n * _suu) - ((double)_su * _su);
            double auv = (n * _suv) - ((double)_su * _sv);
            double q0 = _q0;
            double c0 = _k0;
            double cov = (q0 * c0 * akk) + (q0 * akv) + (c0 * aku) + auv;
            double var = (q0 * q0 * akk) + (2.0 * q0 * aku) + auu;
            if (!(var > 0))
            {
                NoSignal(_t0, _lastTick, result);
                return true;
            }

            double slope = cov / var;
            double scale = _prescale * _clockHz;
            double hz = scale * slope;
            double sxx = var / n;

            // How irregular the latch times are: scatter of the read ticks about their line in k.
            double ditherCounts = 0;
            if (_n >= 3)
            {
                double rss = (auu - ((aku * aku) / akk)) / n;
                double scatter2 = rss / (n - 2.0);
                double explained = ((1.0 / 12.0) + _jitter2) * (1.0 + (3.0 * ScalarMath.Sqrt(2.0 / (n - 2.0))));
                double latch2 = scatter2 - explained;
                if (latch2 > 0)
                {
                    ditherCounts = ScalarMath.Abs(slope) * ScalarMath.Sqrt(latch2);
                }
            }

            _countModel.Configure(ditherCounts);
            double readTicks = (double)(_lastTick - _t0) / (n - 1.0);
            double countsPerRead = slope * readTicks;
            double fraction = countsPerRead - ScalarMath.Floor(countsPerRead);
            double deterministic = _countModel.RegressionDeterministicVariance(fraction, _n, n * ((n * n) - 1.0) / 12.0);
            double varSlope = ((_countModel.QuantisationWhiteVariance + (slope * slope * _timeVar)) / sxx) + (deterministic / (readTicks * readTicks));
            double errHz = scale * ScalarMath.Sqrt(varSlope);
            _gatesTotal++;
            result.Set(
                state,
                EstimatorKind.SnapshotRegression,
                _signal,
                true,
                hz,
                errHz,
                0,
                hz,
                _n,
                _prescale,
                _t0,
                _lastTick,
                Seconds(_t0),
                Seconds(_lastTick),
                _gateGlitches,
                dropouts,
                (_lastCount - _c0) * _prescale,
                0);
            return true;
        }
    }
}
