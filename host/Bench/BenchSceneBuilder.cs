using FreqReadout.Host.Captures;
using FreqReadout.Host.Simulation;
using static FreqReadout.Host.Bench.QualityBenchDefinition;

namespace FreqReadout.Host.Bench;

/// <summary>
/// Draws one bench scene from its seed (host/Bench/README.md gives the same rules in words). Order of the draws, all from
/// stream 100 of the scene's seed: the counting hardware and oscillators of the mode; then (after measuring the gate noise
/// on a drift-free twin) the targets and their legs; then the drift; then the mains pickup of a mains scene.
/// <para>Hardware by mode (chosen so a scene simulates in seconds while the gate noise spans 0.02-25 ppm):</para>
/// <list type="bullet">
/// <item>search: 50-150 kHz divided by 8 (6-19 k recorded edges/s), input capture on a 32-bit timer at 80 MHz or 240 MHz
/// (even odds; the faster clock stands for a time-to-digital counter and is what takes 0.1 s reciprocal gates down to
/// 0.02 ppm), white FM log-uniform 2e-9..5e-8 at 1 s, flicker a quarter of it: gate noise about 0.02-0.2 ppm;</item>
/// <item>beat above / below: reference on the given side; even odds of (a) search 80-120 kHz, input capture at 80 MHz,
/// beat 3-8 kHz, white FM of each oscillator log-uniform 2e-8..5e-7 (gate noise about 0.1-2 ppm) or (b) search 20-40 kHz,
/// software time stamps on a 1 MHz timer with 5-20 us rms jitter (log-uniform), a beat whose period is 40-80 rms jitters,
/// white FM 2e-8 (about 4-18 ppm);</item>
/// <item>snapshots: 200-400 kHz, a pulse-counter read every 10 ms (the read schedule wanders by +-10 %), stamped on a
/// 1 MHz timer with 1 us rms mismatch, white FM 2e-8: about 15-25 ppm.</item>
/// </list>
/// The coil (45 turns of 0.5 mm wire) is the usual 180 mm one unless a carbon-steel part that reads ferrous (below its
/// crossover) could not reach 40 x the gate noise under it at a depth of 0.3 coil radii; then it is the largest coil, in steps
/// of 10 %, under which the best such part can (<see cref="CoilDiameterM"/>): a part's fractional shift scales as (part
/// radius / coil radius)^3 and a ferrous-reading part is smaller than its crossover radius, so the noisiest readouts
/// (pulse-counter snapshots at 200-400 kHz) get probe-sized coils. The coil moves 0.2 coil radii above the surface. No faults,
/// no temp_c column.
/// <para>Targets: the classes of a kind and mode's targets are dealt from a shuffled list that is exactly half ferrous, half
/// non-ferrous, by the sign rule's class at the operating frequency (the class the truth scores): a ferrous one is carbon
/// steel below its crossover; a non-ferrous one is carbon steel above its crossover (one in three, when such a part fits
/// under the coil) or copper, aluminium or brass. Each has a pass width uniform in 0.2-3 s and a peak uniform in 8-40 x the gate noise; <see cref="TargetPlacement"/>
/// finds its size and depth and the leg that gives that pass.</para>
/// </summary>
public static class BenchSceneBuilder
{
    private static readonly string[] NonFerrous = { "copper", "aluminium", "brass" };

