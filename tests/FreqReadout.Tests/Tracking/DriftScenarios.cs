using FreqReadout.Host.Bench;
using FreqReadout.Host.Simulation;
using FreqReadout.Readout;

namespace FreqReadout.Tests.Tracking;

/// <summary>
/// A regression scene for the drift tracker: a simulator scene (invented, built from the project's own physics), the targets
/// whose passes are scored, and a way to run it through the readout (and the bench's two plain ways) exactly as the
/// tracking-quality bench does. Tests assert on <see cref="Run"/>'s outcome; this class asserts nothing about the tracker.
/// </summary>
internal sealed class DriftScenario
{
    public DriftScenario(string name, string description, BenchScene bench)
    {
        Name = name;
        Description = description;
        Bench = bench;
    }

    /// <summary>Short name.</summary>
    public string Name { get; }

    /// <summary>What the scene is and what a good readout does with it.</summary>
    public string Description { get; }

    /// <summary>The scene, its measured gate noise and the scored targets (target k on leg k).</summary>
    public BenchScene Bench { get; }

    /// <summary>The simulator scene.</summary>
    public Scene Scene => Bench.Scene;

    /// <summary>
    /// Simulates the scene into memory and replays it through <c>CaptureGateSource</c> and <c>ReplaySession</c> with replay's
    /// default settings (or <paramref name="readout"/>; signal, beat side and search_hz come from the capture), plus the two
    /// plain ways; every scored pass is matched to an event (span overlap, host/Bench/README.md).
    /// The outcome's <c>Readout</c> is the replay report (events, re-baselines, noise, warnings); <c>Ways[0]</c> the readout's
    /// matches and false events.
    /// </summary>
    public BenchSceneOutcome Run(ReadoutSettings? readout = null) => QualityBench.Run(Bench, readout, CancellationToken.None);

    public override string ToString() => Name;
}

/// <summary>
/// Regression scenes for two of issue 8's numbered cases, built with the bench's own target placement (each target's truth
/// peak is a chosen multiple of the scene's measured gate noise; its pass lasts a chosen half-peak width). Invented scenes,
/// simulated; the assertions on the tracker belong to the tests that use them.
/// <list type="bullet">
/// <item><see cref="WarmToColdSettling"/> (case 1): a coil carried from a warm car into cold air: exponential settling from
/// 30 C towards 15 C with a 60 s time constant and a -20 ppm/K tempco (a cheap capacitor), so the search frequency starts
/// rising at 5 ppm/s and the rate falls by e every minute; 0.02 ppm gate noise (240 MHz timer, clean oscillator); eight passes
/// (four of each class, 10-30 x the gate noise, 0.3-2.5 s) in the first three minutes.</item>
/// <item><see cref="DriftRateOnset"/> (case 1): the same clean readout, flat through the baseline, then from 20 s a drift of
/// 0.03 Hz/s (0.3 ppm/s of 100 kHz, 15 gate noises a second) to the end; with or without passes after the onset.</item>
/// <item><see cref="MetalLeavesDuringBaseline"/> (case 4): the coil rests on a copper part (60 x the gate noise) when the
/// readout starts; at 3 s, inside replay's default settling and baseline capture (1 s + 5 s), it is lifted off within 0.3 s
/// and never comes back; six passes over other parts follow from 12 s. The leaving part is not a scored pass.</item>
/// </list>
/// </summary>
internal static class DriftScenarios
{
    private const double SearchHz = 100_000;

