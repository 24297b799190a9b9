using FreqReadout.Numerics;

namespace FreqReadout.Counting
{
    /// <summary>
    /// Gate-by-gate frequency from unwrapped edge timestamps (reciprocal counting: every gate opens
    /// and closes on an edge, so there is no +-1 count error).
    /// <para>
    /// Gates share their boundary edge: the closing edge of one gate opens the next. A time gate
    /// closes on the first accepted edge at or after GateSeconds from its opening edge (with MainsHz set,
    /// after the mains-nulling length of <see cref="MainsGate"/> instead); an edge gate after GateEdges
    /// periods. Time 0 is the first accepted edge. A gate also closes after
    /// <see cref="MaxGateIntervals"/> periods whatever the mode, which keeps the integer sums in range.
    /// </para>
    /// <para>
    /// Both estimators use the same n edges of a gate, each with its true period index i from the
    /// gate's opening edge (i_0 = 0; consecutive edges differ by 1, or by m where m - 1 edges were
    /// inferred as missed, see below). Residuals against an integer nominal period P0 (the rounded
    /// running period when the gate's second edge arrives): r = t_i - t_0 - i P0, summed as 64-bit
    /// integers with the indices: S_r = sum r, S_ir = sum i r, S_i = sum i, S_ii = sum i^2; they stay
    /// small (about i |P - P0| plus jitter), so nothing overflows or loses precision after 2^32 ticks
    /// or hours of capture. When a residual exceeds 2^21 ticks, P0 is moved by d = r / i and the sums
    /// are corrected exactly (S_r -= d S_i, S_ir -= d S_ii, over the indices so far). Only at gate
    /// close, in double, with I the last index:
    /// reciprocal period = P0 + r_I / I;
    /// regression period = P0 + (S_ir - S_i S_r / n) / Sxx, Sxx = S_ii - S_i^2 / n = sum (i - mean i)^2
    /// (least-squares slope of t on i; with no inferred edge, i = 0..n-1 and this is computed as
    /// 6 (2 S_ir - (n - 1) S_r) / (n (n^2 - 1)), the same slope);
    /// frequency = Prescale x ClockHz / period.
    /// </para>
    /// <para>
    /// Error model (<see cref="QuantisationErrorModel"/> with the configured JitterTicks as Gaussian
    /// dither): regression Var(P) = sigma_w^2 / Sxx + the deterministic quantisation part at the gate's
    /// ratio frac(P) (for white noise of variance sigma_x^2 per edge the least-squares slope with any
    /// abscissae has Var = sigma_x^2 / sum (i - mean i)^2, which for i = 0..N-1 is
    /// 12 sigma_x^2 / (N (N^2 - 1)); Rubiola 2005; Danielson, Vernotte and Rubiola 2016, eq. 21);
    /// reciprocal Var(P) = Var_span / I^2 with the worst-case span variance 2 sigma_w^2 + 2 sum_(m odd) A_m^2
    /// (1/4 tick^2 without jitter, 2 J^2 + 1/6 with much jitter); sigma_f = f sigma_P / P. With jitter of
    /// 1 tick rms or more this is the white model, sigma_x^2 = 1/12 + J^2; with less it is a conservative
    /// 1-sigma figure (see the model's notes).
    /// </para>
    /// <para>
    /// Running period (ticks per recorded edge): the first interval of a run bootstraps it (also after
    /// a no-signal state, after a gap of at least NoSignalSeconds, and after two dropouts in a row);
    /// then every accepted interval d spanning m periods moves it by (d / m - P) / 16. Glitch: an
    /// interval below GlitchFraction x P (or not positive) is a double-triggered edge, rejected and
    /// counted; the next interval is measured from the last accepted edge. Missed edges (with
    /// InferMissedEdges, once the period rests on more than its bootstrap interval, and in beat mode
    /// only while the running beat is at least InferMinBeatHz): an interval d with
    /// |d - m P| &lt; P / 4 for a whole m from 2 to <see cref="MaxInferredPeriods"/> (and m at most
    /// DropoutPeriods) counts as m periods, with m - 1 edges inferred, provided the timing noise allows
    /// the call: 4 sqrt(2 sigma_x^2 + m^2 sigma_P^2) &lt; P / 4, with sigma_x^2 = 1/12 + J^2 and
    /// sigma_P^2 = 2 sigma_x^2 / 31 the running period's own variance (an exponential average of weight
    /// 1/16 over intervals of variance 2 sigma_x^2). A quarter period is far outside what a search
    /// oscillator moves in one period (targets and drift move it by parts in 10^3 at most), and far
    /// from the glitch fraction, so a double trigger is never taken for a missed edge. Outside that
    /// band the interval is taken as one (long) period, as before. Dropout: an interval above
    /// DropoutPeriods x P (or at least NoSignalSeconds) that was not inferred closes the gate at the
    /// last good edge (a result with state Dropout when the gate has at least 2 edges, else none) and
    /// the edge after the gap opens the next gate. The bootstrap interval itself cannot be checked: a
    /// gap seen while the period rests on that one interval alone gives no result (it is counted as a
    /// dropout) and the period is learnt again, so a double trigger on the very first interval never
    /// produces a number.
    /// </para>
    /// <para>
    /// Empty input: a gate needs at least 2 edges (one interval); until then, and for a gate cut
    /// short by a gap before its second edge, no result is made (AddEdge returns false), never a
    /// division by zero. Nothing allocates per edge or per gate; per gate the regression's error model
    /// sums at most sqrt(N) + 5 harmonics (3 with 0.3 tick of jitter).
    /// </para>
    /// </summary>
    public sealed class EdgeCounter
    {
        /// <summary>A gate closes after at most this many recorded intervals (2^20) so its integer sums stay in range.</summary>
        public const int MaxGateIntervals = 1 << 20;

