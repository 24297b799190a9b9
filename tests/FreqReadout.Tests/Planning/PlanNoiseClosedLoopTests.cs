using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Planning;
using FreqReadout.Host.Simulation;
using FreqReadout.Tests.Simulation;

namespace FreqReadout.Tests.Planning;

/// <summary>
/// Closes the loop on <c>plan</c>'s noise figures: captures simulated with white timing jitter of several ticks (the caveat
/// of docs/references.md: quantisation alone is not white, so the white-noise formulas are tested with jitter) are counted
/// by the project's counters (<see cref="EdgeCounter"/>, <see cref="SnapshotCounter"/>), and the standard deviation of the
/// gate frequencies (at least 200 gates per point) must match <see cref="PlanBuilder.SigmaHz"/> within 20 %. The
/// prediction's formulas are Rubiola 2005 (Pi and Omega counters) and the least-squares slope variance
/// sigma^2 / sum (t - mean t)^2; the simulator is the project's own, which adds the jitter and quantises the timer.
/// The oscillator's own noise, drift and tempco are switched off so the timing noise is all there is.
/// </summary>
public class PlanNoiseClosedLoopTests
{
    /// <summary>Relative tolerance the issue asks for.</summary>
    private const double Tolerance = 0.20;

    public static TheoryData<string, double, int, double, double, double, double> EdgeCases() => new()
    {
        // estimator, frequency Hz, prescale, clock Hz, jitter ticks, gate s, duration s
        { PlanEstimators.Reciprocal, 100_000, 8, 80e6, 4, 0.02, 4.6 },
        { PlanEstimators.Regression, 100_000, 8, 80e6, 4, 0.02, 4.6 },
        { PlanEstimators.Reciprocal, 100_000, 64, 1e6, 5, 0.1, 22.5 },
        { PlanEstimators.Regression, 100_000, 64, 1e6, 5, 0.1, 22.5 },
        { PlanEstimators.Reciprocal, 2_000, 1, 1e6, 6, 0.05, 11.5 },
        { PlanEstimators.Regression, 2_000, 1, 1e6, 6, 0.05, 11.5 },
    };

    [Theory]
    [MemberData(nameof(EdgeCases))]
    public void Edge_gate_noise_matches_the_prediction(string estimator, double frequencyHz, int prescale, double clockHz, double jitterTicks, double gateS, double durationS)
    {
        var scene = new Scene
        {
            Seed = 97,
            DurationS = durationS,
            Oscillator = new SceneOscillator { FrequencyHz = frequencyHz, TempcoPpmPerK = 0, WhiteFmAdev1s = 0, FlickerAdev = 0 },
            Hardware = new SceneHardware { ClockHz = clockHz, Prescale = prescale, TimerBits = 64, TimestampMethod = TimestampMethod.Custom, JitterS = jitterTicks / clockHz },
        };
        var w = new MemoryCaptureWriter();
        new CaptureSimulator(new SceneModel(scene)).Run(w);
        var settings = new CounterSettings
        {
            ClockHz = clockHz,
            Prescale = prescale,
            GateSeconds = gateS,
            Estimator = estimator == PlanEstimators.Reciprocal ? EstimatorKind.Reciprocal : EstimatorKind.Regression,
            JitterTicks = jitterTicks,
        };
        Assert.True(settings.TryValidate(out string? err), err);
        var counter = new EdgeCounter(settings);
        var frequencies = new List<double>();
        foreach (var row in w.Rows)
        {
            if (counter.AddEdge((long)row.Tick, out GateResult g) && g.State == GateState.Ok)
            {
                frequencies.Add(g.FrequencyHz);
            }
        }

        var method = new TimestampPreset("custom", CaptureKind.Edges, jitterTicks / clockHz, clockHz, 0, 1e9, "test");
        double predicted = PlanBuilder.SigmaHz(estimator, method, frequencyHz, prescale, gateS);
        AssertMatches(frequencies, predicted, $"{estimator} {frequencyHz} Hz /{prescale}, {clockHz:G3} Hz clock, {jitterTicks} ticks, gate {gateS} s");
    }

    [Theory]
    [InlineData(100_000, 1e-3, 3.0, 0.05, 11.5)]
    [InlineData(100_000, 1e-3, 3.0, 0.2, 45)]
    [InlineData(20_000, 5e-3, 4.0, 0.1, 22.5)]
    public void Snapshot_gate_noise_matches_the_prediction(double frequencyHz, double readIntervalS, double readJitterTicks, double gateS, double durationS)
    {
        const double clockHz = 1e6;
        var scene = new Scene
        {
            Seed = 12,
            DurationS = durationS,
            Oscillator = new SceneOscillator { FrequencyHz = frequencyHz, TempcoPpmPerK = 0, WhiteFmAdev1s = 0, FlickerAdev = 0 },
            Hardware = new SceneHardware { Kind = CaptureKind.Snapshots, ClockHz = clockHz, TimerBits = 64, CountBits = 64, SnapshotIntervalS = readIntervalS, ReadJitterS = readJitterTicks / clockHz },
        };
        var w = new MemoryCaptureWriter();
        new CaptureSimulator(new SceneModel(scene)).Run(w);
        var settings = new CounterSettings { ClockHz = clockHz, GateSeconds = gateS, JitterTicks = readJitterTicks };
        Assert.True(settings.TryValidate(out string? err), err);
        var counter = new SnapshotCounter(settings);
        var frequencies = new List<double>();
        foreach (var row in w.Rows)
        {
            if (counter.AddSnapshot((long)row.Tick, (long)row.Count, out GateResult g) && g.State == GateState.Ok)
            {
                frequencies.Add(g.FrequencyHz);
            }
        }

        var method = new TimestampPreset("custom", CaptureKind.Snapshots, readJitterTicks / clockHz, clockHz, 1 / readIntervalS, 1e9, "test");
        double predicted = PlanBuilder.SigmaHz(PlanEstimators.SnapshotRegression, method, frequencyHz, 1, gateS);
        AssertMatches(frequencies, predicted, $"snapshots {frequencyHz} Hz, read every {readIntervalS} s, {readJitterTicks} ticks, gate {gateS} s");
    }

    private static void AssertMatches(List<double> frequencies, double predictedHz, string what)
    {
        Assert.True(frequencies.Count >= 200, $"{what}: only {frequencies.Count} gates");
        double mean = frequencies.Average();
        double sd = Math.Sqrt(frequencies.Sum(f => (f - mean) * (f - mean)) / (frequencies.Count - 1));
        double ratio = sd / predictedHz;
        Assert.True(Math.Abs(ratio - 1) <= Tolerance, $"{what}: measured {sd:G4} Hz over {frequencies.Count} gates, predicted {predictedHz:G4} Hz (ratio {ratio:F3})");
        Console.WriteLine($"plan noise check, {what}: measured {sd:G4} Hz, predicted {predictedHz:G4} Hz, ratio {ratio:F3}, {frequencies.Count} gates");
    }
}