    /// <summary>Case 1: warm-to-cold settling, 5 ppm/s initial rate, tau 60 s, 0.02 ppm gate noise, with eight passes.</summary>
    public static DriftScenario WarmToColdSettling(long seed = 1)
    {
        Scene scene = Clean("warm-to-cold-settling", seed);
        scene.Temperature = new SceneTemperature { Kind = TemperatureProfileKind.Settling, StartC = 30, AmbientC = 15, TimeConstantS = 60 };
        scene.Oscillator.NominalTemperatureC = 30;
        scene.Oscillator.TempcoPpmPerK = -20; // rate at t = 0: tc (ambient - start) / tau = -20 x -15 / 60 = +5 ppm/s
        scene.DurationS = 200;
        var plans = Passes(scene, seed, new[] { 12.0, 30, 50, 70, 95, 120, 150, 180 });
        return new DriftScenario(
            "warm-to-cold settling",
            "settling 30 -> 15 C, tau 60 s, tempco -20 ppm/K: +5 ppm/s at first, 300 ppm in all; 0.02 ppm gate noise; 8 passes of 10-30 gate noises",
            Bench(scene, plans.Noise, plans.Targets, BenchKind.Settling, 5.0, 60, double.NaN));
    }

    /// <summary>Case 1: a drift-rate onset of 0.03 Hz/s (0.3 ppm/s) at 20 s, after the baseline, on the clean readout.</summary>
    public static DriftScenario DriftRateOnset(bool withPasses, long seed = 1)
    {
        Scene scene = Clean("drift-rate-onset", seed);
        const double onset = 20;
        const double end = 200;
        scene.Oscillator.NominalTemperatureC = 20;
        scene.Oscillator.TempcoPpmPerK = 10;
        scene.Temperature = new SceneTemperature
        {
            Kind = TemperatureProfileKind.Ramps,
            StartC = 20,
            Points = { new TemperaturePoint { TimeS = onset, TempC = 20 }, new TemperaturePoint { TimeS = end, TempC = 20 + (0.03 * (end - onset) / (SearchHz * 10e-6)) } },
        };
        scene.DurationS = end;
        var plans = Passes(scene, seed, withPasses ? new[] { 35.0, 55, 80, 100, 125, 145, 165, 185 } : Array.Empty<double>());
        return new DriftScenario(
            withPasses ? "drift-rate onset with passes" : "drift-rate onset",
            "flat, then from 20 s a ramp of 0.03 Hz/s (0.3 ppm/s) at 100 kHz; 0.02 ppm gate noise" + (withPasses ? "; 8 passes after the onset" : "; no target"),
            Bench(scene, plans.Noise, plans.Targets, BenchKind.Onset, 0.3, double.NaN, onset));
    }

    /// <summary>Case 4: metal leaving the coil during the baseline capture (at 3 s), then six passes from 12 s; no drift.</summary>
    public static DriftScenario MetalLeavesDuringBaseline(long seed = 1)
    {
        var scene = new Scene
        {
            Name = "metal-leaves-during-baseline",
            Note = "invented regression scene: the coil starts on a copper part and is lifted off at 3 s",
            Seed = seed,
            Coil = new SceneCoil { Turns = 45, MeanDiameterM = QualityBenchDefinition.StandardCoilDiameterM, WireDiameterM = 0.0005 },
            Oscillator = new SceneOscillator { FrequencyHz = SearchHz, WhiteFmAdev1s = 2e-8, FlickerAdev = 5e-9, TempcoPpmPerK = 0 },
            Hardware = new SceneHardware { ClockHz = 80e6, Prescale = 8, TimerBits = 32 },
            DurationS = 95,
        };
        double noiseHz = BenchSceneBuilder.MeasureGateNoiseHz(scene, 30, CancellationToken.None);
        double heightM = QualityBenchDefinition.CoilHeightRadii * scene.Coil.MeanDiameterM / 2;
        scene.Sweep = new SceneSweep { HeightM = heightM, TailS = 3, Legs = new List<SceneSweepLeg>() };
        var model = new SceneModel(scene, scene.Name);
        var rng = new SimulationRandom(seed, 200);
        TargetPlacementResult part = TargetPlacement.Place(model, "copper", "non-ferrous", 60 * noiseHz, heightM, rng);
        scene.Sweep.Legs.Add(new SceneSweepLeg { StartS = 3.0, FromM = 0, ToM = part.LegEndOffsetM, DurationS = 0.3 });
        scene.Targets.Add(new SceneTarget { Name = "t0 (leaves)", Material = "copper", RadiusM = part.RadiusM, DepthM = part.DepthM, PositionM = 0 });
        double[] starts = { 12, 22, 32, 45, 60, 80 };
        var plans = new List<BenchTargetPlan>();
        for (int i = 0; i < starts.Length; i++)
        {
            plans.Add(BenchSceneBuilder.AddTarget(scene, model, i + 1, Classes[i], Widths[i], Peaks[i], noiseHz, starts[i], rng));
        }

        return new DriftScenario(
            "metal leaves during the baseline",
            "the coil rests on a copper part (60 gate noises) and is lifted off at 3-3.3 s, inside the default baseline capture; 6 passes from 12 s; no drift; about 0.08 ppm gate noise",
            Bench(scene, noiseHz, plans, BenchKind.Ramp, 0, double.NaN, double.NaN));
    }

