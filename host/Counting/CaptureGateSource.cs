using FreqReadout.Counting;
using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Counting;

/// <summary>
/// Replays a capture through the shared counting core: unwraps the raw timer values (and, for
/// snapshots, the raw counts) with <see cref="TimerUnwrapper"/>, feeds <see cref="EdgeCounter"/> or
/// <see cref="SnapshotCounter"/>, and yields each closed gate with the temperatures and marks its
/// rows carried. Streams: one row at a time, whatever the capture's size.
/// </summary>
/// <remarks>
/// Division of work: the readers check the file (syntax, widths, with 64-bit timers strictly
/// increasing ticks); this class judges the steps of narrower timers: a step the unwrapper rejects
/// is flagged in <see cref="Warnings"/> with its line and the row is skipped. It also warns once when
/// the timer (or the pulse counter) wraps within fewer than 8 expected intervals, because a dropout
/// as long as one wrap would then be invisible. For edge captures, a gap between rows longer than
/// <see cref="CounterSettings.NoSignalSeconds"/> is reported by polling the counter at the moment
/// the timeout expired (as the device would), before the next edge is fed.
/// A gate still open when the capture ends is not reported.
/// </remarks>
public sealed class CaptureGateSource
{
    /// <summary>Flagged steps listed one by one in <see cref="Warnings"/>; beyond this only a count is added.</summary>
    public const int MaxListedSteps = 10;

    /// <summary>Most no-signal polls replayed for one gap (a gap of hours on a corrupt capture must not stall the replay).</summary>
    public const long MaxPollsPerGap = 100_000;

    /// <summary>Rows read ahead when the source is built, to learn the capture's period before any gate is made.</summary>
    public const int LookaheadRows = 64;

    /// <summary>The no-signal timeout must span at least this many periods of the recorded signal (edges, or counts and reads for snapshots).</summary>
    public const double MinNoSignalPeriods = 3;

    /// <summary>
    /// A measurement that differs from the expected frequency by more than this factor disagrees with it. An
    /// alias reads at least twice the true frequency (true period P = n W + r with n &gt;= 1 and the residue r &lt; W,
    /// so P / r &gt; n + 1 &gt;= 2), far beyond any drift, target shift or component tolerance of the oscillator.
    /// </summary>
    public const double DisagreementFactor = 1.5;

    private readonly ICaptureReader _reader;
    private readonly List<string> _warnings = new();
    private readonly List<string> _unassignedMarks = new();
    private readonly List<CaptureRow> _head = new();
    private readonly IEnumerator<CaptureRow>? _rows;
    private readonly ICaptureBatchReader? _batches;
    private readonly List<CaptureRowBatch> _headBatches = new();
    private System.Runtime.ExceptionServices.ExceptionDispatchInfo? _headError;
    private bool _rowsEnded;
    private double _headIntervalTicks;
    private double _headCountsPerRead;
    private readonly ConsecutiveGateScatter _scatter = new();
    private bool _started;

    /// <summary>Prepares a replay.</summary>
    /// <param name="reader">An opened capture (text or binary); its rows are read by <see cref="ReadGates"/>.</param>
    /// <param name="options">
    /// Gate, estimator, jitter and guard settings. Clock, prescale and signal are taken from the
    /// capture's metadata (the values in <paramref name="options"/> are ignored); <paramref name="options"/> itself is not changed.
    /// </param>
    /// <param name="searchHz">
    /// The search oscillator's nominal frequency, Hz, to check the measurement against (aliasing); null takes the
    /// capture's <c>search_hz</c>, and without either the check is skipped.
    /// </param>
    /// <param name="noSignalSecondsGiven">
    /// True when the user chose <see cref="CounterSettings.NoSignalSeconds"/>: one shorter than
    /// <see cref="MinNoSignalPeriods"/> periods of the capture is refused. False for the default, which is then
    /// lengthened to fit (with a warning).
    /// </param>
    /// <exception cref="ArgumentException">A setting is out of range, for the options or for this capture (the message names it and its allowed range).</exception>
    /// <exception cref="CaptureFormatException">The capture's first rows contradict its metadata: the measured frequency is an alias (line 0: the whole file).</exception>
    public CaptureGateSource(ICaptureReader reader, CounterSettings options, double? searchHz = null, bool noSignalSecondsGiven = true)
    {
        _reader = reader;
        Settings = SettingsFor(reader.Metadata, options);
        if (!Settings.TryValidate(out string error))
        {
            throw new ArgumentException(error); // no parameter name: the message goes to the user as it is
        }

        // The counters refuse these only once they are built, deep in the run and in ticks; say it here in the options' terms.
        double clock = Settings.ClockHz;
        const double maxGateTicks = 1099511627776.0; // 2^40, the counters' longest gate
        if (Settings.Mode == GateMode.Time && Settings.GateSeconds * clock > maxGateTicks)
        {
            throw new ArgumentException(FormattableString.Invariant(
                $"--gate-seconds must be at most {maxGateTicks / clock:G6} s for this capture (2^40 ticks of clock_hz = {clock:R}), got {Settings.GateSeconds:G6}"));
        }

        if (Settings.NoSignalSeconds * clock >= 4e18)
        {
            throw new ArgumentException(FormattableString.Invariant(
                $"--no-signal-seconds must be below {4e18 / clock:G6} s for this capture (4e18 ticks of clock_hz = {clock:R}), got {Settings.NoSignalSeconds:G6}"));
        }

        if (reader is ICaptureBatchReader batches)
        {
            _batches = batches;
            ReadAheadBatches();
        }
        else
        {
            _rows = reader.ReadRows().GetEnumerator();
            ReadAhead();
        }

        CheckNoSignalTimeout(noSignalSecondsGiven);
        CheckAliasing(searchHz ?? reader.Metadata.SearchHz);
    }

