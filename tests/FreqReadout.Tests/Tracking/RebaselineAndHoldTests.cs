using FreqReadout.Detection;
using FreqReadout.Readout;
using FreqReadout.Tracking;

namespace FreqReadout.Tests.Tracking;

/// <summary>
/// Issue 3: automatic re-baseline after a persistent step (reported with its shift), hold mode keeps a
/// still target, manual re-baseline, and the signal_restored re-baseline. Synthetic truth (invented data):
/// 100 kHz, 0.1 Hz gate noise, 0.1 s gates, defaults (persistent_shift_s 30, settling 1 s, baseline 5 s).
/// </summary>
public class RebaselineAndHoldTests
{
    private static Func<double, double> Step(double at, double hz, double until = double.MaxValue) =>
        t => t >= at && t < until ? hz : 0;

    [Fact]
    public void Persistent_step_is_re_baselined_automatically_and_reported_with_its_shift()
    {
        // A -4 Hz (-40 ppm, 40 sigma) step at 100 s that stays: a drift jump, not a coil sweep.
        var stream = new SyntheticGateStream { DurationSeconds = 300, ExtraHz = Step(100, -4.0), DriftHz = t => 0.002 * t };
        PipelineRun run = PipelineRun.Of(stream);

        RebaselineNotice auto = Assert.Single(run.Rebaselines);
        Assert.Equal(RebaselineReason.Auto, auto.Reason);

        // Triggered persistent_shift_s after the step was detected, and ready at once: the new baseline is
        // re-acquired from the readings already held (the last fit_window_s), with no blind settling.
        Assert.InRange(auto.RequestedSeconds, 130.0, 130.3);
        Assert.Equal(auto.RequestedSeconds, auto.CompletedSeconds);

        // The absorbed shift is the step (search oscillator; within 3 % + the slope extrapolation).
        Assert.InRange(auto.ShiftHz, -4.12, -3.88);
        Assert.True(auto.HasShift && auto.HasPpm);
        Assert.InRange(auto.ShiftPpm, -41.2, -38.8);

        // The confirmed event the re-baseline absorbed is reported, flagged so (issue 8: never discarded),
        // and afterwards the readout is back at zero shift.
        DetectionEvent absorbed = Assert.Single(run.Events);
        Assert.Equal(EventEnd.AutoRebaseline, absorbed.End);
        Assert.InRange(absorbed.StartSeconds, 100.0, 100.3);
        Assert.InRange(absorbed.PeakShiftHz, -4.6, -3.6);
        Assert.Equal(TargetClass.Ferrous, absorbed.Class);
        Reading last = run.Readings[^1];
        Assert.Equal(ReadoutState.Tracking, last.State);
        Assert.InRange(last.ShiftHz, -0.5, 0.5);
    }

    [Fact]
    public void A_re_baseline_under_way_is_pending_until_its_capture_completes()
    {
        // A manual re-baseline requested at 50 s needs settling_s 1 + baseline_s 5: runs ending 3 s into it and 10 s into it.
        static void Press(ReadoutPipeline p, FreqReadout.Counting.GateResult g)
        {
            if (Math.Abs(g.StartSeconds - 50) < 0.05) { p.RequestRebaseline(); }
        }

        var shortRun = PipelineRun.Of(new SyntheticGateStream { DurationSeconds = 53 }, null, Press);
        Assert.Empty(shortRun.Rebaselines);
        Assert.True(shortRun.Pipeline.TryGetPendingRebaseline(out RebaselineReason reason, out double since));
        Assert.Equal(RebaselineReason.Manual, reason);
        Assert.InRange(since, 49.95, 50.05);

        var longRun = PipelineRun.Of(new SyntheticGateStream { DurationSeconds = 60 }, null, Press);
        Assert.Single(longRun.Rebaselines);
        Assert.False(longRun.Pipeline.TryGetPendingRebaseline(out _, out _));

        // An automatic re-baseline is never pending: it re-acquires the baseline from the readings held.
        var auto = PipelineRun.Of(new SyntheticGateStream { DurationSeconds = 131, ExtraHz = Step(100, -4.0) });
        Assert.Single(auto.Rebaselines);
        Assert.False(auto.Pipeline.TryGetPendingRebaseline(out _, out _));

        // The first baseline is never "pending" in this sense (it is not listed as a re-baseline either).
        var start = PipelineRun.Of(new SyntheticGateStream { DurationSeconds = 3 });
        Assert.False(start.Pipeline.TryGetPendingRebaseline(out _, out _));
    }

    [Fact]
    public void Hold_mode_keeps_a_still_target_as_one_event()
    {
        // A still target of +2 Hz (20 sigma) from 100 s to 220 s, four times the persistent-shift timeout;
        // hold pressed at 101 s, released at 225 s.
        var stream = new SyntheticGateStream { DurationSeconds = 300, ExtraHz = Step(100, 2.0, 220), DriftHz = t => 0.001 * t };
        PipelineRun run = PipelineRun.Of(stream, null, (p, g) =>
        {
            if (Math.Abs(g.StartSeconds - 101) < 0.05) { p.SetHold(true); }
            if (Math.Abs(g.StartSeconds - 225) < 0.05) { p.SetHold(false); }
        });

        Assert.Empty(run.Rebaselines);
        DetectionEvent e = Assert.Single(run.Events);
        Assert.InRange(e.StartSeconds, 100.0, 100.2);
        Assert.InRange(e.EndSeconds, 219.9, 220.1);
        Assert.InRange(e.PeakShiftHz, 2.0, 2.5);
        Assert.Equal(TargetClass.NonFerrous, e.Class);
        Assert.Contains(run.Readings, r => r.State == ReadoutState.Hold && r.TargetPresent);
    }

