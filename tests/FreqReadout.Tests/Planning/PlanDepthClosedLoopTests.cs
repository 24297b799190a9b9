using FreqReadout.Counting;
using FreqReadout.Host.Bench;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Commands;
using FreqReadout.Host.Counting;
using FreqReadout.Host.Planning;
using FreqReadout.Host.Replay;
using FreqReadout.Host.Simulation;
using FreqReadout.Readout;
using Xunit.Abstractions;

namespace FreqReadout.Tests.Planning;

/// <summary>
/// Closes the loop on <c>plan</c>'s depth answer: a copper sphere (radius 20 mm) is swept 60 times under the default coil
/// (45 turns, 180 mm) at 0.8 and at 1.25 times the depth plan predicts, the simulated captures are replayed through the
/// counting core and the readout pipeline exactly as <c>replay</c> runs them (its defaults: threshold 5 sigma of the
/// tracked noise, 0.1 s gates; the estimator of the case), and the passes found are counted with the bench's pass matcher.
/// The issue asks for at least 95 % of passes found at 0.8x and at most 5 % at 1.25x. One case per way of counting:
/// pulse-counter reads, timestamped edges of the divided search oscillator with each estimator, and the beat note.
/// The scenes are invented for the test (seeded); the physics is the coil command's (docs/references.md: Wait 1951
/// sphere, exact loop field), shared by the simulator and the prediction.
/// </summary>
public class PlanDepthClosedLoopTests
{
    private const int Passes = 60;
    private const double SpeedMPerS = 0.3;
    private const double HeightM = 0.02;
    private const double RadiusM = 0.02;
    private const double SearchHz = 100_000;
    private const double BeatHz = 1_000;
    private readonly ITestOutputHelper _out;

    public PlanDepthClosedLoopTests(ITestOutputHelper output) => _out = output;

    /// <summary>The ways of counting tried: name, and what the scene, the prediction and the replay use.</summary>
    private sealed record Case(string Name, CaptureKind Kind, bool Beat, int Prescale, double JitterS, double ReadIntervalS, string Estimator);

    private static Case Get(string name) => name switch
    {
        "snapshots" => new Case(name, CaptureKind.Snapshots, false, 1, 3e-6, 1e-3, PlanEstimators.SnapshotRegression),
        "edges-regression" => new Case(name, CaptureKind.Edges, false, 16, 5e-6, 0, PlanEstimators.Regression),
        "edges-reciprocal" => new Case(name, CaptureKind.Edges, false, 16, 2e-6, 0, PlanEstimators.Reciprocal),
        "beat-reciprocal" => new Case(name, CaptureKind.Edges, true, 1, 20e-6, 0, PlanEstimators.Reciprocal),
        _ => throw new ArgumentException(name),
    };

    public static TheoryData<string> Cases() => new() { "snapshots", "edges-regression", "edges-reciprocal", "beat-reciprocal" };

    private static Scene SceneAt(Case c, double depthM, long seed) => new()
    {
        Seed = seed,
        Oscillator = new SceneOscillator { FrequencyHz = SearchHz, TempcoPpmPerK = 0 },
        Reference = c.Beat ? new SceneReference { FrequencyHz = SearchHz - BeatHz } : null,
        Hardware = c.Kind == CaptureKind.Snapshots
            ? new SceneHardware { Kind = CaptureKind.Snapshots, ClockHz = 1e6, TimerBits = 64, CountBits = 64, SnapshotIntervalS = c.ReadIntervalS, ReadJitterS = c.JitterS }
            : new SceneHardware { ClockHz = 1e6, TimerBits = 64, Prescale = c.Prescale, TimestampMethod = TimestampMethod.Custom, JitterS = c.JitterS },
        Targets = { new SceneTarget { Name = "t0", Material = "copper", RadiusM = RadiusM, DepthM = depthM, PositionM = 0.6 } },
        Sweep = new SceneSweep { StartM = 0, EndM = 1.2, SpeedMPerS = SpeedMPerS, HeightM = HeightM, Passes = Passes, PauseS = 1.0, LeadInS = 10, TailS = 2, Alternate = true },
    };

    private static TimestampPreset Method(Case c) => c.Kind == CaptureKind.Snapshots
        ? new TimestampPreset(TimestampPresets.Custom, CaptureKind.Snapshots, c.JitterS, 1e6, 1 / c.ReadIntervalS, 1e7, "test")
        : new TimestampPreset(TimestampPresets.Custom, CaptureKind.Edges, c.JitterS, 1e6, 0, 1e7, "test");