    /// <summary>
    /// Median ticks between the first rows (edges: the recorded-edge period; snapshots: the read interval), from
    /// the rows read ahead; 0 when they hold fewer than two good rows.
    /// </summary>
    public double LookaheadIntervalTicks => _headIntervalTicks;

    /// <summary>The counted signal's frequency before the prescaler, Hz, measured over the rows read ahead; 0 when unknown.</summary>
    public double LookaheadFrequencyHz { get; private set; }

    /// <summary>
    /// Reads up to <see cref="LookaheadRows"/> rows and measures the signal over them (medians of the steps, so a
    /// swapped row or a glitch does not move them). A malformed row ends the read-ahead; its error is raised when
    /// the replay reaches it, after the gates before it, as without the read-ahead.
    /// </summary>
    private void ReadAhead()
    {
        var md = Metadata;
        var ticks = new TimerUnwrapper(md.TimerBits);
        var counts = new TimerUnwrapper(md.Kind == CaptureKind.Snapshots ? md.CountBits : 64, true);
        var intervals = new List<double>();
        var steps = new List<double>();
        bool have = false;
        long lastTick = 0;
        long lastCount = 0;
        try
        {
            while (_head.Count < LookaheadRows && _rows!.MoveNext())
            {
                CaptureRow row = _rows.Current;
                _head.Add(row);
                if (!ticks.TryUnwrap(row.Tick, out long tick))
                {
                    continue;
                }

                long count = 0;
                if (md.Kind == CaptureKind.Snapshots && !counts.TryUnwrap(row.Count, out count))
                {
                    continue;
                }

                if (have)
                {
                    intervals.Add(tick - lastTick);
                    steps.Add(count - lastCount);
                }

                have = true;
                lastTick = tick;
                lastCount = count;
            }

            _rowsEnded = _head.Count < LookaheadRows;
        }
        catch (Exception e) when (e is CaptureFormatException or IOException)
        {
            _headError = System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(e);
            _rowsEnded = true;
        }

        MeasureHead(intervals, steps);
    }

    /// <summary>
    /// <see cref="ReadAhead"/> for a batch reader: the same rows (the first <see cref="LookaheadRows"/>), the same
    /// measurement and the same deferred error; the batches read are kept and replayed first.
    /// </summary>
    private void ReadAheadBatches()
    {
        var md = Metadata;
        var ticks = new TimerUnwrapper(md.TimerBits);
        var counts = new TimerUnwrapper(md.Kind == CaptureKind.Snapshots ? md.CountBits : 64, true);
        var intervals = new List<double>();
        var steps = new List<double>();
        bool have = false;
        long lastTick = 0;
        long lastCount = 0;
        int seen = 0;
        try
        {
            while (seen < LookaheadRows)
            {
                var batch = new CaptureRowBatch();
                if (!_batches!.ReadBatch(batch))
                {
                    _rowsEnded = true;
                    break;
                }

                _headBatches.Add(batch);
                for (int i = 0; i < batch.Count && seen < LookaheadRows; i++, seen++)
                {
                    if (!ticks.TryUnwrap(batch.Ticks[i], out long tick))
                    {
                        continue;
                    }

                    long count = 0;
                    if (md.Kind == CaptureKind.Snapshots && !counts.TryUnwrap(batch.Counts[i], out count))
                    {
                        continue;
                    }

                    if (have)
                    {
                        intervals.Add(tick - lastTick);
                        steps.Add(count - lastCount);
                    }

                    have = true;
                    lastTick = tick;
                    lastCount = count;
                }
            }
        }
        catch (Exception e) when (e is CaptureFormatException or IOException)
        {
            _headError = System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(e);
            _rowsEnded = true;
        }

        MeasureHead(intervals, steps);
    }