    private static readonly string[] Classes = { "ferrous", "non-ferrous", "ferrous", "non-ferrous", "ferrous", "non-ferrous", "ferrous", "non-ferrous" };
    private static readonly double[] Widths = { 0.4, 1.5, 0.8, 2.5, 0.3, 1.2, 2.0, 0.6 };
    private static readonly double[] Peaks = { 12, 25, 18, 30, 10, 22, 15, 28 };

    /// <summary>Search oscillator at 100 kHz divided by 8, input capture on a 240 MHz 32-bit timer, white FM 2e-9 at 1 s, flicker 5e-10.</summary>
    private static Scene Clean(string name, long seed) => new()
    {
        Name = name,
        Note = "invented regression scene for the drift tracker",
        Seed = seed,
        Coil = new SceneCoil { Turns = 45, MeanDiameterM = QualityBenchDefinition.StandardCoilDiameterM, WireDiameterM = 0.0005 },
        Oscillator = new SceneOscillator { FrequencyHz = SearchHz, WhiteFmAdev1s = 2e-9, FlickerAdev = 5e-10 },
        Hardware = new SceneHardware { ClockHz = 240e6, Prescale = 8, TimerBits = 32 },
    };

    /// <summary>Measures the gate noise, then adds passes starting at <paramref name="starts"/> (classes, widths and peaks from the lists above).</summary>
    private static (double Noise, List<BenchTargetPlan> Targets) Passes(Scene scene, long seed, double[] starts)
    {
        double noiseHz = BenchSceneBuilder.MeasureGateNoiseHz(scene, 30, CancellationToken.None);
        scene.Sweep = new SceneSweep { HeightM = QualityBenchDefinition.CoilHeightRadii * scene.Coil.MeanDiameterM / 2, TailS = 3, Legs = new List<SceneSweepLeg>() };
        var model = new SceneModel(scene, scene.Name);
        var rng = new SimulationRandom(seed, 200);
        var plans = new List<BenchTargetPlan>();
        for (int i = 0; i < starts.Length; i++)
        {
            plans.Add(BenchSceneBuilder.AddTarget(scene, model, i, Classes[i], Widths[i], Peaks[i], noiseHz, starts[i], rng));
        }

        return (noiseHz, plans);
    }

    private static BenchScene Bench(Scene scene, double noiseHz, IReadOnlyList<BenchTargetPlan> targets, BenchKind drift, double rate, double tau, double onset)
    {
        scene.Validate(scene.Name);
        return new BenchScene
        {
            Key = new BenchSceneKey(drift, BenchMode.Search, targets.Count == 0, 0, scene.Seed, scene.Seed),
            Scene = scene,
            GateNoiseHz = noiseHz,
            GateNoisePpm = noiseHz / SearchHz * 1e6,
            Drift = drift,
            RatePpmPerS = rate,
            TauSeconds = tau,
            OnsetSeconds = onset,
            Targets = targets,
        };
    }
}