    private static DepthRow Predicted(Case c)
    {
        var model = new SceneModel(SceneAt(c, 0.1, 1));
        Assert.True(MaterialPresets.TryGet("copper", null, out Material copper));
        var inputs = new PlanInputs
        {
            Signal = c.Beat ? "beat" : "search",
            SearchHz = SearchHz,
            BeatHz = BeatHz,
            SearchPrescale = c.Beat ? 1 : c.Prescale,
            BeatPrescale = c.Beat ? c.Prescale : 1,
            GateS = 0.1,
            GatesS = new[] { 0.1 },
            Methods = new[] { Method(c) },
            Target = new PlanTarget
            {
                Coil = model.Coil,
                InductanceH = model.InductanceH,
                Material = copper,
                RadiusM = RadiusM,
                HeightM = HeightM,
                SpeedMPerS = SpeedMPerS,
                ThresholdSigma = new ReadoutSettings().ThresholdSigma,
            },
        };
        DepthRow row = PlanBuilder.Build(inputs).Depth!.Rows.Single(r => r.Estimator == c.Estimator);
        Assert.NotNull(row.DepthM);
        Assert.False(row.BeyondRange);
        Assert.False(row.Smeared);
        return row;
    }

    private double FoundFraction(Case c, double depthM, long seed, out double noiseHz)
    {
        var model = new SceneModel(SceneAt(c, depthM, seed));
        var simulator = new CaptureSimulator(model);
        var capture = new MemoryCapture(simulator.Metadata, "plan-depth");
        SimulationTruth truth = simulator.Run(capture);
        var defaults = new ReadoutCommandSettings();
        if (c.Estimator == PlanEstimators.Reciprocal)
        {
            defaults.Estimator = "reciprocal";
        }

        CounterSettings options = defaults.BuildOptions(out string? optionError) ?? throw new InvalidOperationException(optionError);
        using ICaptureReader reader = capture.OpenReader();
        ReadoutSettings readout = defaults.BuildReadoutSettings(reader.Metadata, out string? readoutError) ?? throw new InvalidOperationException(readoutError);
        ReplayReport report = new ReplaySession(readout, null).Run(new CaptureGateSource(reader, options), CancellationToken.None);
        TargetTruth target = truth.Targets[0];
        var passes = new List<BenchPass>();
        for (int i = 0; i < model.Plan.Passes.Count; i++)
        {
            SweepPass leg = model.Plan.Passes[i];
            PassTruth pass = target.Passes[i];
            passes.Add(new BenchPass(target.Name, i, leg.StartTimeS, leg.EndTimeS, pass.PeakTimeS, pass.PeakSearchShiftHz, target.MaterialClass, target.SignRuleClass, 0));
        }

        BenchMatchResult match = BenchPassMatcher.Match(passes, report.Events);
        int found = match.Matches.Count(m => m.Event != null);
        noiseHz = report.NoiseHz ?? double.NaN;
        _out.WriteLine($"{c.Name}, depth {depthM * 1000:F1} mm: {found} of {passes.Count} passes found, truth peak {passes.Average(p => Math.Abs(p.PeakShiftHz)):G4} Hz, tracked noise {noiseHz:G4} Hz, {match.Unmatched.Count} other events");
        return (double)found / passes.Count;
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void At_0_8_of_the_predicted_depth_at_least_95_percent_of_passes_are_found(string name)
    {
        Case c = Get(name);
        DepthRow predicted = Predicted(c);
        _out.WriteLine($"{name}: predicted depth {predicted.DepthM * 1000:F1} mm, noise {predicted.NoiseHz:G4} Hz, threshold {predicted.ThresholdHz:G4} Hz");
        Assert.True(FoundFraction(c, 0.8 * predicted.DepthM!.Value, 21, out _) >= 0.95);
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void At_1_25_of_the_predicted_depth_at_most_5_percent_of_passes_are_found(string name)
    {
        Case c = Get(name);
        Assert.True(FoundFraction(c, 1.25 * Predicted(c).DepthM!.Value, 22, out _) <= 0.05);
    }

    [Theory]
    [InlineData("snapshots")]
    [InlineData("beat-reciprocal")]
    public void Without_a_target_in_reach_the_tracked_noise_is_the_predicted_gate_noise(string name)
    {
        // The readout's threshold is threshold_sigma x its tracked noise; plan's depth assumes that noise is the predicted
        // standard deviation of a gate's frequency. A target 4 m down changes nothing (shift about 1e-8 Hz), so the run's
        // target-free noise (replay's noise_hz) must be the prediction within 20 %.
        Case c = Get(name);
        FoundFraction(c, 4.0, 23, out double noiseHz);
        double predicted = Predicted(c).NoiseHz;
        _out.WriteLine($"{name}: tracked noise {noiseHz:G4} Hz, predicted {predicted:G4} Hz");
        Assert.InRange(noiseHz / predicted, 0.8, 1.2);
    }
}