    private void MeasureHead(List<double> intervals, List<double> steps)
    {
        var md = Metadata;
        if (intervals.Count == 0)
        {
            return;
        }

        _headIntervalTicks = Median(intervals);
        double clock = Settings.ClockHz;
        if (md.Kind == CaptureKind.Snapshots)
        {
            _headCountsPerRead = Median(steps);
            if (_headIntervalTicks > 0 && _headCountsPerRead > 0)
            {
                LookaheadFrequencyHz = Settings.Prescale * clock * _headCountsPerRead / _headIntervalTicks;
            }
        }
        else if (_headIntervalTicks > 0)
        {
            LookaheadFrequencyHz = Settings.Prescale * clock / _headIntervalTicks;
        }
    }

    private static double Median(List<double> values)
    {
        values.Sort();
        int n = values.Count;
        return n % 2 == 1 ? values[n / 2] : 0.5 * (values[(n / 2) - 1] + values[n / 2]);
    }

    /// <summary>
    /// The no-signal timeout against the capture: shorter than <see cref="MinNoSignalPeriods"/> periods of the recorded
    /// edges (snapshots: of a count step and of a read interval), every ordinary gap would read as no signal.
    /// A timeout the user gave is refused; the default is lengthened with a warning.
    /// </summary>
    private void CheckNoSignalTimeout(bool given)
    {
        double clock = Settings.ClockHz;
        double periodS = _headIntervalTicks / clock;
        string what = "recorded edges";
        if (Metadata.Kind == CaptureKind.Snapshots)
        {
            what = "snapshot reads";
            if (_headCountsPerRead > 0 && _headCountsPerRead < 1)
            {
                // Fewer than one count per read: the count stands still for 1 / countsPerRead reads.
                periodS /= _headCountsPerRead;
                what = "pulse-counter counts";
            }
        }

        if (!(periodS > 0))
        {
            return;
        }

        double least = MinNoSignalPeriods * periodS;
        if (Settings.NoSignalSeconds >= least)
        {
            return;
        }

        string period = FormattableString.Invariant($"{_reader.SourceName}: the {what} are about {SecondsText(periodS)} apart");
        if (given)
        {
            throw new ArgumentException(FormattableString.Invariant(
                $"--no-signal-seconds {Settings.NoSignalSeconds:G6} is shorter than {MinNoSignalPeriods:0} periods of this capture ({period}): every ordinary gap would read as no signal; give at least {RoundUp(least):G3} s"));
        }

        if (least > CounterSettings.MaxNoSignalSeconds)
        {
            throw new ArgumentException(FormattableString.Invariant(
                $"the signal of this capture is too slow for the no-signal timeout ({period}; {MinNoSignalPeriods:0} periods exceed the longest timeout, {CounterSettings.MaxNoSignalSeconds:G6} s)"));
        }

        double raised = RoundUp(least);
        _warnings.Add(FormattableString.Invariant(
            $"{period}, so the no-signal timeout is raised from its default {Settings.NoSignalSeconds:G6} s to {raised:G3} s ({MinNoSignalPeriods:0} periods); give --no-signal-seconds to choose it"));
        Settings.NoSignalSeconds = raised;
    }

    /// <summary>A number rounded to 6 significant digits, written without an exponent (80000000, 5530.97, 0.00125).</summary>
    private static string Significant(double value)
    {
        if (value == 0 || !double.IsFinite(value))
        {
            return value.ToString("R", System.Globalization.CultureInfo.InvariantCulture);
        }

        int decimals = 5 - (int)Math.Floor(Math.Log10(Math.Abs(value)));
        double rounded = decimals >= 0 ? Math.Round(value, Math.Min(decimals, 15)) : Math.Round(value / Math.Pow(10, -decimals)) * Math.Pow(10, -decimals);
        return rounded.ToString("0.###############", System.Globalization.CultureInfo.InvariantCulture);
    }

    /// <summary>Rounds up to 2 significant digits (a readable timeout that still covers the value).</summary>
    private static double RoundUp(double value)
    {
        double scale = Math.Pow(10, Math.Floor(Math.Log10(value)) - 1);
        return Math.Ceiling(value / scale * (1 - 1e-12)) * scale;
    }

    private static string SecondsText(double seconds) => seconds switch
    {
        >= 1 => FormattableString.Invariant($"{seconds:G3} s"),
        >= 1e-3 => FormattableString.Invariant($"{seconds * 1e3:G3} ms"),
        _ => FormattableString.Invariant($"{seconds * 1e6:G3} us"),
    };