        /// <summary>Longest gate, ticks (2^40, about 3.8 h at 80 MHz); a longer GateSeconds x ClockHz is refused.</summary>
        public const long MaxGateTicks = 1L << 40;

        /// <summary>Largest number of periods one interval may be inferred to span (8: up to 7 missed edges in a row).</summary>
        public const int MaxInferredPeriods = 8;

        private const long ResidualLimit = 1L << 21;
        private const double InferTolerancePeriods = 0.25;
        private const double RunningPeriodWeight = 1.0 / 16.0;

        private readonly double _clockHz;
        private readonly int _prescale;
        private readonly SignalKind _signal;
        private readonly GateMode _mode;
        private readonly long _gateTicks;
        private readonly int _gateIntervals;
        private readonly EstimatorKind _estimator;
        private readonly double _sigmaX2;
        private readonly double _glitchFraction;
        private readonly double _dropoutPeriods;
        private readonly long _noSignalTicks;
        private readonly bool _infer;
        private readonly double _inferMinBeatHz;
        private readonly int _inferMaxPeriods;
        private readonly QuantisationErrorModel _model;

        // Run state.
        private bool _hasFirst;
        private long _firstTick;
        private bool _hasLast;
        private long _lastTick;
        private bool _hasPeriod;
        private double _period;
        private int _periodSamples;

        // Open gate.
        private bool _gateOpen;
        private long _gateStart;
        private int _gateN;
        private long _gateIndex;
        private long _p0;
        private long _sr;
        private long _sir;
        private long _si;
        private long _sii;
        private long _lastR;
        private int _gateGlitches;
        private int _gateInferred;
        private bool _gateAfterGap;

        // No-signal timing.
        private bool _hasRef;
        private long _refTick;

        private long _glitchesTotal;
        private long _dropoutsTotal;
        private long _edgesTotal;
        private long _gatesTotal;
        private long _inferredTotal;

