using FreqReadout.Readout;

namespace FreqReadout.Tests.Tracking;

/// <summary>
/// Optional temperature compensation: with the right tempco a fast temperature change that the drift
/// tracker cannot follow leaves no trace; without it, it does. Synthetic truth (invented data): tempco
/// -10 ppm/K (about the copper coil's -8 ppm/K of docs/references.md plus a little capacitor), 3 K steps taking 3 s.
/// </summary>
public class TemperatureCompensationTests
{
    private const double Tempco = -10; // ppm/K

    private static double TemperatureC(double t) =>
        20 + (3 * Math.Clamp((t - 100) / 3, 0, 1)) - (3 * Math.Clamp((t - 200) / 3, 0, 1)) + (3 * Math.Clamp((t - 300) / 3, 0, 1));

    private static SyntheticGateStream Stream() => new()
    {
        DurationSeconds = 400,
        DriftHz = t => Tempco * 1e-6 * 100_000 * (TemperatureC(t) - 20),
    };

    private static void SampleTemperature(ReadoutPipeline p, FreqReadout.Counting.GateResult g) =>
        p.SetTemperature(TemperatureC(g.StartSeconds + (g.SpanSeconds / 2)));

    [Fact]
    public void With_the_tempco_fast_temperature_steps_give_no_event_and_no_re_baseline()
    {
        PipelineRun run = PipelineRun.Of(Stream(), new ReadoutSettings { TempcoPpmPerK = Tempco }, SampleTemperature);
        Assert.Empty(run.Events);
        Assert.Empty(run.Rebaselines);

        // The correction applied is tempco x f x dT: -10e-6 x 1e5 x 3 K = -3 Hz during the first step.
        Reading r = run.Readings.First(x => x.TimeSeconds > 150);
        Assert.InRange(r.TemperatureCorrectionHz, -3.01, -2.99);
    }

    [Fact]
    public void Without_compensation_the_same_steps_are_seen()
    {
        // Uncompensated, each 3-s step is a change of drift rate that the causal tracker cannot follow: the
        // readout loses lock on each and recovers it by re-anchoring (issue 8), with no event made of drift.
        PipelineRun run = PipelineRun.Of(Stream(), new ReadoutSettings(), SampleTemperature);
        long seen = run.Events.Count + run.Rebaselines.Count() + run.Pipeline.LockRecoveries;
        Assert.True(seen >= 3, $"{run.Events.Count} events, {run.Rebaselines.Count()} re-baselines, {run.Pipeline.LockRecoveries} lock recoveries");
        Assert.Empty(run.Events);
    }
}