    /// <summary>
    /// The measurement against the expected frequency. A timer (or pulse counter) that wraps within one period (or
    /// one read) gives a steady, wrong frequency that the data alone cannot reveal; only an expectation can.
    /// Refuses (<see cref="CaptureFormatException"/>, line 0) when the measurement disagrees with the expectation by
    /// more than <see cref="DisagreementFactor"/> and the timer or counter is narrow enough to have aliased a signal
    /// at the expected frequency; warns when they disagree otherwise.
    /// </summary>
    private void CheckAliasing(double? searchHz)
    {
        double measured = LookaheadFrequencyHz;
        if (searchHz is not double expected || !(expected > 0) || !(measured > 0))
        {
            return;
        }

        var md = Metadata;
        double clock = Settings.ClockHz;
        int prescale = Settings.Prescale;
        string src = _reader.SourceName;
        string F(double v) => Significant(v);
        double wrap = md.TimerBits >= 64 ? double.PositiveInfinity : Math.Pow(2, md.TimerBits);
        double wrapHz = prescale * clock / wrap; // any recorded-edge period longer than one wrap reads above this
        bool beat = md.Signal == SignalKind.Beat;
        string remedy = "record with a wider timer (timer_bits), a slower clock or a larger prescale, or correct search_hz if it is wrong";

        if (md.Kind == CaptureKind.Edges)
        {
            if (beat)
            {
                // The beat of two oscillators tuned near each other lies below either of them.
                if (measured > expected && measured > wrapHz)
                {
                    throw new CaptureFormatException(src, 0, FormattableString.Invariant(
                        $"the beat note measures about {F(measured)} Hz, above the search oscillator's {F(expected)} Hz (search_hz), which a beat of two oscillators tuned near each other cannot be: it is likely aliased. The timer_bits = {md.TimerBits} timer wraps every {F(wrap)} ticks ({SecondsText(wrap / clock)} at clock_hz = {F(clock)}), so a beat whose recorded edges are further apart than that (below {F(wrapHz)} Hz with prescale {prescale}) reads as a steady, wrong, higher frequency; {remedy}"));
                }

                if (measured > expected)
                {
                    _warnings.Add(FormattableString.Invariant(
                        $"{src}: the beat note measures about {F(measured)} Hz, above search_hz = {F(expected)} Hz: check clock_hz, prescale and search_hz"));
                }

                return;
            }

            double ratio = measured / expected;
            double expectedPeriod = prescale * clock / expected;
            if (ratio > DisagreementFactor && measured > wrapHz && expectedPeriod * DisagreementFactor > wrap)
            {
                throw new CaptureFormatException(src, 0, FormattableString.Invariant(
                    $"the capture measures about {F(measured)} Hz, {ratio:0.0} times search_hz = {F(expected)} Hz: the signal is likely aliased. At search_hz the recorded edges lie {F(expectedPeriod)} ticks apart (clock_hz = {F(clock)}, prescale {prescale}), {(expectedPeriod >= wrap ? "more than" : "close to")} the wrap of the timer_bits = {md.TimerBits} timer, {F(wrap)} ticks, so the timer cannot tell one period from the next and shows a steady, wrong frequency; {remedy}"));
            }

            if (ratio > DisagreementFactor || ratio < 1 / DisagreementFactor)
            {
                _warnings.Add(FormattableString.Invariant(
                    $"{src}: the capture measures about {F(measured)} Hz, but search_hz = {F(expected)} Hz ({ratio:0.###} times): check clock_hz, prescale and search_hz"));
            }

            return;
        }

        if (beat)
        {
            return;
        }

        // Snapshots: a pulse counter that wraps between two reads loses whole wraps, so the frequency reads low.
        double snapshotRatio = measured / expected;
        double countWrap = md.CountBits >= 64 ? double.PositiveInfinity : Math.Pow(2, md.CountBits);
        double expectedCounts = expected / prescale * _headIntervalTicks / clock;
        if (snapshotRatio < 1 / DisagreementFactor && expectedCounts * DisagreementFactor > countWrap)
        {
            throw new CaptureFormatException(src, 0, FormattableString.Invariant(
                $"the capture measures about {F(measured)} Hz, {1 / snapshotRatio:0.0} times below search_hz = {F(expected)} Hz: the pulse counter likely wrapped between reads. At search_hz it counts about {F(expectedCounts)} per read (reads {SecondsText(_headIntervalTicks / clock)} apart), {(expectedCounts >= countWrap ? "more than" : "close to")} the wrap of the count_bits = {md.CountBits} counter, {F(countWrap)} counts, so whole wraps go unseen and the frequency reads low; read the counter more often, use a wider counter, or correct search_hz if it is wrong"));
        }

        if (snapshotRatio > DisagreementFactor || snapshotRatio < 1 / DisagreementFactor)
        {
            _warnings.Add(FormattableString.Invariant(
                $"{src}: the capture measures about {F(measured)} Hz, but search_hz = {F(expected)} Hz ({snapshotRatio:0.###} times): check clock_hz, prescale and search_hz"));
        }
    }