        /// <summary>
        /// A counter for the given settings (read once here; later changes to the object are not seen).
        /// </summary>
        /// <param name="settings">Valid settings (see <see cref="CounterSettings.TryValidate"/>); Estimator must be Reciprocal or Regression.</param>
        /// <exception cref="System.ArgumentNullException">settings is null.</exception>
        /// <exception cref="System.ArgumentException">An invalid setting, named with its allowed range.</exception>
        public EdgeCounter(CounterSettings settings)
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

            if (settings.Estimator != EstimatorKind.Reciprocal && settings.Estimator != EstimatorKind.Regression)
            {
                throw new System.ArgumentException("estimator must be reciprocal or regression for edge captures");
            }

            double gateTicks = MainsGate.GateSecondsFor(settings.GateSeconds, settings.MainsHz, settings.Estimator) * settings.ClockHz;
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
            _estimator = settings.Estimator;
            _gateTicks = settings.Mode == GateMode.Time ? ScalarMath.CeilingToLongTolerant(gateTicks) : 0;
            if (_gateTicks < 1)
            {
                _gateTicks = 1;
            }

            _gateIntervals = settings.GateEdges < MaxGateIntervals ? settings.GateEdges : MaxGateIntervals;
            _sigmaX2 = (1.0 / 12.0) + (settings.JitterTicks * settings.JitterTicks);
            _glitchFraction = settings.GlitchFraction;
            _dropoutPeriods = settings.DropoutPeriods;
            _noSignalTicks = ScalarMath.CeilingToLongTolerant(noSignalTicks);
            if (_noSignalTicks < 1)
            {
                _noSignalTicks = 1;
            }

            _infer = settings.InferMissedEdges;
            _inferMinBeatHz = settings.InferMinBeatHz;
            _inferMaxPeriods = MaxInferredPeriods;
            if (settings.DropoutPeriods < _inferMaxPeriods)
            {
                _inferMaxPeriods = (int)settings.DropoutPeriods;
            }

            _model = new QuantisationErrorModel(settings.JitterTicks);
        }

        /// <summary>The settings the counter was made with.</summary>
        public CounterSettings Settings { get; }

        /// <summary>Double-triggered edges rejected since construction or <see cref="Reset"/>.</summary>
        public long GlitchesTotal
        {
            get { return _glitchesTotal; }
        }

        /// <summary>Dropouts (gaps that closed a gate) since construction or <see cref="Reset"/>.</summary>
        public long DropoutsTotal
        {
            get { return _dropoutsTotal; }
        }

        /// <summary>Edges inferred as missed (see the class notes) since construction or <see cref="Reset"/>.</summary>
        public long InferredTotal
        {
            get { return _inferredTotal; }
        }

        /// <summary>Accepted edges since construction or <see cref="Reset"/>.</summary>
        public long EdgesTotal
        {
            get { return _edgesTotal; }
        }

        /// <summary>Gate results with a frequency handed out since construction or <see cref="Reset"/>.</summary>
        public long GatesTotal
        {
            get { return _gatesTotal; }
        }

        /// <summary>True once the running period is known (after the first accepted interval of a run).</summary>
        public bool HasRunningPeriod
        {
            get { return _hasPeriod; }
        }

        /// <summary>
        /// The running period, ticks per recorded edge (0 while unknown). Pass it to
        /// <see cref="TimerUnwrapper.TryGetWrapWarning"/> for the fast-wrap warning.
        /// </summary>
        public double RunningPeriodTicks
        {
            get { return _hasPeriod ? _period : 0; }
        }

        /// <summary>True once the first edge has been accepted (the time origin is set).</summary>
        public bool HasTimeOrigin
        {
            get { return _hasFirst; }
        }

        /// <summary>Unwrapped tick of the first accepted edge (time 0); 0 before any.</summary>
        public long FirstTick
        {
            get { return _hasFirst ? _firstTick : 0; }
        }

        /// <summary>Gate length in ticks for a time gate: the smallest whole tick count &gt;= GateSeconds x ClockHz (the mains-nulling length with MainsHz set).</summary>
        public long GateTicks
        {
            get { return _gateTicks; }
        }