    /// <summary>Draws the scene of <paramref name="key"/>, measuring its gate noise by simulating a drift-free twin.</summary>
    public static BenchScene Build(BenchSceneKey key, QualityBenchSize size, CancellationToken cancellationToken)
    {
        var rng = new SimulationRandom(key.Seed, 100);
        var scene = new Scene
        {
            Name = "bench-" + key.Name.Replace('/', '-'),
            Note = "invented bench scene drawn from its seed (tracking-quality bench)",
            Seed = key.Seed,
            Coil = new SceneCoil { Turns = 45, MeanDiameterM = StandardCoilDiameterM, WireDiameterM = 0.0005 },
        };
        DrawHardware(scene, key.Mode, rng);

        double noiseHz = MeasureGateNoiseHz(scene, size.CalibrationSeconds, cancellationToken);
        double noisePpm = noiseHz / scene.Oscillator.FrequencyHz!.Value * 1e6;
        scene.Coil.MeanDiameterM = CoilDiameterM(scene.Oscillator.FrequencyHz!.Value, MaxPeakNoise * noiseHz);
        var model0 = new SceneModel(scene, scene.Name);
        double heightM = CoilHeightRadii * model0.Coil.MeanRadiusM;

        var targets = new List<BenchTargetPlan>();
        double durationS;
        scene.Sweep = new SceneSweep { HeightM = heightM, TailS = TailSeconds };
        if (key.DriftOnly)
        {
            durationS = size.DriftSceneSeconds;
        }
        else
        {
            IReadOnlyList<string> classes = ClassesOf(key, size);
            var legs = new List<SceneSweepLeg>();
            scene.Sweep.Legs = legs;
            double t = LeadInSeconds + (FirstLegJitterSeconds * rng.NextDouble());
            for (int k = 0; k < classes.Count; k++)
            {
                cancellationToken.ThrowIfCancellationRequested();
                double width = Uniform(rng, MinPassSeconds, MaxPassSeconds);
                double multiple = Uniform(rng, MinPeakNoise, MaxPeakNoise);
                if (k > 0)
                {
                    t += Uniform(rng, MinGapSeconds, MaxGapSeconds);
                }

                targets.Add(AddTarget(scene, model0, k, classes[k], width, multiple, noiseHz, t, rng));
                t = legs[^1].StartS + legs[^1].DurationS;
            }

            durationS = t + TailSeconds;
        }

        scene.DurationS = durationS;
        BenchKind drift = key.Kind != BenchKind.Mains ? key.Kind : (BenchKind)(int)(rng.NextDouble() * 3);
        double rate = Uniform(rng, MinRatePpmPerS, MaxRatePpmPerS) * (rng.NextDouble() < 0.5 ? -1 : 1);
        double tau = double.NaN;
        double onset = double.NaN;
        switch (drift)
        {
            case BenchKind.Settling:
            {
                // Warm to cold or cold to warm: the rate at t = 0 is tc (ambient - start) / tau.
                tau = Uniform(rng, MinTauSeconds, MaxTauSeconds);
                double half = TemperatureSwingK / 2;
                bool warmToCold = rng.NextDouble() < 0.5;
                double start = warmToCold ? 20 + half : 20 - half;
                double ambient = warmToCold ? 20 - half : 20 + half;
                scene.Temperature = new SceneTemperature { Kind = TemperatureProfileKind.Settling, StartC = start, AmbientC = ambient, TimeConstantS = tau };
                scene.Oscillator.NominalTemperatureC = start;
                scene.Oscillator.TempcoPpmPerK = rate * tau / (ambient - start);
                break;
            }

            case BenchKind.Ramp:
                scene.Temperature = new SceneTemperature { Kind = TemperatureProfileKind.Ramps, StartC = 20, Points = { new TemperaturePoint { TimeS = durationS, TempC = 20 + TemperatureSwingK } } };
                scene.Oscillator.NominalTemperatureC = 20;
                scene.Oscillator.TempcoPpmPerK = rate * durationS / TemperatureSwingK;
                break;
            default:
            {
                onset = Uniform(rng, EarliestOnsetSeconds, Math.Max(EarliestOnsetSeconds, durationS - OnsetBeforeEndSeconds));
                scene.Temperature = new SceneTemperature
                {
                    Kind = TemperatureProfileKind.Ramps,
                    StartC = 20,
                    Points = { new TemperaturePoint { TimeS = onset, TempC = 20 }, new TemperaturePoint { TimeS = durationS, TempC = 20 + TemperatureSwingK } },
                };
                scene.Oscillator.NominalTemperatureC = 20;
                scene.Oscillator.TempcoPpmPerK = rate * (durationS - onset) / TemperatureSwingK;
                break;
            }
        }

        if (key.Kind == BenchKind.Mains)
        {
            scene.Mains = new SceneMains
            {
                DeviationPpm = Uniform(rng, MinMainsNoise, MaxMainsNoise) * noisePpm,
                FrequencyHz = (rng.NextDouble() < 0.5 ? 50.0 : 60.0) + Uniform(rng, -MainsOffsetHz, MainsOffsetHz),
                PhaseDeg = Uniform(rng, 0, 360),
            };
        }

        scene.Validate(scene.Name);
        return new BenchScene
        {
            Key = key,
            Scene = scene,
            GateNoiseHz = noiseHz,
            GateNoisePpm = noisePpm,
            Drift = drift,
            RatePpmPerS = rate,
            TauSeconds = tau,
            OnsetSeconds = onset,
            Targets = targets,
        };
    }