    /// <summary>The rows read ahead, then the rest of the capture; a read-ahead error is raised where it occurred.</summary>
    private IEnumerable<CaptureRow> Rows()
    {
        foreach (CaptureRow row in _head)
        {
            yield return row;
        }

        _head.Clear();
        _headError?.Throw();
        if (_rowsEnded)
        {
            yield break;
        }

        while (_rows!.MoveNext())
        {
            yield return _rows.Current;
        }
    }

    /// <summary>The batches read ahead, then the rest of the capture in one reused batch; a read-ahead error is raised where it occurred.</summary>
    private IEnumerable<CaptureRowBatch> Batches()
    {
        foreach (CaptureRowBatch batch in _headBatches)
        {
            yield return batch;
        }

        CaptureRowBatch? reused = _headBatches.Count > 0 ? _headBatches[^1] : null;
        _headBatches.Clear();
        _headError?.Throw();
        if (_rowsEnded)
        {
            yield break;
        }

        reused ??= new CaptureRowBatch();
        if (_reader is TextCaptureReader or BinaryCaptureReader && BatchReadAhead.Pays)
        {
            // Parse (text) or decode (binary) the next batches on a second thread while this one counts.
            using var ahead = new BatchReadAhead(_batches!, reused);
            CaptureRowBatch? next;
            while ((next = ahead.Next()) != null)
            {
                yield return next;
            }

            yield break;
        }

        while (_batches!.ReadBatch(reused))
        {
            yield return reused;
        }
    }

    /// <summary>The rows of <see cref="Batches"/> one by one (the snapshot path reads them so).</summary>
    private IEnumerable<CaptureRow> RowsOfBatches()
    {
        foreach (CaptureRowBatch batch in Batches())
        {
            for (int i = 0; i < batch.Count; i++)
            {
                yield return batch.RowAt(i);
            }
        }
    }

    /// <summary>The settings the counter runs with (options plus the capture's clock, prescale and signal).</summary>
    public CounterSettings Settings { get; }

    /// <summary>The capture's metadata.</summary>
    public CaptureMetadata Metadata => _reader.Metadata;

    /// <summary>The capture reader (its trailer is complete once <see cref="ReadGates"/> has run to the end).</summary>
    public ICaptureReader Reader => _reader;

    /// <summary>The reader's warnings followed by this replay's own (fast wrap, flagged steps); complete after <see cref="ReadGates"/> has run.</summary>
    public IReadOnlyList<string> Warnings
    {
        get
        {
            var all = new List<string>(_reader.Warnings);
            all.AddRange(_warnings);
            return all;
        }
    }

    /// <summary>Rows read from the capture so far.</summary>
    public long RowsRead { get; private set; }

    /// <summary>Rows fed to the counter (rows read minus flagged rows).</summary>
    public long RowsFed { get; private set; }

    /// <summary>Rows whose tick (or count) step the unwrapper rejected; they were skipped.</summary>
    public long FlaggedSteps { get; private set; }

    /// <summary>Of <see cref="FlaggedSteps"/>, the rows rejected because their tick (or count) stepped back a little.</summary>
    public long BackwardSteps { get; private set; }

    /// <summary>Marks of rows after the last reported gate (the capture ended inside an open gate).</summary>
    public IReadOnlyList<string> UnassignedMarks => _unassignedMarks;

    /// <summary>Builds the counter settings for a capture: a copy of <paramref name="options"/> with the metadata's clock, prescale and signal.</summary>
    public static CounterSettings SettingsFor(CaptureMetadata metadata, CounterSettings options)
    {
        return new CounterSettings
        {
            ClockHz = metadata.ClockHz,
            Prescale = metadata.Prescale,
            Signal = metadata.Signal,
            Mode = options.Mode,
            GateSeconds = options.GateSeconds,
            GateEdges = options.GateEdges,
            Estimator = metadata.Kind == CaptureKind.Snapshots ? EstimatorKind.SnapshotRegression : options.Estimator,
            JitterTicks = options.JitterTicks,
            GlitchFraction = options.GlitchFraction,
            DropoutPeriods = options.DropoutPeriods,
            NoSignalSeconds = options.NoSignalSeconds,
            InferMissedEdges = options.InferMissedEdges,
            InferMinBeatHz = options.InferMinBeatHz,
            MainsHz = options.MainsHz,
        };
    }

    /// <summary>Streams the capture once and yields every closed gate in order.</summary>
    /// <exception cref="CaptureFormatException">The capture is malformed (thrown while enumerating, at the bad row).</exception>
    public IEnumerable<CaptureGate> ReadGates()
    {
        if (_started)
        {
            throw new InvalidOperationException("ReadGates replays the capture once; open it again to replay it again");
        }

        _started = true;
        if (Metadata.Kind == CaptureKind.Snapshots)
        {
            return SnapshotGates(_batches != null ? RowsOfBatches() : Rows());
        }

        return _batches != null ? EdgeGatesOfBatches() : EdgeGates();
    }

