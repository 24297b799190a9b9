using System.Globalization;
using FreqReadout.Detection;
using FreqReadout.Link;
using FreqReadout.Readout;

namespace FreqReadout.Host.Recording;

/// <summary>
/// What <c>record</c> shows: captures opened and closed (standard error), and with <c>--live</c> the readings on
/// standard output, at most two lines a second of capture time plus one at every change of state or class, and every
/// detection event.
/// </summary>
public sealed class RecordingConsoleView : IRecordingObserver
{
    private const double LiveIntervalSeconds = 0.5;
    private const long NoteIntervalMicroseconds = 10_000_000;

    private readonly TextWriter _out;
    private readonly TextWriter _error;
    private readonly bool _live;
    private double _lastShownSeconds = double.NegativeInfinity;
    private ReadoutState _lastState = (ReadoutState)(-1);
    private TargetClass _lastClass = (TargetClass)(-1);
    private int _settingsProblems;
    private uint? _bootId;
    private long _stalls;
    private long _dropped;
    private long _lost;
    private long _lastNoteMicroseconds;

    /// <summary>A view writing live lines to <paramref name="output"/> (when <paramref name="live"/>) and notes to <paramref name="error"/>.</summary>
    public RecordingConsoleView(TextWriter output, TextWriter error, bool live)
    {
        _out = output;
        _error = error;
        _live = live;
    }

    /// <summary>The latest settings text the device sent.</summary>
    public string? SettingsText { get; private set; }

    /// <inheritdoc/>
    public void CaptureOpened(string path, CaptureHeaderPayload header) =>
        _error.WriteLine($"record: writing {path} ({(header.Snapshots ? "pulse-counter reads" : "edges")}, clock {Num(header.ClockHz)} Hz, device boot id {header.BootId.ToString(CultureInfo.InvariantCulture)})");

    /// <inheritdoc/>
    public void CaptureClosed(string path, long rows, string why) =>
        _error.WriteLine($"record: closed {path}: {rows.ToString(CultureInfo.InvariantCulture)} rows ({why})");

    /// <inheritdoc/>
    public void ReadingReceived(ReadingPayload reading)
    {
        if (!_live)
        {
            return;
        }

        bool changed = reading.State != _lastState || reading.Class != _lastClass;
        if (!changed && reading.TimeSeconds - _lastShownSeconds < LiveIntervalSeconds)
        {
            return;
        }

        _lastShownSeconds = reading.TimeSeconds;
        _lastState = reading.State;
        _lastClass = reading.Class;
        _out.WriteLine(LiveLine(reading));
    }

    /// <inheritdoc/>
    public void EventReceived(EventPayload detection)
    {
        if (_live)
        {
            _out.WriteLine(EventLine(detection));
        }
    }

    /// <summary>
    /// Notes on standard error what the device's status says is wrong: stored or sent settings that fell back to their
    /// defaults (when the number changes), and new stalls, dropped reads or frames lost on the device (at most one note
    /// every 10 s of the device's uptime, with the increases since the last note).
    /// </summary>
    public void StatusReceived(StatusPayload status)
    {
        if (status.SettingsProblems != _settingsProblems)
        {
            _settingsProblems = status.SettingsProblems;
            if (_settingsProblems > 0)
            {
                _error.WriteLine($"record: the device reports {_settingsProblems} setting(s) that were invalid and fell back to their defaults");
            }
        }

        if (status.BootId != _bootId)
        {
            _bootId = status.BootId;
            _stalls = status.Stalls;
            _dropped = status.ReadsDropped;
            _lost = status.FramesLost;
            _lastNoteMicroseconds = status.UptimeMicroseconds;
            return;
        }

        long stalls = status.Stalls - _stalls;
        long dropped = status.ReadsDropped - _dropped;
        long lost = status.FramesLost - _lost;
        if ((stalls > 0 || dropped > 0 || lost > 0) && status.UptimeMicroseconds - _lastNoteMicroseconds >= NoteIntervalMicroseconds)
        {
            _error.WriteLine($"record: device at {Num(status.UptimeMicroseconds / 1e6, "F0")} s: +{stalls} stalls (longest gap {Num(status.LongestGapMicroseconds / 1000.0, "F0")} ms), +{dropped} reads dropped, +{lost} frames lost");
            _stalls = status.Stalls;
            _dropped = status.ReadsDropped;
            _lost = status.FramesLost;
            _lastNoteMicroseconds = status.UptimeMicroseconds;
        }
    }

    /// <inheritdoc/>
    public void SettingsReceived(string text) => SettingsText = text;

    /// <summary>One live line: time, frequency, shift (Hz and noise sigmas), state and class.</summary>
    public static string LiveLine(ReadingPayload r)
    {
        string f = r.HasFrequency ? Num(r.FrequencyHz, "F1") + " Hz" : "no signal";
        string shift = r.HasShift ? $"shift {Signed(r.ShiftHz, "F2")} Hz ({Signed(r.ShiftSigma, "F1")} sigma)" : "shift -";
        string state = r.TargetPresent ? ClassWord(r.Class) : StateWord(r.State);
        if (r.BelowBeatFloor)
        {
            state += ", beat near zero";
        }

        if (r.BaselineDisturbed)
        {
            state += ", baseline disturbed";
        }

        return $"{Num(r.TimeSeconds, "F1"),8} s  {f,-14}  {shift,-34}  {state}";
    }

    /// <summary>One event line: span, peak shift and its class.</summary>
    public static string EventLine(EventPayload e) =>
        $"event {Num(e.StartSeconds, "F2")}-{Num(e.EndSeconds, "F2")} s: peak {Signed(e.PeakShiftHz, "F2")} Hz ({Signed(e.PeakSigma, "F1")} sigma), {ClassWord(e.Class)}";

    private static string StateWord(ReadoutState state) => state switch
    {
        ReadoutState.NoSignal => "no signal",
        ReadoutState.Settling => "taking baseline",
        ReadoutState.Hold => "hold",
        ReadoutState.Target => "target",
        _ => "tracking",
    };

    private static string ClassWord(TargetClass c) => c switch
    {
        TargetClass.Ferrous => "ferrous",
        TargetClass.NonFerrous => "non-ferrous",
        TargetClass.Unclear => "unclear",
        _ => "target",
    };

    private static string Num(double v, string format = "R") => v.ToString(format, CultureInfo.InvariantCulture);

    private static string Signed(double v, string format) => (v >= 0 ? "+" : string.Empty) + Num(v, format);
}
