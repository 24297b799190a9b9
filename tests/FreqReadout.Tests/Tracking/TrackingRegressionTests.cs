using FreqReadout.Detection;
using FreqReadout.Host.Bench;
using FreqReadout.Host.Replay;
using Xunit.Abstractions;

namespace FreqReadout.Tests.Tracking;

/// <summary>
/// Issue 8's numbered cases on simulated scenes (invented, <see cref="DriftScenarios"/>) and synthetic gates. Case 2 (an
/// absorbed event is reported) is in RebaselineAndHoldTests, case 3 (a missed edge) in the counting tests, case 5 (an
/// honest error) in QuantisationErrorModelTests.
/// </summary>
public class TrackingRegressionTests
{
    private readonly ITestOutputHelper _output;

    public TrackingRegressionTests(ITestOutputHelper output)
    {
        _output = output;
    }

    private void Report(BenchSceneOutcome o)
    {
        BenchWayOutcome r = o.Ways[0];
        _output.WriteLine($"{o.Scene.Scene.Name}: {r.Found}/{o.Passes.Count} found, {r.Right} right, {r.FalseEvents} false, {r.Rebaselines} re-baselines");
        foreach (BenchPass p in o.Passes)
        {
            _output.WriteLine($"  pass {p.Target}: peak {p.PeakSeconds:F2} s, {p.PeakShiftHz:G4} Hz, {p.SignRuleClass}");
        }

        foreach (ReplayEvent e in o.Readout.Events)
        {
            _output.WriteLine($"  event {e.Event.StartSeconds:F2}-{e.Event.EndSeconds:F2} s, peak {e.Event.PeakSeconds:F2} s, {e.Event.PeakShiftHz:G4} Hz, {e.ClassName}, {e.Event.End}");
        }

        foreach (string w in o.Readout.Warnings)
        {
            _output.WriteLine("  " + w);
        }
    }

    [Fact]
    public void Case1_warm_to_cold_settling_makes_no_false_target_and_no_re_baseline_cycle()
    {
        // 5 ppm/s at first, tau 60 s, 0.02 ppm gate noise: before, the readout cycled through false targets and
        // automatic re-baselines, and with the earlier level-and-slope tracker most passes were missed (its lag under
        // this curvature raised the running noise about fivefold). The Kalman tracker follows the curvature: no false
        // event, at most one automatic re-baseline (no cycle), and at least 7 of the 8 passes classified right
        // (measured at this commit: 8 found, 8 right, since the tracker starts from a run over the capture's own
        // readings and split passes are merged).
        BenchSceneOutcome o = DriftScenarios.WarmToColdSettling().Run();
        Report(o);
        BenchWayOutcome readout = o.Ways[0];
        Assert.True(readout.FalseEvents == 0, $"{readout.FalseEvents} false events");
        Assert.True(readout.Rebaselines <= 1, $"{readout.Rebaselines} automatic re-baselines (a drift cycle)");
        Assert.True(o.Readout.Events.Count(e => e.Event.End == EventEnd.AutoRebaseline) <= 1);
        Assert.True(readout.Right >= 7, $"{readout.Right} of {o.Passes.Count} right");
    }

    [Fact]
    public void Case1_a_drift_rate_onset_after_the_baseline_is_followed_without_a_false_event()
    {
        // 0.03 Hz/s from 20 s (15 gate noises a second): before, the same lock-loss cycle as fast settling.
        BenchSceneOutcome quiet = DriftScenarios.DriftRateOnset(withPasses: false).Run();
        Report(quiet);
        Assert.Equal(0, quiet.Ways[0].FalseEvents);
        Assert.Equal(0, quiet.Ways[0].Rebaselines);
        Assert.Empty(quiet.Readout.Events);

        BenchSceneOutcome passes = DriftScenarios.DriftRateOnset(withPasses: true).Run();
        Report(passes);
        Assert.True(passes.Ways[0].Right >= passes.Passes.Count - 1, $"{passes.Ways[0].Right} of {passes.Passes.Count}");
        Assert.True(passes.Ways[0].FalseEvents <= 1, $"{passes.Ways[0].FalseEvents} false events");
    }

    [Fact]
    public void Case4_metal_leaving_during_the_baseline_capture_is_caught_and_the_passes_after_it_are_found()
    {
        // Before: the capture fitted a slope across the step, its noise grew 25x and later targets went unseen.
        BenchSceneOutcome o = DriftScenarios.MetalLeavesDuringBaseline().Run();
        Report(o);
        Assert.True(o.Ways[0].Right >= o.Passes.Count - 1, $"{o.Ways[0].Right} of {o.Passes.Count}");
        Assert.InRange(o.Readout.NoiseHz ?? double.NaN, 0, 3 * o.Scene.GateNoiseHz);
    }

    [Fact]
    public void Case4_a_disturbed_capture_is_captured_again_and_said()
    {
        // Synthetic gates (invented): a +3 Hz step (30 noises) at 3.5 s, inside the first capture (1 s settling + 5 s).
        var stream = new SyntheticGateStream { DurationSeconds = 40, ExtraHz = t => t < 3.5 ? 3.0 : 0.0 };
        PipelineRun run = PipelineRun.Of(stream);
        var first = Assert.Single(run.Notices);
        Assert.False(first.Disturbed); // the second capture, after the step, was clean
        Assert.Equal(1, first.Recaptures);
        Assert.InRange(first.BaselineHz, 99_999.8, 100_000.2);
        Assert.InRange(first.NoiseHz, 0.07, 0.14);
        Assert.Contains(run.Readings, r => r.BaselineDisturbed && !r.HasShift);
        Assert.DoesNotContain(run.Readings, r => r.TimeSeconds > 20 && r.BaselineDisturbed);
        Assert.Empty(run.Events);
    }

    [Fact]
    public void Case4_a_capture_disturbed_every_time_keeps_the_best_and_says_so()
    {
        // Steps every 2 s for the first 30 s (something keeps moving near the coil): three recaptures, then the best is kept.
        var stream = new SyntheticGateStream { DurationSeconds = 60, ExtraHz = t => t < 30 ? 4.0 * Math.Floor(t / 2.0) : 56.0 };
        PipelineRun run = PipelineRun.Of(stream);
        var first = run.Notices[0];
        _output.WriteLine($"first baseline at {first.CompletedSeconds} s: disturbed {first.Disturbed}, recaptures {first.Recaptures}, noise {first.NoiseHz}");
        Assert.True(first.Disturbed);
        Assert.Equal(3, first.Recaptures);
        Assert.Contains(run.Readings, r => r.BaselineDisturbed && r.HasShift);
    }
}