    private IEnumerable<CaptureGate> EdgeGates()
    {
        var md = Metadata;
        var unwrapper = new TimerUnwrapper(md.TimerBits) { ExpectedIntervalTicks = _headIntervalTicks };
        var counter = new EdgeCounter(Settings);
        var scratch = new GateResult();
        long lastFedLine = 0;
        long timeoutTicks = Math.Max(1, (long)Math.Ceiling(Settings.NoSignalSeconds * Settings.ClockHz));
        var pending = new Pending(_scatter);
        bool haveLast = false;
        long lastTick = 0;
        bool wrapChecked = md.TimerBits >= 64;
        foreach (var row in Rows())
        {
            RowsRead++;
            if (!unwrapper.TryUnwrap(row.Tick, out long tick))
            {
                Flag(row, "tick", md.TimerBits, "timer_bits", unwrapper, lastFedLine, "recorded-edge periods");
                pending.Add(row);
                continue;
            }

            RowsFed++;
            lastFedLine = row.LineNumber;
            if (haveLast && tick - lastTick > timeoutTicks)
            {
                // The device polls while it waits: one no-signal result per NoSignalSeconds of silence.
                long polls = 0;
                for (long at = lastTick + timeoutTicks; at < tick && polls < MaxPollsPerGap; at += timeoutTicks, polls++)
                {
                    if (counter.Poll(at, scratch))
                    {
                        yield return pending.Take(scratch, row.LineNumber);
                    }
                }
            }

            pending.Add(row);
            haveLast = true;
            lastTick = tick;
            bool closed = counter.AddEdge(tick, scratch);
            if (counter.HasRunningPeriod)
            {
                unwrapper.ExpectedIntervalTicks = counter.RunningPeriodTicks;
            }
            if (!wrapChecked && counter.HasRunningPeriod && counter.GatesTotal > 0)
            {
                wrapChecked = true;
                if (unwrapper.TryGetWrapWarning(counter.RunningPeriodTicks, out string warning))
                {
                    _warnings.Add($"{_reader.SourceName}: {warning}");
                }
            }

            if (closed)
            {
                yield return pending.Take(scratch, row.LineNumber);
            }
        }

        _unassignedMarks.AddRange(pending.Marks);
        AddFlagSummary();
    }

    /// <summary>
    /// <see cref="EdgeGates"/> over batches: the same steps in the same order for every row (unwrap, flag, no-signal
    /// polls, the counter, the running period, the wrap warning), without an iterator or a row object per edge. The
    /// gates a batch closes are yielded after it; a reader error comes after the gates of the rows before it.
    /// </summary>
    private IEnumerable<CaptureGate> EdgeGatesOfBatches()
    {
        var state = new EdgeFeed(this);
        var closed = new List<CaptureGate>();
        foreach (CaptureRowBatch batch in Batches())
        {
            FeedEdges(state, batch, closed);
            foreach (CaptureGate gate in closed)
            {
                yield return gate;
            }

            closed.Clear();
        }

        _unassignedMarks.AddRange(state.Pending.Marks);
        AddFlagSummary();
    }

