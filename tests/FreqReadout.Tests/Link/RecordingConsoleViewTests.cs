using FreqReadout.Detection;
using FreqReadout.Host.Recording;
using FreqReadout.Link;
using FreqReadout.Readout;

namespace FreqReadout.Tests.Link;

/// <summary>
/// <c>record --live</c>: frequency, shift (Hz and noise sigmas), state and class per line, at most two lines a second of
/// capture time plus one at every change of state or class, every event; nothing on standard output without --live.
/// Readings are invented.
/// </summary>
public sealed class RecordingConsoleViewTests
{
    private static ReadingPayload Reading(double t, ReadoutState state, TargetClass cls = TargetClass.None, double shiftHz = 0.25, double sigma = 1.5) => new()
    {
        TimeSeconds = t, State = state, Class = cls, HasFrequency = true, FrequencyHz = 100_000.25 + shiftHz, HasShift = state != ReadoutState.Settling,
        ShiftHz = shiftHz, ShiftSigma = sigma, TargetPresent = state == ReadoutState.Target,
    };

    [Fact]
    public void Live_lines_show_the_numbers_and_come_twice_a_second_plus_every_change()
    {
        var output = new StringWriter { NewLine = "\n" };
        var view = new RecordingConsoleView(output, TextWriter.Null, live: true);
        for (int gate = 0; gate < 30; gate++)
        {
            double t = gate * 0.1;
            bool target = gate >= 20 && gate < 25;
            view.ReadingReceived(Reading(t, target ? ReadoutState.Target : ReadoutState.Tracking, target ? TargetClass.NonFerrous : TargetClass.None, target ? 12.5 : 0.25, target ? 40 : 1.5));
        }

        view.EventReceived(new EventPayload { StartSeconds = 2.0, EndSeconds = 2.4, PeakShiftHz = 12.5, PeakSigma = 40, Class = TargetClass.NonFerrous });
        string[] lines = output.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries);

        // Tracking from 0 s: a line at 0, 0.5, 1.0, 1.5 s; the target at 2.0 s (a change), 2.5 s (change back), then none
        // until 3.0 s, which is past the last gate (2.9 s); then the event.
        Assert.Equal(7, lines.Length);
        Assert.Equal("     0.0 s  100000.5 Hz     shift +0.25 Hz (+1.5 sigma)         tracking", lines[0]);
        Assert.Contains("shift +12.50 Hz (+40.0 sigma)", lines[4]);
        Assert.EndsWith("non-ferrous", lines[4]);
        Assert.StartsWith("     2.5 s", lines[5]);
        Assert.Equal("event 2.00-2.40 s: peak +12.50 Hz (+40.0 sigma), non-ferrous", lines[6]);
    }

    [Fact]
    public void Without_live_nothing_goes_to_standard_output_and_the_notes_go_to_standard_error()
    {
        var output = new StringWriter();
        var error = new StringWriter();
        var view = new RecordingConsoleView(output, error, live: false);
        view.CaptureOpened("field.csv", new CaptureHeaderPayload { BootId = 7, Snapshots = true, ClockHz = 1e6 });
        view.ReadingReceived(Reading(0, ReadoutState.Tracking));
        view.EventReceived(new EventPayload());
        view.CaptureClosed("field.csv", 1234, "stopped");
        Assert.Equal(string.Empty, output.ToString());
        Assert.Contains("writing field.csv (pulse-counter reads, clock 1000000 Hz, device boot id 7)", error.ToString());
        Assert.Contains("closed field.csv: 1234 rows (stopped)", error.ToString());
    }

    [Fact]
    public void Near_zero_beat_and_a_disturbed_baseline_are_said_in_the_line()
    {
        var r = Reading(1, ReadoutState.Tracking);
        r.BelowBeatFloor = true;
        r.BaselineDisturbed = true;
        Assert.EndsWith("tracking, beat near zero, baseline disturbed", RecordingConsoleView.LiveLine(r));
        r.HasFrequency = false;
        Assert.Contains("no signal", RecordingConsoleView.LiveLine(r));
    }

    [Fact]
    public void Device_troubles_from_its_status_are_noted_on_standard_error_at_most_every_10_s()
    {
        var error = new StringWriter { NewLine = "\n" };
        var view = new RecordingConsoleView(TextWriter.Null, error, live: false);
        view.StatusReceived(new StatusPayload { BootId = 1, UptimeMicroseconds = 1_000_000, SettingsProblems = 2 });
        view.StatusReceived(new StatusPayload { BootId = 1, UptimeMicroseconds = 2_000_000, SettingsProblems = 2, Stalls = 1, LongestGapMicroseconds = 41_000 });    // too soon
        view.StatusReceived(new StatusPayload { BootId = 1, UptimeMicroseconds = 12_000_000, SettingsProblems = 2, Stalls = 3, LongestGapMicroseconds = 41_000, FramesLost = 5 });
        view.StatusReceived(new StatusPayload { BootId = 1, UptimeMicroseconds = 13_000_000, SettingsProblems = 2, Stalls = 3, FramesLost = 5 });    // nothing new
        string[] lines = error.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(
            new[]
            {
                "record: the device reports 2 setting(s) that were invalid and fell back to their defaults",
                "record: device at 12 s: +3 stalls (longest gap 41 ms), +0 reads dropped, +5 frames lost",
            },
            lines);
    }
}
