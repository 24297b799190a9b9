using FreqReadout.Detection;

namespace FreqReadout.Tests.Tracking;

/// <summary>
/// Passes that come while lock is lost at a sudden change of drift rate are still reported, each as its own event
/// (synthetic gates, invented: a kink of 0.3 Hz/s, 30 noise sigmas a second, with two passes of opposite sign right
/// after it).
/// </summary>
public class LockLossPassTests
{
    [Fact]
    public void Two_passes_just_after_a_drift_rate_onset_are_both_reported_with_their_signs()
    {
        var stream = new SyntheticGateStream
        {
            NoiseHz = 0.01,
            DurationSeconds = 45,
            DriftHz = t => t > 20.0 ? 0.3 * (t - 20.0) : 0.0,
        };
        stream.Passes.Add(new TargetPass(21.5, 1.5, 0.3));
        stream.Passes.Add(new TargetPass(25.0, 1.5, -0.3));
        PipelineRun run = PipelineRun.Of(stream);

        DetectionEvent first = Assert.Single(run.Events, e => Math.Abs(e.PeakSeconds - 21.5) < 0.5);
        DetectionEvent second = Assert.Single(run.Events, e => Math.Abs(e.PeakSeconds - 25.0) < 0.5);
        Assert.InRange(first.PeakShiftHz, 0.2, 0.4);   // 0.3 Hz truth; the baseline is bridged across the bend
        Assert.InRange(second.PeakShiftHz, -0.4, -0.2);
        Assert.Equal(TargetClass.NonFerrous, first.Class);
        Assert.Equal(TargetClass.Ferrous, second.Class);

        // The drift itself makes no other event.
        Assert.Equal(2, run.Events.Count);
    }
}