    private void FeedEdges(EdgeFeed state, CaptureRowBatch batch, List<CaptureGate> closedGates)
    {
        var md = Metadata;
        TimerUnwrapper unwrapper = state.Unwrapper;
        EdgeCounter counter = state.Counter;
        GateResult scratch = state.Scratch;
        Pending pending = state.Pending;
        long timeoutTicks = state.TimeoutTicks;
        bool haveLast = state.HaveLast;
        long lastTick = state.LastTick;
        bool wrapChecked = state.WrapChecked;
        bool extras = batch.HasExtras;
        ulong[] ticks = batch.Ticks;
        long[] lines = batch.LineNumbers;
        int n = batch.Count;
        long fed = 0;
        long[] run = state.RunTicks(n);
        for (int i = 0; i < n; i++)
        {
            if (wrapChecked && !extras)
            {
                // The common case in runs: plain timer steps (no gap past the no-signal time, so no polls) unwrapped
                // into ticks, then counted a run of plain edges at a time; a row that is not plain in either goes
                // through the steps below, and the running period reaches the unwrapper after every call, as there.
                int m = unwrapper.UnwrapRun(ticks, i, n - i, (ulong)timeoutTicks, run, 0);
                int j = 0;
                while (j < m)
                {
                    j += counter.AddEdges(run, j, m - j, scratch, out bool gateClosed);
                    if (counter.HasRunningPeriod)
                    {
                        unwrapper.ExpectedIntervalTicks = counter.RunningPeriodTicks;
                    }

                    if (gateClosed)
                    {
                        closedGates.Add(pending.Take(scratch, lines[i + j - 1]));
                    }
                }

                if (m > 0)
                {
                    fed += m;
                    state.LastFedLine = lines[i + m - 1];
                    haveLast = true;
                    lastTick = run[m - 1];
                    i += m;
                    if (i >= n)
                    {
                        break;
                    }
                }
            }

            if (!unwrapper.TryUnwrap(ticks[i], out long tick))
            {
                CaptureRow row = batch.RowAt(i);
                Flag(row, "tick", md.TimerBits, "timer_bits", unwrapper, state.LastFedLine, "recorded-edge periods");
                if (extras)
                {
                    pending.Add(row);
                }

                continue;
            }

            fed++;
            long line = lines[i];
            state.LastFedLine = line;
            if (haveLast && tick - lastTick > timeoutTicks)
            {
                long polls = 0;
                for (long at = lastTick + timeoutTicks; at < tick && polls < MaxPollsPerGap; at += timeoutTicks, polls++)
                {
                    if (counter.Poll(at, scratch))
                    {
                        closedGates.Add(pending.Take(scratch, line));
                    }
                }
            }

            if (extras)
            {
                pending.Add(batch.TemperaturesC[i], batch.Marks[i]);
            }

            haveLast = true;
            lastTick = tick;
            bool closed = counter.AddEdge(tick, scratch);
            if (counter.HasRunningPeriod)
            {
                unwrapper.ExpectedIntervalTicks = counter.RunningPeriodTicks;
            }

            if (!wrapChecked && counter.HasRunningPeriod && counter.GatesTotal > 0)
            {
                wrapChecked = true;
                if (unwrapper.TryGetWrapWarning(counter.RunningPeriodTicks, out string warning))
                {
                    _warnings.Add($"{_reader.SourceName}: {warning}");
                }
            }

            if (closed)
            {
                closedGates.Add(pending.Take(scratch, line));
            }
        }

        RowsRead += n;
        RowsFed += fed;
        state.HaveLast = haveLast;
        state.LastTick = lastTick;
        state.WrapChecked = wrapChecked;
    }

    /// <summary>The state of <see cref="EdgeGatesOfBatches"/> between batches.</summary>
    private sealed class EdgeFeed
    {
        public EdgeFeed(CaptureGateSource source)
        {
            var md = source.Metadata;
            Unwrapper = new TimerUnwrapper(md.TimerBits) { ExpectedIntervalTicks = source._headIntervalTicks };
            Counter = new EdgeCounter(source.Settings);
            TimeoutTicks = Math.Max(1, (long)Math.Ceiling(source.Settings.NoSignalSeconds * source.Settings.ClockHz));
            Pending = new Pending(source._scatter);
            WrapChecked = md.TimerBits >= 64;
        }

        public TimerUnwrapper Unwrapper { get; }

        public EdgeCounter Counter { get; }

        public GateResult Scratch { get; } = new();

        public Pending Pending { get; }

        public long TimeoutTicks { get; }

        public long LastFedLine { get; set; }

        public bool HaveLast { get; set; }

        public long LastTick { get; set; }

        public bool WrapChecked { get; set; }

        /// <summary>A reused buffer of at least <paramref name="rows"/> unwrapped ticks.</summary>
        public long[] RunTicks(int rows)
        {
            if (_runTicks.Length < rows)
            {
                _runTicks = new long[rows];
            }

            return _runTicks;
        }

        private long[] _runTicks = [];
    }