        /// <summary>
        /// Feeds one recorded edge.
        /// </summary>
        /// <param name="tick">Unwrapped timer tick of the edge (e.g. from <see cref="TimerUnwrapper"/>).</param>
        /// <param name="result">Caller-owned; filled with the gate that this edge (or the gap before it) closed; unchanged when false is returned.</param>
        /// <returns>True when a gate closed with a frequency (state Ok, Glitch or Dropout).</returns>
        public bool AddEdge(long tick, GateResult result)
        {
            if (!_gateOpen)
            {
                if (_hasLast && tick <= _lastTick)
                {
                    _glitchesTotal++;
                    return false;
                }

                if (!_hasFirst)
                {
                    _hasFirst = true;
                    _firstTick = tick;
                }

                OpenGate(tick);
                Accept(tick);
                return false;
            }

            long d = tick - _lastTick;
            if (d <= 0 || (_hasPeriod && d < _glitchFraction * _period))
            {
                _glitchesTotal++;
                _gateGlitches++;
                return false;
            }

            bool longGap = d >= _noSignalTicks;
            int periods = longGap ? 1 : InferredPeriods(d);
            if (periods == 1 && (longGap || (_hasPeriod && d > _dropoutPeriods * _period)))
            {
                _dropoutsTotal++;
                bool closed = false;
                if (_periodSamples < 2)
                {
                    // The running period rests on its bootstrap interval alone, which may itself have been
                    // a double trigger: give no result from it and learn the period again.
                    _hasPeriod = false;
                }
                else if (_gateN >= 2)
                {
                    CloseGate(GateState.Dropout, 1, result);
                    closed = true;
                }
                else if (_gateAfterGap)
                {
                    // Two gaps in a row: the running period may be wrong; learn it again.
                    _hasPeriod = false;
                }

                if (longGap)
                {
                    _hasPeriod = false;
                }

                OpenGate(tick);
                _gateAfterGap = true;
                Accept(tick);
                return closed;
            }

            if (_hasPeriod)
            {
                _period += ((periods == 1 ? d : (double)d / periods) - _period) * RunningPeriodWeight;
                if (_periodSamples < 2)
                {
                    _periodSamples++;
                }
            }
            else
            {
                _period = d;
                _hasPeriod = true;
                _periodSamples = 1;
            }

            if (periods > 1)
            {
                _gateInferred += periods - 1;
                _inferredTotal += periods - 1;
            }

            Append(tick, periods);
            Accept(tick);

            long spanned = _gateIndex;
            bool close = spanned >= MaxGateIntervals
                || (_mode == GateMode.Time ? (tick - _gateStart) >= _gateTicks : spanned >= _gateIntervals);
            if (!close)
            {
                return false;
            }

            CloseGate(_gateGlitches > 0 ? GateState.Glitch : GateState.Ok, 0, result);
            OpenGate(tick);
            return true;
        }

