using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Host.Calibration;
using FreqReadout.Host.Counting;
using FreqReadout.Numerics;
using FreqReadout.Readout;
using FreqReadout.Tracking;
using MathNet.Numerics.Statistics;

namespace FreqReadout.Host.Replay;

/// <summary>
/// Streams capture gates through the same <see cref="ReadoutPipeline"/> the device runs and gathers
/// the replay summary. Per gate: a new temperature sample (mean of the gate's temp_c samples) is
/// given to the pipeline first, then the gate is processed, then the gate's marks take effect
/// (<c>rebaseline</c> requests a re-baseline, <c>hold</c> / <c>release</c> switch hold mode) — from the
/// next gate on, as a button pressed during a gate would on the device. Other marks are carried.
/// </summary>
public sealed class ReplaySession
{
    /// <summary>Settling periods listed one by one in the warning; beyond this only a count.</summary>
    public const int MaxListedSettling = 10;

    private readonly ReadoutPipeline _pipeline;
    private readonly Reading _reading = new();
    private readonly RebaselineNotice _notice = new();
    private readonly ReadoutSettings _settings;
    private readonly DateTimeOffset? _startedUtc;
    private readonly List<double> _residuals = new();
    private readonly List<double> _baselineTimes = new();
    private readonly List<double> _baselines = new();
    private readonly List<ReplayRebaseline> _rebaselines = new();
    private readonly List<ReplayEvent> _events = new();
    private readonly List<string> _warnings = new();
    private readonly List<(double Start, double End)> _settling = new();
    private readonly List<TempcoPoint> _tempcoPoints = new();
    private readonly List<(double Start, double End)> _noSignal = new();
    private double _settlingStart = double.NaN;
    private double _noSignalStart = double.NaN;
    private long _noSignalGates;
    private bool _rebaselineMarkPending;
    private long _gates;
    private long _belowFloor;
    private long _otherMarks;
    private double _lastTime;
    private bool _havePoint;
    private double _pointTemperature;
    private double _pointTime;
    private double _pointSum;
    private int _pointCount;
    private bool _finished;
    private int _nextHoldSwitch;

    /// <summary>Starts a replay.</summary>
    /// <exception cref="ArgumentException">The settings are invalid (message names the setting and its range).</exception>
    public ReplaySession(ReadoutSettings settings, DateTimeOffset? startedUtc)
    {
        _settings = settings.Clone();
        _pipeline = new ReadoutPipeline(settings);
        _startedUtc = startedUtc;
    }

    /// <summary>Gates processed so far.</summary>
    public long Gates => _gates;

    /// <summary>
    /// Stretches to replay in hold mode as if the capture had <c>hold</c> / <c>release</c> marks (<c>replay --hold-span</c>):
    /// sorted, not overlapping (<see cref="HoldSpan.TryParseAll"/>). Set before the first gate. Empty by default.
    /// </summary>
    public IReadOnlyList<HoldSpan> HoldSpans { get; set; } = Array.Empty<HoldSpan>();

    /// <summary>Called with every reading and the gate it came from (for the readings CSV).</summary>
    public Action<Reading, CaptureGate>? ReadingSink { get; set; }

    /// <summary>Temperature points of target-free readings (for <c>calibrate</c>); complete after <see cref="Finish"/>.</summary>
    public IReadOnlyList<TempcoPoint> TempcoPoints => _tempcoPoints;

    /// <summary>Feeds one gate.</summary>
    public void Process(CaptureGate item)
    {
        if (item.TemperatureC is double t)
        {
            _pipeline.SetTemperature(t);
            ClosePoint();
            _havePoint = true;
            _pointTemperature = t;
            _pointTime = item.Gate.EndSeconds;
        }

        _gates++;
        _rebaselineMarkPending = false;
        Reading reading = _reading;
        _pipeline.Process(item.Gate, reading);
        Observe(reading);
        _lastTime = reading.TimeSeconds;
        ReadingSink?.Invoke(reading, item);
        Drain();

        foreach (string mark in item.Marks)
        {
            switch (mark.Trim().ToLowerInvariant())
            {
                case "rebaseline":
                    _pipeline.RequestRebaseline();
                    _rebaselineMarkPending = true;
                    break;
                case "hold":
                    _pipeline.SetHold(true);
                    break;
                case "release":
                    _pipeline.SetHold(false);
                    break;
                default:
                    _otherMarks++;
                    break;
            }
        }

        // --hold-span: the same switches as marks on the first rows at or after FROM and TO (this gate holds those rows
        // when it is the first to end at or after the time), acting from the next gate.
        double end = item.Gate.EndSeconds;
        while (_nextHoldSwitch < 2 * HoldSpans.Count)
        {
            HoldSpan span = HoldSpans[_nextHoldSwitch / 2];
            bool on = _nextHoldSwitch % 2 == 0;
            if (end < (on ? span.FromSeconds : span.ToSeconds))
            {
                break;
            }

            _pipeline.SetHold(on);
            _nextHoldSwitch++;
        }
    }