    private IEnumerable<CaptureGate> SnapshotGates(IEnumerable<CaptureRow> rows)
    {
        var md = Metadata;
        var ticks = new TimerUnwrapper(md.TimerBits) { ExpectedIntervalTicks = _headIntervalTicks };
        var counts = new TimerUnwrapper(md.CountBits, true) { ExpectedIntervalTicks = _headCountsPerRead };
        var counter = new SnapshotCounter(Settings);
        var scratch = new GateResult();
        long lastFedLine = 0;
        var pending = new Pending(_scatter);
        bool wrapChecked = md.TimerBits >= 64 && md.CountBits >= 64;
        foreach (var row in rows)
        {
            RowsRead++;
            if (!ticks.TryUnwrap(row.Tick, out long tick))
            {
                Flag(row, "tick", md.TimerBits, "timer_bits", ticks, lastFedLine, "read intervals");
                pending.Add(row);
                continue;
            }

            if (!counts.TryUnwrap(row.Count, out long count))
            {
                Flag(row, "count", md.CountBits, "count_bits", counts, lastFedLine, "counts per read");
                pending.Add(row);
                continue;
            }

            RowsFed++;
            lastFedLine = row.LineNumber;
            pending.Add(row);
            bool closed = counter.AddSnapshot(tick, count, scratch);
            if (counter.RunningIntervalTicks > 0)
            {
                ticks.ExpectedIntervalTicks = counter.RunningIntervalTicks;
                if (counter.RunningCountPeriodTicks > 0)
                {
                    counts.ExpectedIntervalTicks = counter.RunningIntervalTicks / counter.RunningCountPeriodTicks;
                }
            }

            if (closed)
            {
                GateResult gate = scratch;
                if (!wrapChecked && gate.HasFrequency && gate.Edges > 1 && gate.EndTick > gate.StartTick)
                {
                    wrapChecked = true;
                    double ticksPerRead = (double)(gate.EndTick - gate.StartTick) / (gate.Edges - 1);
                    if (ticks.TryGetWrapWarning(ticksPerRead, out string tickWarning))
                    {
                        _warnings.Add($"{_reader.SourceName}: {tickWarning}");
                    }

                    double countsPerRead = gate.FrequencyHz / Settings.Prescale * ticksPerRead / Settings.ClockHz;
                    if (counts.WrapsTooFast(countsPerRead))
                    {
                        _warnings.Add(string.Format(
                            System.Globalization.CultureInfo.InvariantCulture,
                            "{0}: count_bits = {1}: the pulse counter wraps every {2:0} counts, only {3:0.0} snapshot intervals of about {4:0} counts (fewer than {5}): a dropout longer than one wrap would go unseen",
                            _reader.SourceName, md.CountBits, counts.WrapTicks, counts.WrapTicks / countsPerRead, countsPerRead, TimerUnwrapper.MinIntervalsPerWrap));
                    }
                }

                yield return pending.Take(gate, row.LineNumber);
            }
        }

        _unassignedMarks.AddRange(pending.Marks);
        AddFlagSummary();
    }

    private void Flag(in CaptureRow row, string column, int bits, string key, TimerUnwrapper unwrapper, long lastFedLine, string intervals)
    {
        FlaggedSteps++;
        if (unwrapper.LastBackwardTicks > 0)
        {
            BackwardSteps++;
        }

        if (FlaggedSteps > MaxListedSteps)
        {
            return;
        }

        ulong value = column == "tick" ? row.Tick : row.Count;
        if (unwrapper.LastBackwardTicks > 0)
        {
            double expected = unwrapper.ExpectedIntervalTicks;
            string about = expected > 0
                ? string.Format(System.Globalization.CultureInfo.InvariantCulture, " (about {0:0.#} {1})", unwrapper.LastBackwardTicks / expected, intervals)
                : string.Empty;
            string unit = column == "tick" ? "ticks" : "counts";
            _warnings.Add($"{_reader.SourceName}:{row.LineNumber}: the {column} {value} steps back by {unwrapper.LastBackwardTicks} {unit}{about} from the {column} of line {lastFedLine}: rows out of order, or a {(column == "tick" ? "timer" : "counter")} that was reset? Taken as a wrap it would be a gap of almost 2^{bits} {unit}; the row is skipped");
            return;
        }

        _warnings.Add($"{_reader.SourceName}:{row.LineNumber}: the {column} step to {value} cannot be right for {key} = {bits} (the unwrapper rejected it); the row is skipped");
    }

    private void AddFlagSummary()
    {
        if (FlaggedSteps > MaxListedSteps)
        {
            _warnings.Add($"{_reader.SourceName}: {FlaggedSteps} rows in all had implausible steps and were skipped (the first {MaxListedSteps} are listed)");
        }
    }

    /// <summary>Temperatures and marks of the rows since the last reported gate.</summary>
    private sealed class Pending
    {
        private readonly ConsecutiveGateScatter _scatter;
        private double _sum;
        private int _n;
        private double? _latest;

        public Pending(ConsecutiveGateScatter scatter)
        {
            _scatter = scatter;
        }

        public List<string> Marks { get; private set; } = new();

        public void Add(double temperatureC, string? mark)
        {
            if (!double.IsNaN(temperatureC))
            {
                _sum += temperatureC;
                _n++;
                _latest = temperatureC;
            }

            if (mark != null)
            {
                Marks.Add(mark);
            }
        }

        public void Add(in CaptureRow row)
        {
            if (row.TemperatureC is double t)
            {
                _sum += t;
                _n++;
                _latest = t;
            }

            if (row.Mark != null)
            {
                Marks.Add(row.Mark);
            }
        }

        public CaptureGate Take(GateResult filled, long line)
        {
            // The counter refills its scratch result at the next gate: each reported gate gets its own copy.
            var gate = new GateResult();
            gate.CopyFrom(filled);
            double? mean = _n > 0 ? _sum / _n : null;
            double? scatter = _scatter.Add(gate);
            var result = new CaptureGate(gate, mean, _latest, Marks.Count > 0 ? Marks : null, line, scatter);
            _sum = 0;
            _n = 0;
            if (Marks.Count > 0)
            {
                Marks = new List<string>();
            }

            return result;
        }
    }
}