    [Fact]
    public void Without_hold_the_same_still_target_is_re_baselined_and_reported()
    {
        var stream = new SyntheticGateStream { DurationSeconds = 300, ExtraHz = Step(100, 2.0, 220), DriftHz = t => 0.001 * t };
        PipelineRun run = PipelineRun.Of(stream);

        // Absorbed at 130 s (reported, +2 Hz), and its removal at 220 s is itself a persistent -2 Hz shift;
        // both confirmed events are reported, flagged as absorbed by the automatic re-baseline.
        Assert.Equal(new[] { RebaselineReason.Auto, RebaselineReason.Auto }, run.Rebaselines.Select(n => n.Reason).ToArray());
        Assert.InRange(run.Rebaselines.First().ShiftHz, 1.85, 2.15);
        Assert.InRange(run.Rebaselines.Last().ShiftHz, -2.15, -1.85);
        Assert.Equal(new[] { EventEnd.AutoRebaseline, EventEnd.AutoRebaseline }, run.Events.Select(e => e.End).ToArray());
        Assert.Equal(new[] { TargetClass.NonFerrous, TargetClass.Ferrous }, run.Events.Select(e => e.Class).ToArray());
    }

    [Fact]
    public void Manual_re_baseline_is_honoured_and_closes_an_open_event()
    {
        // +1.5 Hz target from 60 s to 80 s; manual re-baseline requested at 50 s (no target) and at 70 s (on the target).
        var stream = new SyntheticGateStream { DurationSeconds = 100, ExtraHz = Step(60, 1.5, 80) };
        PipelineRun run = PipelineRun.Of(stream, null, (p, g) =>
        {
            if (Math.Abs(g.StartSeconds - 50) < 0.05 || Math.Abs(g.StartSeconds - 70) < 0.05) { p.RequestRebaseline(); }
        });

        RebaselineNotice[] manual = run.Rebaselines.Where(n => n.Reason == RebaselineReason.Manual).ToArray();
        Assert.Equal(2, manual.Length);
        Assert.InRange(manual[0].RequestedSeconds, 49.95, 50.05);
        Assert.InRange(manual[0].ShiftHz, -0.1, 0.1);
        Assert.InRange(manual[1].RequestedSeconds, 69.95, 70.05);
        // The baseline taken on the target absorbed it, and says so: 1.5 Hz, within the old tracker's extrapolation
        // over the 6 s of settling and capture (its slope uncertainty times 6 s, about 0.1 Hz here, measured).
        Assert.InRange(manual[1].ShiftHz, 1.35, 1.65);

        // The event open at 70 s was closed by the request; the target's removal at 80 s then reads as a
        // -1.5 Hz event against the new baseline, still open when the run ends at 100 s (closed there).
        DetectionEvent first = run.Events[0];
        Assert.Equal(EventEnd.Rebaseline, first.End);
        Assert.InRange(first.StartSeconds, 60.0, 60.2);
        Assert.InRange(first.PeakShiftHz, 1.4, 1.9);
        DetectionEvent removal = run.Events[^1];
        Assert.True(removal.PeakShiftHz < -1.3 && removal.StartSeconds >= 80, $"{removal.StartSeconds} {removal.PeakShiftHz}");
        Assert.Equal(EventEnd.EndOfRun, removal.End);
        Assert.Equal(TargetClass.Ferrous, removal.Class);

        // Readings during the re-baseline say Settling and carry no shift.
        Assert.All(run.Readings.Where(r => r.TimeSeconds > 50.1 && r.TimeSeconds < 55.9), r =>
        {
            Assert.Equal(ReadoutState.Settling, r.State);
            Assert.False(r.HasShift);
        });
    }

    [Fact]
    public void Readings_say_settling_until_the_first_baseline()
    {
        var stream = new SyntheticGateStream { DurationSeconds = 10 };
        PipelineRun run = PipelineRun.Of(stream);
        Assert.All(run.Readings.Where(r => r.TimeSeconds < 6.0 - 1e-9), r => Assert.Equal(ReadoutState.Settling, r.State));
        Assert.All(run.Readings.Where(r => r.TimeSeconds > 6.05), r => Assert.Equal(ReadoutState.Tracking, r.State));
        RebaselineNotice first = Assert.Single(run.Notices);
        Assert.Equal(RebaselineReason.Initial, first.Reason);
        Assert.False(first.HasShift);
        Assert.InRange(first.BaselineHz, 99_999.9, 100_000.1);
        Assert.InRange(first.NoiseHz, 0.07, 0.13);
        Assert.Equal(50, first.Gates);
    }

    [Fact]
    public void Signal_loss_closes_the_event_and_the_return_re_baselines_with_reason_signal_restored()
    {
        var stream = new SyntheticGateStream { DurationSeconds = 60, ExtraHz = Step(20, 3.0) };
        var pipeline = new PipelineRun(new ReadoutSettings());
        var gates = stream.Gates().ToList();

        // Signal lost from 22 s to 25 s (during the target).
        var fed = gates.Select(g => g.StartSeconds >= 22 && g.StartSeconds < 25 ? SyntheticGateStream.NoSignal(g.StartSeconds, g.EndSeconds) : g);
        pipeline.Feed(fed);

        Assert.Contains(pipeline.Readings, r => r.State == ReadoutState.NoSignal && !r.HasFrequency && !r.HasShift);
        DetectionEvent e = pipeline.Events[0];
        Assert.Equal(EventEnd.NoSignal, e.End);
        RebaselineNotice restored = Assert.Single(pipeline.Rebaselines);
        Assert.Equal(RebaselineReason.SignalRestored, restored.Reason);
        Assert.InRange(restored.RequestedSeconds, 24.95, 25.05);
        Assert.InRange(restored.ShiftHz, 2.8, 3.2); // the target was still there when the signal came back
    }
}