        /// <summary>
        /// Feeds recorded edges from an array, exactly as <see cref="AddEdge"/> one by one would, taking either a run of
        /// plain edges or one other edge. A plain edge is one that the open gate simply takes: the running period is
        /// known (on more than its bootstrap interval) and the gate holds at least 2 edges, the interval is neither a
        /// glitch, a dropout, a no-signal gap nor a candidate for inferred edges (below 1.5 running periods, which keeps
        /// its ratio below the 1.75 where inference starts), its residual needs no re-nominalising and it does not
        /// close the gate. Those are counted in one loop on local copies of the state; when the first edge is not plain,
        /// it alone goes through <see cref="AddEdge"/> (gate close, glitch, gap, inferred edges, the first edges of a
        /// gate or run). A caller that needs to look at the counter after every edge that is not plain (the running
        /// period, a closed gate) calls this again until the edges are used up. Nothing is allocated; the loop runs at
        /// most <paramref name="count"/> times.
        /// </summary>
        /// <param name="ticks">Unwrapped timer ticks of the edges (e.g. from <see cref="TimerUnwrapper.UnwrapRun"/>).</param>
        /// <param name="offset">Index of the first edge to feed.</param>
        /// <param name="count">Edges available from offset, at least 1.</param>
        /// <param name="result">Caller-owned; filled as by <see cref="AddEdge"/> when closed is true, else unchanged.</param>
        /// <param name="closed">True when the one edge taken closed a gate with a frequency (what AddEdge returned).</param>
        /// <returns>Edges taken from offset: 1 to count.</returns>
        /// <exception cref="System.ArgumentNullException">ticks or result is null.</exception>
        /// <exception cref="System.ArgumentOutOfRangeException">offset or count outside the array, or count below 1.</exception>
        public int AddEdges(long[] ticks, int offset, int count, GateResult result, out bool closed)
        {
            if (ticks == null)
            {
                throw new System.ArgumentNullException("ticks");
            }

            if (result == null)
            {
                throw new System.ArgumentNullException("result");
            }

            if (offset < 0 || count < 1 || offset > ticks.Length - count)
            {
                throw new System.ArgumentOutOfRangeException("count");
            }

            closed = false;
            if (_gateOpen && _hasPeriod && _periodSamples >= 2 && _gateN >= 2)
            {
                int taken = AddPlainEdges(ticks, offset, offset + count) - offset;
                if (taken > 0)
                {
                    return taken;
                }
            }

            closed = AddEdge(ticks[offset], result);
            return 1;
        }

        /// <summary>
        /// Tells the counter the time now. When no edge was accepted within NoSignalSeconds (measured
        /// from the last accepted edge, or from the first poll when there has been none), the open
        /// gate is abandoned (never reported late) and a no-signal result is returned; then again once
        /// per further NoSignalSeconds without an edge. The next edge starts a fresh gate and
        /// re-learns the running period.
        /// </summary>
        /// <param name="nowTick">Unwrapped tick now, on the same scale as the edges.</param>
        /// <param name="result">Caller-owned; unchanged when false is returned. On true: State NoSignal, HasFrequency false, every frequency 0, Edges 0, StartTick the last edge (or previous report), EndTick now; seconds are 0 before the first edge.</param>
        /// <returns>True when a no-signal result is due.</returns>
        public bool Poll(long nowTick, GateResult result)
        {
            if (!_hasRef)
            {
                _hasRef = true;
                _refTick = nowTick;
                return false;
            }

            if (nowTick - _refTick < _noSignalTicks)
            {
                return false;
            }

            long start = _refTick;
            _refTick = nowTick;
            _gateOpen = false;
            _hasPeriod = false;
            result.Set(
                GateState.NoSignal,
                _estimator,
                _signal,
                false,
                0,
                0,
                0,
                0,
                0,
                _prescale,
                start,
                nowTick,
                Seconds(start),
                Seconds(nowTick),
                0,
                0,
                0,
                0);
            return true;
        }

        /// <summary>Forgets all state, totals and the time origin (the next edge starts afresh as time 0).</summary>
        public void Reset()
        {
            _hasFirst = false;
            _firstTick = 0;
            _hasLast = false;
            _lastTick = 0;
            _hasPeriod = false;
            _period = 0;
            _periodSamples = 0;
            _gateOpen = false;
            _gateStart = 0;
            _gateN = 0;
            _gateIndex = 0;
            _p0 = 0;
            _sr = 0;
            _sir = 0;
            _si = 0;
            _sii = 0;
            _lastR = 0;
            _gateGlitches = 0;
            _gateInferred = 0;
            _gateAfterGap = false;
            _hasRef = false;
            _refTick = 0;
            _glitchesTotal = 0;
            _dropoutsTotal = 0;
            _edgesTotal = 0;
            _gatesTotal = 0;
            _inferredTotal = 0;
        }