    /// <summary>
    /// Feeds every gate of <paramref name="source"/> through <see cref="Process"/>, then <see cref="Finish"/>es:
    /// the one replay loop that <c>replay</c>, <c>calibrate</c> and <c>demo</c> share.
    /// </summary>
    /// <exception cref="Captures.CaptureFormatException">The capture is malformed (file:line message).</exception>
    public ReplayReport Run(CaptureGateSource source, CancellationToken cancellationToken)
    {
        foreach (CaptureGate gate in source.ReadGates())
        {
            cancellationToken.ThrowIfCancellationRequested();
            Process(gate);
        }

        if (_gates == 0)
        {
            _warnings.Add(source.RowsRead == 0
                ? "no gate closed: the capture holds no data rows"
                : "no gate closed: the capture is shorter than one gate (try a shorter --gate-seconds or --gate-edges)");
        }

        if (source.UnassignedMarks.Count > 0)
        {
            string marks = string.Join(", ", source.UnassignedMarks.Take(MaxListedSettling).Select(m => FreqReadout.Host.Captures.TextExcerpt.Quote(m)));
            if (source.UnassignedMarks.Count > MaxListedSettling)
            {
                marks += $" and {source.UnassignedMarks.Count - MaxListedSettling} more";
            }

            _warnings.Add($"{source.UnassignedMarks.Count} marks after the last closed gate had no effect (the capture ended inside an open gate): {marks}");
        }

        return Finish(source.RowsRead, source.Metadata.Signal, source.Warnings);
    }

    /// <summary>Ends the replay: closes an open event at the last gate and builds the report.</summary>
    public ReplayReport Finish(long edges, SignalKind signal, IEnumerable<string> sourceWarnings)
    {
        if (_finished)
        {
            throw new InvalidOperationException("Finish was already called");
        }

        _finished = true;
        ClosePoint();
        var open = new DetectionEvent();
        bool closed = _pipeline.TryCloseOpenEvent(open);
        Drain();
        if (closed)
        {
            AddEvent(open);
            _warnings.Add($"an event still open at the end (from {F(open.StartSeconds)} s) was closed at the last gate ({F(open.EndSeconds)} s)");
        }

        if (_rebaselineMarkPending)
        {
            _warnings.Add($"the rebaseline mark in the last gate ({F(_lastTime)} s) had no effect: marks act from the next gate, and none followed");
        }

        if (_pipeline.TryGetPendingRebaseline(out RebaselineReason pendingReason, out double pendingSeconds))
        {
            var pending = new ReplayRebaseline(pendingSeconds, null, pendingReason, null, null);
            _rebaselines.Add(pending);
            _warnings.Add($"the {pending.ReasonName} re-baseline begun at {F(pendingSeconds)} s had not completed when the capture ended (it needs settling_s + baseline_s = {F(_settings.SettlingSeconds + _settings.BaselineSeconds)} s): no new baseline and no absorbed shift for it");
        }

        if (!double.IsNaN(_settlingStart))
        {
            _settling.Add((_settlingStart, _lastTime));
        }

        if (!double.IsNaN(_noSignalStart))
        {
            _noSignal.Add((_noSignalStart, _lastTime));
        }

        if (_noSignal.Count > 0)
        {
            string periods = string.Join(", ", _noSignal.Take(MaxListedSettling).Select(p => $"{F(p.Start)}-{F(p.End)} s"));
            if (_noSignal.Count > MaxListedSettling)
            {
                periods += $" and {_noSignal.Count - MaxListedSettling} more";
            }

            _warnings.Add($"no signal in {_noSignalGates} gates ({periods}): nothing is detected there, and the return of the signal is re-baselined (signal_restored)");
        }

        if (_settling.Count > 0)
        {
            string periods = string.Join(", ", _settling.Take(MaxListedSettling).Select(p => $"{F(p.Start)}-{F(p.End)} s"));
            if (_settling.Count > MaxListedSettling)
            {
                periods += $" and {_settling.Count - MaxListedSettling} more";
            }

            _warnings.Add($"events during settling are not reported (settling and baseline capture: {periods})");
        }

        if (_belowFloor > 0)
        {
            _warnings.Add($"{_belowFloor} readings had the beat note below beat_floor_hz = {F(_settings.BeatFloorHz)} Hz: their sign is unclear (the side can flip and the oscillators pull together near zero beat)");
        }

        for (int i = (_nextHoldSwitch + 1) / 2; i < HoldSpans.Count; i++)
        {
            _warnings.Add($"--hold-span {HoldSpans[i]} had no effect: it begins after the last gate that could act on it ({F(_lastTime)} s)");
        }

        if (_otherMarks > 0)
        {
            _warnings.Add($"{_otherMarks} marks other than rebaseline, hold and release were carried without effect");
        }

        double? baseline = _pipeline.HasFirstBaseline ? _pipeline.FirstBaselineHz : null;
        if (baseline == null)
        {
            _warnings.Add($"no baseline was captured: the signal never lasted settling_s + baseline_s = {F(_settings.SettlingSeconds + _settings.BaselineSeconds)} s");
        }

        double? noise = null;
        if (_residuals.Count > 0)
        {
            double[] r = _residuals.ToArray();
            double median = ArrayStatistics.MedianInplace(r);
            double[] dev = _residuals.Select(v => Math.Abs(v - median)).ToArray();
            noise = RobustStatistics.MadToSigma * ArrayStatistics.MedianInplace(dev);
        }

        double? ppmRef = signal == SignalKind.Search ? baseline : (_settings.SearchHz > 0 ? _settings.SearchHz : null);
        double? noisePpm = noise is double nz && ppmRef is double pr && pr > 0 ? nz / pr * 1e6 : null;

        double? drift = null;
        if (_baselines.Count >= 3 && LinearRegression.TryFit(_baselineTimes, _baselines, out LineFit fit, out _))
        {
            drift = fit.Slope * 60.0;
        }

        var warnings = new List<string>(sourceWarnings);
        warnings.AddRange(_warnings);
        return new ReplayReport(edges, _lastTime, signal, baseline, noise, noisePpm, drift, _gates, _rebaselines, _events, warnings);
    }