    /// <summary>
    /// Adds target <paramref name="index"/> (at 20 m x index along the line) and its leg (starting at
    /// <paramref name="startSeconds"/>, in a direction drawn from <paramref name="random"/>) to <paramref name="scene"/>, whose
    /// <c>sweep.legs</c> list must exist and hold the earlier legs. The part reads <paramref name="signRuleClass"/>: carbon
    /// steel below its crossover for ferrous; for non-ferrous, carbon steel above its crossover with probability 1/3 when such
    /// a part fits under the coil, else copper, aluminium or brass. Its truth peak is <paramref name="peakNoise"/> x
    /// <paramref name="gateNoiseHz"/> and its half-peak width lasts <paramref name="passSeconds"/> (<see cref="TargetPlacement"/>).
    /// </summary>
    /// <param name="scene">The scene (coil, height, oscillator already set).</param>
    /// <param name="model">A model of the scene's coil and oscillator (targets and legs are not used).</param>
    /// <param name="index">Target and leg number.</param>
    /// <param name="signRuleClass">ferrous or non-ferrous.</param>
    /// <param name="passSeconds">Full width at half peak of the pass, s.</param>
    /// <param name="peakNoise">Truth peak in gate-noise units.</param>
    /// <param name="gateNoiseHz">The scene's gate noise, Hz.</param>
    /// <param name="startSeconds">Leg start, s.</param>
    /// <param name="random">Draws.</param>
    /// <exception cref="InvalidOperationException">No part of the class reaches the peak under this coil.</exception>
    public static BenchTargetPlan AddTarget(Scene scene, SceneModel model, int index, string signRuleClass, double passSeconds, double peakNoise, double gateNoiseHz, double startSeconds, SimulationRandom random)
    {
        bool ferrous = signRuleClass == "ferrous";
        bool steel = ferrous || random.NextDouble() < SteelAboveCrossoverShare;
        string metal = NonFerrous[(int)(random.NextDouble() * NonFerrous.Length) % NonFerrous.Length];
        string material = steel ? "carbon_steel" : metal;
        double heightM = scene.Sweep.HeightM;
        if (!TargetPlacement.TryPlace(model, material, signRuleClass, peakNoise * gateNoiseHz, heightM, random, out TargetPlacementResult? placed, out string? why))
        {
            if (ferrous)
            {
                throw new InvalidOperationException(why);
            }

            // Steel above its crossover does not fit this coil (it is larger than half the coil's radius): a non-ferrous metal.
            material = metal;
            placed = TargetPlacement.Place(model, material, signRuleClass, peakNoise * gateNoiseHz, heightM, random);
        }

        TargetPlacementResult place = placed!;
        double speed = 2.0 * place.HalfPeakOffsetM / passSeconds;
        double legSeconds = 2.0 * place.LegEndOffsetM / speed;
        double x = index * TargetSpacingM;
        bool forward = random.NextDouble() < 0.5;
        scene.Sweep.Legs!.Add(new SceneSweepLeg
        {
            StartS = startSeconds,
            FromM = forward ? x - place.LegEndOffsetM : x + place.LegEndOffsetM,
            ToM = forward ? x + place.LegEndOffsetM : x - place.LegEndOffsetM,
            DurationS = legSeconds,
        });
        scene.Targets.Add(new SceneTarget { Name = $"t{index}", Material = material, RadiusM = place.RadiusM, DepthM = place.DepthM, PositionM = x });
        return new BenchTargetPlan(index, signRuleClass, material, passSeconds, peakNoise, place);
    }