        /// <summary>
        /// The plain edges of <see cref="AddEdges"/> from ticks[start] on, stopping before the first edge that is not plain
        /// or at end; returns the index it stopped at. Each plain edge does what <see cref="AddEdge"/> does for it (the
        /// same checks and the same arithmetic, in the same order): glitch, no-signal and dropout checks against the
        /// running period, the period update with weight 1/16, the residual sums (Append with one period) and
        /// <see cref="Accept"/>. Precondition: the gate is open, the period known on at least 2 intervals, the gate has
        /// at least 2 edges. At most end - start passes.
        /// </summary>
        private int AddPlainEdges(long[] ticks, int start, int end)
        {
            double period = _period;
            long lastTick = _lastTick;
            long gateIndex = _gateIndex;
            int gateN = _gateN;
            long sr = _sr;
            long sir = _sir;
            long si = _si;
            long sii = _sii;
            long lastR = _lastR;
            long p0 = _p0;
            long gateStart = _gateStart;
            long noSignalTicks = _noSignalTicks;
            double glitchFraction = _glitchFraction;
            double dropoutPeriods = _dropoutPeriods;
            bool inferCheck = _infer && _inferMaxPeriods >= 2;
            bool timeMode = _mode == GateMode.Time;
            long gateTicks = _gateTicks;
            long gateIntervals = _gateIntervals;
            int k = start;
            while (k < end)
            {
                long tick = ticks[k];
                long d = tick - lastTick;
                double dd = d;
                if (d <= 0 || dd < glitchFraction * period || d >= noSignalTicks)
                {
                    break;
                }

                // InferredPeriods gives 1 when d / P < 1.75; d < fl(1.5 P) keeps the rounded quotient below 1.5 (1 + 2^-52).
                if (inferCheck && !(dd < 1.5 * period))
                {
                    break;
                }

                if (dd > dropoutPeriods * period)
                {
                    break;
                }

                long i = gateIndex + 1;
                long r = (tick - gateStart) - (i * p0);
                if (r > ResidualLimit || r < -ResidualLimit)
                {
                    break;
                }

                if (i >= MaxGateIntervals || (timeMode ? (tick - gateStart) >= gateTicks : i >= gateIntervals))
                {
                    break;
                }

                period += (dd - period) * RunningPeriodWeight;
                sr += r;
                sir += i * r;
                si += i;
                sii += i * i;
                lastR = r;
                gateIndex = i;
                gateN++;
                lastTick = tick;
                k++;
            }

            if (k > start)
            {
                _period = period;
                _lastTick = lastTick;
                _hasRef = true;
                _refTick = lastTick;
                _gateIndex = gateIndex;
                _gateN = gateN;
                _sr = sr;
                _sir = sir;
                _si = si;
                _sii = sii;
                _lastR = lastR;
                _edgesTotal += k - start;
            }

            return k;
        }

        private void Accept(long tick)
        {
            _hasLast = true;
            _lastTick = tick;
            _hasRef = true;
            _refTick = tick;
            _edgesTotal++;
        }

        private void OpenGate(long tick)
        {
            _gateOpen = true;
            _gateStart = tick;
            _gateN = 1;
            _gateIndex = 0;
            _p0 = 0;
            _sr = 0;
            _sir = 0;
            _si = 0;
            _sii = 0;
            _lastR = 0;
            _gateGlitches = 0;
            _gateInferred = 0;
            _gateAfterGap = false;
        }