    private void Observe(Reading reading)
    {
        // A period without signal runs from the last gate with signal (or the start) to the first edge back.
        if (reading.State == ReadoutState.NoSignal)
        {
            _noSignalGates++;
            if (double.IsNaN(_noSignalStart))
            {
                _noSignalStart = _gates > 1 ? _lastTime : 0.0;
            }
        }
        else if (!double.IsNaN(_noSignalStart))
        {
            _noSignal.Add((_noSignalStart, reading.TimeSeconds - reading.SpanSeconds));
            _noSignalStart = double.NaN;
        }

        if (reading.State == ReadoutState.Settling)
        {
            if (double.IsNaN(_settlingStart))
            {
                _settlingStart = reading.TimeSeconds - reading.SpanSeconds;
            }
        }
        else if (!double.IsNaN(_settlingStart))
        {
            _settling.Add((_settlingStart, reading.TimeSeconds - reading.SpanSeconds));
            _settlingStart = double.NaN;
        }

        if (reading.BelowBeatFloor)
        {
            _belowFloor++;
        }

        if (reading.HasShift)
        {
            _baselineTimes.Add(reading.TimeSeconds);
            _baselines.Add(reading.BaselineHz);
        }

        if (reading.IsTargetFree)
        {
            _residuals.Add(reading.ShiftHz);
            if (_havePoint)
            {
                _pointSum += reading.FrequencyHz;
                _pointCount++;
            }
        }
    }

    private void ClosePoint()
    {
        if (_havePoint && _pointCount > 0)
        {
            _tempcoPoints.Add(new TempcoPoint(_pointTemperature, _pointSum / _pointCount, _pointTime, _pointCount));
        }

        _havePoint = false;
        _pointSum = 0;
        _pointCount = 0;
    }

    private void Drain()
    {
        while (true)
        {
            var e = new DetectionEvent(); // kept by the report
            if (!_pipeline.TryTakeEvent(e))
            {
                break;
            }

            AddEvent(e);
        }

        RebaselineNotice n = _notice;
        while (_pipeline.TryTakeRebaseline(n))
        {
            if (n.Reason != RebaselineReason.Initial)
            {
                _rebaselines.Add(new ReplayRebaseline(n.RequestedSeconds, n.CompletedSeconds, n.Reason, n.ShiftHz, n.HasPpm ? n.ShiftPpm : null));
            }

            if (n.Recaptures > 0)
            {
                _warnings.Add(n.Disturbed
                    ? $"the baseline ready at {F(n.CompletedSeconds)} s is the best of {n.Recaptures + 1} disturbed captures (a step or outliers in each: metal or the coil moved while it was taken); re-baseline when the coil is still and clear of metal"
                    : $"the baseline ready at {F(n.CompletedSeconds)} s was captured again {n.Recaptures} time(s): the earlier capture was disturbed (a step or outliers: metal or the coil moved)");
            }

            if (n.OverMetalHint)
            {
                _warnings.Add($"the lasting shift absorbed at {F(n.CompletedSeconds)} s is opposite in sign to the disturbance seen in an earlier baseline capture: that baseline may have been taken with metal near the coil");
            }

            if (n.Outliers > 0)
            {
                _warnings.Add($"the baseline capture ending at {F(n.CompletedSeconds)} s rejected {n.Outliers} of {n.Gates} gates as outliers (something moved during settling?)");
            }
        }
    }

    private void AddEvent(DetectionEvent e)
    {
        _events.Add(new ReplayEvent(e, _startedUtc?.AddSeconds(e.StartSeconds)));
    }

    private static string F(double v) => v.ToString("0.###", System.Globalization.CultureInfo.InvariantCulture);
}