    /// <summary>
    /// The coil diameter for a scene at <paramref name="searchHz"/> whose largest peak is <paramref name="maxPeakHz"/>: 0.18 m,
    /// or 0.9, 0.81, ... times that (down to 0.01 m) until a carbon-steel sphere of the radius that maximises r^3 Re M among
    /// those below 0.85 of the crossover radius (at most half the coil's radius) gives at least that peak on the coil's axis
    /// with its centre 0.3 coil radii (at least 1.5 sphere radii) below a surface 0.2 coil radii under the coil.
    /// </summary>
    public static double CoilDiameterM(double searchHz, double maxPeakHz)
    {
        MaterialPresets.TryGet("carbon_steel", null, out Material steel);
        double crossoverRadius = Math.Sqrt(1.641 * steel.RelativePermeability / (Math.PI * PhysicalConstants.Mu0HPerM * steel.ConductivitySPerM * searchHz));
        double bestRadius = 0;
        double bestStrength = 0;
        for (int i = 0; i <= 60; i++)
        {
            double a = 0.001 + (((TargetPlacement.FerrousRadiusFraction * crossoverRadius) - 0.001) * i / 60.0);
            double strength = a * a * a * SpherePolarizability.Normalised(a, steel.ConductivitySPerM, steel.RelativePermeability, searchHz).Real;
            if (a > 0 && strength > bestStrength)
            {
                bestStrength = strength;
                bestRadius = a;
            }
        }

        double diameter = StandardCoilDiameterM;
        while (diameter * CoilShrinkFactor >= MinCoilDiameterM)
        {
            var coil = new SearchCoil(45, diameter, 0, 0, 0.0005);
            double r = coil.MeanRadiusM;
            double a = Math.Min(bestRadius, 0.5 * r); // placement draws radii up to half the coil's radius
            double axial = (CoilHeightRadii * r) + Math.Max(FerrousReachDepthRadii * r, 1.5 * a);
            var m = SpherePolarizability.PolarizabilityM3(a, steel.ConductivitySPerM, steel.RelativePermeability, searchHz);
            double dl = CoilTargetCoupling.OnAxisInductanceChangeH(coil, m, axial);
            if (bestRadius > 0 && Math.Abs(searchHz * LcResonance.FractionalShift(coil.WheelerInductanceH, dl)) >= maxPeakHz)
            {
                break;
            }

            diameter *= CoilShrinkFactor;
        }

        return diameter;
    }

    /// <summary>
    /// Standard deviation (n - 1) of the 0.1 s reciprocal gates (<see cref="PlainReciprocalGates"/>) of a twin of
    /// <paramref name="scene"/> with the same hardware and oscillators but constant temperature, no targets and no mains,
    /// <paramref name="seconds"/> long, on a seed of its own. Counted signal, Hz.
    /// </summary>
    /// <exception cref="InvalidOperationException">Fewer than 3 gates closed in <paramref name="seconds"/>.</exception>
    public static double MeasureGateNoiseHz(Scene scene, double seconds, CancellationToken cancellationToken)
    {
        var twin = new Scene
        {
            Name = scene.Name + "-noise",
            Seed = scene.Seed ^ 0x2545F4914F6CDD1DL,
            DurationS = seconds,
            Coil = scene.Coil,
            Oscillator = scene.Oscillator,
            Reference = scene.Reference,
            Hardware = scene.Hardware,
        };
        var simulator = new CaptureSimulator(new SceneModel(twin, twin.Name));
        var capture = new MemoryCapture(simulator.Metadata, twin.Name);
        simulator.Run(capture, null, cancellationToken);
        List<PlainGate> gates = PlainReciprocalGates.Compute(capture);
        if (gates.Count < 3)
        {
            throw new InvalidOperationException($"{twin.Name}: only {gates.Count} gates in {seconds} s");
        }

        double mean = gates.Average(g => g.FrequencyHz);
        double sum = gates.Sum(g => (g.FrequencyHz - mean) * (g.FrequencyHz - mean));
        return Math.Sqrt(sum / (gates.Count - 1));
    }

