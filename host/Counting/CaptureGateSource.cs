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

    private readonly ICaptureReader _reader;
    private readonly List<string> _warnings = new();
    private readonly List<string> _unassignedMarks = new();
    private readonly ConsecutiveGateScatter _scatter = new();
    private bool _started;

    /// <summary>Prepares a replay.</summary>
    /// <param name="reader">An opened capture (text or binary); its rows are read by <see cref="ReadGates"/>.</param>
    /// <param name="options">
    /// Gate, estimator, jitter and guard settings. Clock, prescale and signal are taken from the
    /// capture's metadata (the values in <paramref name="options"/> are ignored); <paramref name="options"/> itself is not changed.
    /// </param>
    /// <exception cref="ArgumentException">A setting is out of range (the message names it and its allowed range).</exception>
    public CaptureGateSource(ICaptureReader reader, CounterSettings options)
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
        return Metadata.Kind == CaptureKind.Snapshots ? SnapshotGates() : EdgeGates();
    }

    private IEnumerable<CaptureGate> EdgeGates()
    {
        var md = Metadata;
        var unwrapper = new TimerUnwrapper(md.TimerBits);
        var counter = new EdgeCounter(Settings);
        var scratch = new GateResult();
        long timeoutTicks = Math.Max(1, (long)Math.Ceiling(Settings.NoSignalSeconds * Settings.ClockHz));
        var pending = new Pending(_scatter);
        bool haveLast = false;
        long lastTick = 0;
        bool wrapChecked = md.TimerBits >= 64;
        foreach (var row in _reader.ReadRows())
        {
            RowsRead++;
            if (!unwrapper.TryUnwrap(row.Tick, out long tick))
            {
                Flag(row, "tick", md.TimerBits, "timer_bits");
                pending.Add(row);
                continue;
            }

            RowsFed++;
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

    private IEnumerable<CaptureGate> SnapshotGates()
    {
        var md = Metadata;
        var ticks = new TimerUnwrapper(md.TimerBits);
        var counts = new TimerUnwrapper(md.CountBits, true);
        var counter = new SnapshotCounter(Settings);
        var scratch = new GateResult();
        var pending = new Pending(_scatter);
        bool wrapChecked = md.TimerBits >= 64 && md.CountBits >= 64;
        foreach (var row in _reader.ReadRows())
        {
            RowsRead++;
            if (!ticks.TryUnwrap(row.Tick, out long tick))
            {
                Flag(row, "tick", md.TimerBits, "timer_bits");
                pending.Add(row);
                continue;
            }

            if (!counts.TryUnwrap(row.Count, out long count))
            {
                Flag(row, "count", md.CountBits, "count_bits");
                pending.Add(row);
                continue;
            }

            RowsFed++;
            pending.Add(row);
            if (counter.AddSnapshot(tick, count, scratch))
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

    private void Flag(in CaptureRow row, string column, int bits, string key)
    {
        FlaggedSteps++;
        if (FlaggedSteps <= MaxListedSteps)
        {
            _warnings.Add($"{_reader.SourceName}:{row.LineNumber}: the {column} step to {(column == "tick" ? row.Tick : row.Count)} cannot be right for {key} = {bits} (the unwrapper rejected it); the row is skipped");
        }
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
