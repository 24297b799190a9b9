using FreqReadout.Readout;
using FreqReadout.Tracking;

namespace FreqReadout.Tests.Tracking;

/// <summary>
/// Issue 3: temperature ramps and exponential settling of a few hundred ppm with no target give no
/// target events over at least 30 simulated minutes. Synthetic truth (invented data): 100 kHz search
/// oscillator, 0.1 Hz (1 ppm) white gate noise, 0.1 s gates.
/// </summary>
public class DriftWithoutTargetTests
{
    private const double F0 = 100_000;

    public static IEnumerable<object[]> Drifts()
    {
        // Exponential settling of -300 ppm with a 3 min time constant (a coil carried into cold air).
        yield return new object[] { "settling -300 ppm, tau 180 s", (Func<double, double>)(t => -300e-6 * F0 * (1 - Math.Exp(-t / 180))) };
        // Exponential settling of +400 ppm with a 2 min time constant.
        yield return new object[] { "settling +400 ppm, tau 120 s", (Func<double, double>)(t => 400e-6 * F0 * (1 - Math.Exp(-t / 120))) };
        // Temperature ramp 0.8 K/min up for 17.5 min then down, at -10 ppm/K: 140 ppm each way, slope reversals.
        yield return new object[] { "triangle ramp 140 ppm", (Func<double, double>)(t => -10e-6 * F0 * (0.8 / 60) * (t < 1050 ? t : 2100 - t)) };
        // Settling of -250 ppm (tau 150 s) on top of a steady 300 ppm ramp over 35 min.
        yield return new object[] { "settling + ramp", (Func<double, double>)(t => (-250e-6 * F0 * (1 - Math.Exp(-t / 150))) + (300e-6 * F0 * t / 2100)) };
    }

    [Theory]
    [MemberData(nameof(Drifts))]
    public void No_event_and_no_rebaseline_over_35_minutes_of_drift(string name, Func<double, double> drift)
    {
        var stream = new SyntheticGateStream { DurationSeconds = 35 * 60, DriftHz = drift, NoiseHz = 0.1, Seed = name.Length };
        PipelineRun run = PipelineRun.Of(stream);

        // Not a trivial pass: the drift after the baseline moves by far more than 20 times the 5-sigma threshold.
        double span = Enumerable.Range(0, 2100).Select(s => drift(s) - drift(4)).Max(v => Math.Abs(v));
        Assert.True(span > 20 * 5 * 0.1, name + ": drift span " + span);

        Assert.True(run.Events.Count == 0, name + ": events " + string.Join("; ", run.Events.Select(e => $"{e.StartSeconds:F1}s {e.PeakShiftHz:F3}Hz")));
        Assert.Empty(run.Rebaselines);
        Assert.Single(run.Notices);

        // The tracker really followed: the last reading's baseline is within 3 noise sigma of the truth.
        Reading last = run.Readings[^1];
        double truth = F0 + drift(last.TimeSeconds - 0.05);
        Assert.InRange(last.BaselineHz - truth, -0.3, 0.3);
    }
}
