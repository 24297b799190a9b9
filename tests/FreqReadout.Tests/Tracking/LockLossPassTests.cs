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

    // A pass centred right on a sudden change of drift rate pulls the fitted kink time onto itself; a peak that close to
    // the kink was once taken for the kink's own timing error (a kink placed dt off leaves db dt) and dropped, whatever
    // its size. Now only a peak no larger than that error can be (|db| 0.05 s + the threshold) is dropped. Before the
    // fix 1 of these 24 was found; now all are (synthetic gates, invented: noise 0.01 Hz, pass 4 s wide).
    [Theory]
    [InlineData(0.5, 0.1)]
    [InlineData(0.5, 0.3)]
    [InlineData(0.5, -0.3)]
    [InlineData(2.0, 0.1)]
    [InlineData(2.0, 0.3)]
    [InlineData(2.0, -0.3)]
    public void A_pass_centred_on_a_drift_rate_onset_is_reported(double peakHz, double rateHzPerSecond)
    {
        for (int seed = 1; seed <= 4; seed++)
        {
            PipelineRun run = RunAfterOnset(seed, rateHzPerSecond, new TargetPass(20.0, 4.0, peakHz));

            Assert.True(
                run.Events.Any(e => Math.Abs(e.PeakSeconds - 20.0) < 1.0 && e.Class == TargetClass.NonFerrous),
                $"seed {seed}: events " + string.Join("; ", run.Events.Select(e => $"{e.PeakSeconds:F1} s {e.PeakShiftHz:F3} Hz {e.Class}")));
        }
    }

    // A pass a few seconds after a sudden drift rate: the tracker, just re-anchored on a short fit, learns the pass's
    // rising flank as drift, loses lock again on its falling flank and would re-anchor on that (a second lock recovery
    // within seconds of the first). The chain test fits one smooth drift to the readings since the first kink instead,
    // and the pass stands out of it (synthetic gates, invented: noise 0.01 Hz, a ramp of 0.5 or 1.5 Hz/s from 20 s,
    // a pass 4 s wide and 12 noise sigmas high 5-7 s later, 8 seeds each). Before the chain test 41 of these 48 were
    // found; now all are.
    [Theory]
    [InlineData(1.5, 5.0, 0.12)]
    [InlineData(1.5, 6.0, -0.12)]
    [InlineData(1.5, 7.0, 0.12)]
    [InlineData(-1.5, 6.0, 0.12)]
    [InlineData(0.5, 6.0, -0.12)]
    [InlineData(-0.5, 5.0, 0.12)]
    public void A_pass_seconds_after_a_sudden_drift_rate_is_reported(double rateHzPerSecond, double delaySeconds, double peakHz)
    {
        int found = 0;
        var missed = new List<string>();
        for (int seed = 1; seed <= 8; seed++)
        {
            PipelineRun run = RunAfterOnset(seed, rateHzPerSecond, new TargetPass(20.0 + delaySeconds, 4.0, peakHz));
            TargetClass expected = peakHz > 0 ? TargetClass.NonFerrous : TargetClass.Ferrous;
            if (run.Events.Any(e => Math.Abs(e.PeakSeconds - (20.0 + delaySeconds)) < 1.0 && e.Class == expected))
            {
                found++;
            }
            else
            {
                missed.Add($"seed {seed}: " + string.Join("; ", run.Events.Select(e => $"{e.PeakSeconds:F1} s {e.PeakShiftHz:F3} Hz {e.Class}")));
            }
        }

        Assert.True(found == 8, $"{found} of 8 found; " + string.Join(" | ", missed));
    }

    // A narrow pass right at a fast change of drift rate: the kink fit places the kink from the readings on both sides of
    // the pass, to within its 0.05 s grid, so a peak near the kink is dropped as the kink's own timing error only up to
    // |db| x 0.05 s + the threshold (it was 2 |db| x 0.3 s: 90 sigmas at 1.5 Hz/s, which dropped every pass there).
    // Synthetic gates, invented: noise 0.01 Hz, a ramp from 20 s, a pass 0.4 s wide and 30 noise sigmas high.
    [Theory]
    [InlineData(1.5, 20.1, 0.3)]
    [InlineData(-1.5, 20.0, -0.3)]
    [InlineData(1.0, 19.9, -0.3)]
    public void A_narrow_pass_at_a_fast_drift_rate_onset_is_reported(double rateHzPerSecond, double centreSeconds, double peakHz)
    {
        int found = 0;
        var missed = new List<string>();
        TargetClass expected = peakHz > 0 ? TargetClass.NonFerrous : TargetClass.Ferrous;
        for (int seed = 1; seed <= 4; seed++)
        {
            PipelineRun run = RunAfterOnset(seed, rateHzPerSecond, new TargetPass(centreSeconds, 0.4, peakHz));
            if (run.Events.Any(e => Math.Abs(e.PeakSeconds - centreSeconds) < 0.5 && e.Class == expected))
            {
                found++;
            }
            else
            {
                missed.Add($"seed {seed}: " + string.Join("; ", run.Events.Select(e => $"{e.PeakSeconds:F1} s {e.PeakShiftHz:F3} Hz {e.Class}")));
            }
        }

        Assert.True(found == 4, $"{found} of 4 found; " + string.Join(" | ", missed));
    }

    // Passes that keep coming while lock is lost: a drift rate starts during a pass and a pass follows every 4 s, so no
    // drift window of 5 s is ever clear of one and the plain drift test never re-acquires; the readings since the
    // candidate opened (at most 15 s) are then read as one smooth drift with passes in it (test 6 of ExcursionResolver).
    // Without test 6, 4 of these 24 passes were found (the first of each run); now all are. Synthetic gates, invented:
    // noise 0.01 Hz, a ramp from 19 s, passes 2 s wide and 20 noise sigmas high, signs alternating.
    [Theory]
    [InlineData(0.2)]
    [InlineData(-0.2)]
    [InlineData(0.6)]
    public void Passes_every_few_seconds_after_a_drift_rate_onset_are_all_reported(double rateHzPerSecond)
    {
        double[] centres = { 18.0, 22.0, 26.0, 30.0, 34.0, 38.0 };
        int found = 0;
        var missed = new List<string>();
        for (int seed = 1; seed <= 4; seed++)
        {
            var stream = new SyntheticGateStream
            {
                NoiseHz = 0.01,
                Seed = seed,
                DurationSeconds = 50,
                DriftHz = t => t > 19.0 ? rateHzPerSecond * (t - 19.0) : 0.0,
            };
            for (int k = 0; k < centres.Length; k++)
            {
                stream.Passes.Add(new TargetPass(centres[k], 2.0, k % 2 == 0 ? -0.2 : 0.2));
            }

            PipelineRun run = PipelineRun.Of(stream);
            for (int k = 0; k < centres.Length; k++)
            {
                TargetClass expected = k % 2 == 0 ? TargetClass.Ferrous : TargetClass.NonFerrous;
                if (run.Events.Any(e => Math.Abs(e.PeakSeconds - centres[k]) < 1.0 && e.Class == expected))
                {
                    found++;
                }
                else
                {
                    missed.Add($"seed {seed} pass at {centres[k]} s: " + string.Join("; ", run.Events.Select(e => $"{e.PeakSeconds:F1} s {e.PeakShiftHz:F3} Hz {e.Class}")));
                }
            }
        }

        Assert.True(found == 4 * centres.Length, $"{found} of {4 * centres.Length} found; " + string.Join(" | ", missed));
    }

    // Synthetic gates (invented): noise 0.01 Hz, a still baseline that starts to drift at a rate from 20 s, one pass, 45 s.
    private static PipelineRun RunAfterOnset(int seed, double rateHzPerSecond, TargetPass pass)
    {
        var stream = new SyntheticGateStream
        {
            NoiseHz = 0.01,
            Seed = seed,
            DurationSeconds = 45,
            DriftHz = t => t > 20.0 ? rateHzPerSecond * (t - 20.0) : 0.0,
        };
        stream.Passes.Add(pass);
        return PipelineRun.Of(stream);
    }
}