        /// <summary>
        /// The number of periods an interval of d ticks spans: m when |d - m P| &lt; P / 4 for a whole m
        /// in 2..MaxInferredPeriods (at most DropoutPeriods) and the timing noise allows the call (see the
        /// class notes); else 1. Always 1 with inference off, before the period rests on two intervals,
        /// and in beat mode below InferMinBeatHz.
        /// </summary>
        private int InferredPeriods(long d)
        {
            if (!_infer || !_hasPeriod || _periodSamples < 2 || _inferMaxPeriods < 2)
            {
                return 1;
            }

            double ratio = d / _period;
            if (ratio < 2.0 - InferTolerancePeriods || ratio >= _inferMaxPeriods + InferTolerancePeriods)
            {
                return 1;
            }

            if (_signal == SignalKind.Beat && (_prescale * _clockHz / _period) < _inferMinBeatHz)
            {
                return 1;
            }

            long m = ScalarMath.RoundToLong(ratio);
            double off = ratio - m;
            if (m < 2 || m > _inferMaxPeriods || !(off < InferTolerancePeriods && off > -InferTolerancePeriods))
            {
                return 1;
            }

            // 4 sigma of d - m P must fit in the tolerance: Var = 2 sigma_x^2 + m^2 (2 sigma_x^2 / 31).
            double sx2 = _sigmaX2;
            double spread2 = 16.0 * ((2.0 * sx2) + (m * m * 2.0 * sx2 / 31.0));
            double tol = InferTolerancePeriods * _period;
            if (spread2 >= tol * tol)
            {
                return 1;
            }

            return (int)m;
        }

        private void Append(long tick, int periods)
        {
            long i = _gateIndex + periods;
            if (_gateN == 1)
            {
                _p0 = ScalarMath.RoundToLong(_period);
                if (_p0 < 1)
                {
                    _p0 = 1;
                }
            }

            long r = (tick - _gateStart) - (i * _p0);
            if (r > ResidualLimit || r < -ResidualLimit)
            {
                // Re-nominalise: move P0 by d and correct the sums over the indices so far exactly.
                long d = r / i;
                if (d != 0)
                {
                    _p0 += d;
                    _sr -= d * _si;
                    _sir -= d * _sii;
                    r -= d * i;
                }
            }

            _sr += r;
            _sir += i * r;
            _si += i;
            _sii += i * i;
            _lastR = r;
            _gateIndex = i;
            _gateN++;
        }

        private double Seconds(long tick)
        {
            return _hasFirst ? (tick - _firstTick) / _clockHz : 0;
        }

        private void CloseGate(GateState state, int dropouts, GateResult result)
        {
            int n = _gateN;
            long span = _gateIndex;
            double dn = n;
            double scale = _prescale * _clockHz;

            double recPeriod = _p0 + ((double)_lastR / span);
            double sxx;
            double regOffset;
            if (_gateInferred == 0)
            {
                // Indices 0..n-1: the closed form for contiguous indices (exactly the slope below).
                long m = n - 1;
                long num2 = (2 * _sir) - (m * _sr);
                double den = dn * ((dn * dn) - 1.0);
                regOffset = (6.0 * num2) / den;
                sxx = den / 12.0;
            }
            else
            {
                double meanI = _si / dn;
                sxx = _sii - (meanI * _si);
                regOffset = (_sir - (meanI * _sr)) / sxx;
            }

            double regPeriod = _p0 + regOffset;
            double fraction = regOffset - ScalarMath.Floor(regOffset);
            double regVar = (_model.WhiteVariance / sxx) + _model.RegressionDeterministicVariance(fraction, span + 1, sxx);
            double recVar = _model.ReciprocalSpanVariance / ((double)span * span);

            double recHz = recPeriod > 0 ? scale / recPeriod : 0;
            double regHz = regPeriod > 0 ? scale / regPeriod : 0;
            double recErr = recPeriod > 0 ? recHz * ScalarMath.Sqrt(recVar) / recPeriod : 0;
            double regErr = regPeriod > 0 ? regHz * ScalarMath.Sqrt(regVar) / regPeriod : 0;

            bool regression = _estimator == EstimatorKind.Regression;
            _gatesTotal++;
            result.Set(
                state,
                _estimator,
                _signal,
                recPeriod > 0 && regPeriod > 0,
                regression ? regHz : recHz,
                regression ? regErr : recErr,
                recHz,
                regHz,
                n,
                _prescale,
                _gateStart,
                _lastTick,
                Seconds(_gateStart),
                Seconds(_lastTick),
                _gateGlitches,
                dropouts,
                span * _prescale,
                _gateInferred);
        }
    }
}