    private static void DrawHardware(Scene scene, BenchMode mode, SimulationRandom rng)
    {
        switch (mode)
        {
            case BenchMode.Search:
            {
                double white = LogUniform(rng, 2e-9, 5e-8);
                scene.Oscillator = new SceneOscillator { FrequencyHz = Uniform(rng, 50e3, 150e3), WhiteFmAdev1s = white, FlickerAdev = white / 4 };
                scene.Hardware = new SceneHardware { ClockHz = rng.NextDouble() < 0.5 ? 80e6 : 240e6, Prescale = 8, TimerBits = 32, TimestampMethod = TimestampMethod.InputCapture };
                break;
            }

            case BenchMode.BeatAbove:
            case BenchMode.BeatBelow:
            {
                bool capture = rng.NextDouble() < 0.5;
                double search = capture ? Uniform(rng, 80e3, 120e3) : Uniform(rng, 20e3, 40e3);
                double jitter = capture ? 0.0 : LogUniform(rng, 5e-6, 20e-6);

                // Software stamps: the beat period is at least 40 rms jitters (the jitter stays within 2.5 % of a period, well
                // inside the counter's glitch guard at half a period).
                double beat = capture ? Uniform(rng, 3e3, 8e3) : Uniform(rng, 0.5, 1.0) / (40 * jitter);
                double white = capture ? LogUniform(rng, 2e-8, 5e-7) : 2e-8;
                scene.Oscillator = new SceneOscillator { FrequencyHz = search, WhiteFmAdev1s = white, FlickerAdev = white / 4 };
                scene.Reference = new SceneReference
                {
                    FrequencyHz = mode == BenchMode.BeatAbove ? search - beat : search + beat,
                    WhiteFmAdev1s = white,
                    FlickerAdev = white / 4,
                };
                scene.Hardware = capture
                    ? new SceneHardware { ClockHz = 80e6, Prescale = 1, TimerBits = 32, TimestampMethod = TimestampMethod.InputCapture }
                    : new SceneHardware { ClockHz = 1e6, Prescale = 1, TimerBits = 32, TimestampMethod = TimestampMethod.Custom, JitterS = jitter };
                break;
            }

            default:
                scene.Oscillator = new SceneOscillator { FrequencyHz = Uniform(rng, 200e3, 400e3), WhiteFmAdev1s = 2e-8, FlickerAdev = 5e-9 };
                scene.Hardware = new SceneHardware
                {
                    Kind = CaptureKind.Snapshots,
                    ClockHz = 1e6,
                    Prescale = 1,
                    TimerBits = 64,
                    CountBits = 64,
                    SnapshotIntervalS = 0.01,
                    ReadJitterS = 1e-6,
                };
                break;
        }
    }

    /// <summary>The classes of this scene's targets: the group's list (exactly half ferrous, shuffled by the group seed), this scene's slice.</summary>
    private static IReadOnlyList<string> ClassesOf(BenchSceneKey key, QualityBenchSize size)
    {
        int total = size.TargetScenesPerMode * size.TargetsPerScene;
        var all = new string[total];
        for (int i = 0; i < total; i++)
        {
            all[i] = i < total / 2 ? "ferrous" : "non-ferrous";
        }

        var shuffle = new SimulationRandom(key.GroupSeed, 101);
        for (int i = total - 1; i > 0; i--)
        {
            int j = (int)(shuffle.NextDouble() * (i + 1));
            (all[i], all[j]) = (all[j], all[i]);
        }

        return all.Skip(key.Index * size.TargetsPerScene).Take(size.TargetsPerScene).ToArray();
    }

    private static double Uniform(SimulationRandom rng, double lo, double hi) => lo + ((hi - lo) * rng.NextDouble());

    private static double LogUniform(SimulationRandom rng, double lo, double hi) => Math.Exp(Uniform(rng, Math.Log(lo), Math.Log(hi)));
}
