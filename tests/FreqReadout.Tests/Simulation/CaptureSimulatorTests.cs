using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Simulation;

public class CaptureSimulatorTests
{
    /// <summary>A quiet, target-free scene: only what a test switches on.</summary>
    private static Scene Quiet(double frequencyHz = 50_000, double durationS = 0.5)
    {
        return new Scene
        {
            Name = "test",
            Seed = 7,
            DurationS = durationS,
            Oscillator = new SceneOscillator { FrequencyHz = frequencyHz, TempcoPpmPerK = 0, WhiteFmAdev1s = 0, FlickerAdev = 0 },
            Hardware = new SceneHardware { ClockHz = 80e6, TimerBits = 64 },
        };
    }

    private static (MemoryCaptureWriter Writer, SimulationTruth Truth, CaptureSimulator Sim) Run(Scene scene, bool keep = true)
    {
        var sim = new CaptureSimulator(new SceneModel(scene));
        var w = new MemoryCaptureWriter(keep);
        var truth = sim.Run(w);
        return (w, truth, sim);
    }

    /// <summary>Least-squares slope of tick on edge index (unwrapped), in ticks per recorded edge. Independent of the counting core.</summary>
    private static double SlopeTicks(IReadOnlyList<long> ticks)
    {
        int n = ticks.Count;
        double mi = (n - 1) / 2.0;
        double t0 = ticks[0];
        double mt = 0;
        for (int i = 0; i < n; i++) mt += ticks[i] - t0;
        mt /= n;
        double sxy = 0, sxx = 0;
        for (int i = 0; i < n; i++)
        {
            sxy += (i - mi) * (ticks[i] - t0 - mt);
            sxx += (i - mi) * (i - mi);
        }

        return sxy / sxx;
    }

    private static List<long> Unwrap(IEnumerable<CaptureRow> rows, int bits)
    {
        var list = new List<long>();
        long last = 0;
        ulong prev = 0;
        bool first = true;
        ulong mod = bits == 64 ? 0 : 1UL << bits;
        foreach (var r in rows)
        {
            if (first)
            {
                last = (long)r.Tick;
                first = false;
            }
            else
            {
                ulong d = bits == 64 ? r.Tick - prev : (r.Tick - prev + mod) % mod;
                last += (long)d;
            }

            prev = r.Tick;
            list.Add(last);
        }

        return list;
    }

    [Fact]
    public void SameSeed_SameRows_DifferentSeed_DifferentRows()
    {
        var s = Quiet();
        s.Oscillator.WhiteFmAdev1s = 1e-7;
        s.Oscillator.FlickerAdev = 1e-8;
        s.Hardware.JitterS = 5e-9;
        s.Hardware.TimestampMethod = TimestampMethod.Custom;
        s.Faults.GlitchesPerS = 5;
        var a = Run(s).Writer.Rows;
        var b = Run(s).Writer.Rows;
        Assert.Equal(a.Count, b.Count);
        Assert.True(a.SequenceEqual(b));
        s.Seed = 8;
        var c = Run(s).Writer.Rows;
        Assert.False(a.SequenceEqual(c));
    }

    [Fact]
    public void StaticScene_EdgesGiveTheIntendedFrequency()
    {
        // Self-consistency (derived): with no noise, drift or target, the least-squares edge rate equals the intended
        // frequency within clock quantisation (12.5 ns over 0.5 s: below 1e-7 relative).
        var scene = Quiet(50_000);
        var (w, truth, sim) = Run(scene);
        Assert.InRange(w.Rows.Count, 24_999, 25_001);
        double slope = SlopeTicks(Unwrap(w.Rows, 64));
        double f = 80e6 / slope;
        Assert.Equal(50_000, f, 50_000 * 1e-7);
        Assert.Equal(50_000, sim.Model.CountedIntendedHz(0.25), 1e-9);
        Assert.True(w.Completed);
        Assert.Equal(truth.Rows, w.RowCount);
    }

    [Fact]
    public void Prescaler_DividesRecordedRate()
    {
        var scene = Quiet(64_000);
        scene.Hardware.Prescale = 64;
        var (w, _, sim) = Run(scene);
        Assert.InRange(w.Rows.Count, 499, 501);
        Assert.Equal(64, sim.Metadata.Prescale);
        Assert.Equal(64_000, 64 * 80e6 / SlopeTicks(Unwrap(w.Rows, 64)), 64_000 * 1e-6);
    }

    [Fact]
    public void TimerWraps_AppearWithNarrowTimers()
    {
        var scene = Quiet(30_000, 0.2);
        scene.Hardware.ClockHz = 8e6;
        scene.Hardware.TimerBits = 16;
        scene.Hardware.Prescale = 4;
        var (w, truth, _) = Run(scene);
        Assert.All(w.Rows, r => Assert.True(r.Tick < 65536));
        int decreases = 0;
        for (int i = 1; i < w.Rows.Count; i++) if (w.Rows[i].Tick < w.Rows[i - 1].Tick) decreases++;
        // 0.2 s at 8 MHz is 1.6e6 ticks: 24 or 25 wraps of 65536.
        Assert.InRange(decreases, 24, 25);
        Assert.Equal(decreases, truth.TimerWraps);
        Assert.Equal(30_000, 4 * 8e6 / SlopeTicks(Unwrap(w.Rows, 16)), 30_000 * 1e-5);
    }

    [Fact]
    public void Glitches_AppearAsShortIntervals_WhenAsked()
    {
        var scene = Quiet(50_000, 2.0);
        scene.Faults.GlitchesPerS = 20;
        var (w, truth, _) = Run(scene);
        var t = Unwrap(w.Rows, 64);
        int shortOnes = 0;
        for (int i = 1; i < t.Count; i++) if (t[i] - t[i - 1] < 0.5 * 1600) shortOnes++;
        Assert.True(truth.GlitchCount > 10, $"expected about 40 glitches, got {truth.GlitchCount}");
        Assert.Equal(truth.GlitchCount, shortOnes);
        Assert.Equal(truth.GlitchCount, truth.GlitchTimesS.Count);
        // Without the fault, none.
        var clean = Run(Quiet(50_000, 2.0)).Writer.Rows;
        var tc = Unwrap(clean, 64);
        for (int i = 1; i < tc.Count; i++) Assert.InRange(tc[i] - tc[i - 1], 1599, 1601);
    }

    [Fact]
    public void Dropouts_AppearAsLongGaps_WhenAsked()
    {
        var scene = Quiet(50_000, 2.0);
        scene.Faults.DropoutsPerS = 5;
        scene.Faults.DropoutS = 0.004;
        var (w, truth, _) = Run(scene);
        var t = Unwrap(w.Rows, 64);
        int gaps = 0;
        for (int i = 1; i < t.Count; i++) if (t[i] - t[i - 1] > 8 * 1600) gaps++;
        Assert.True(truth.DropoutCount >= 3, $"expected about 10 dropouts, got {truth.DropoutCount}");
        Assert.Equal(truth.DropoutCount, gaps);
    }

    [Fact]
    public void Streaming_DoesNotHoldEdges()
    {
        // 2 M edges (20 s at 100 kHz) into a counting-only writer: the simulator itself may allocate only a small,
        // size-independent amount (held edges would be 16 MB or more).
        var scene = Quiet(100_000, 20.0);
        scene.Oscillator.WhiteFmAdev1s = 1e-8;
        var sim = new CaptureSimulator(new SceneModel(scene));
        var w = new MemoryCaptureWriter(keep: false);
        long before = GC.GetAllocatedBytesForCurrentThread();
        var truth = sim.Run(w);
        long allocated = GC.GetAllocatedBytesForCurrentThread() - before;
        Assert.InRange(w.RowCount, 1_999_998, 2_000_002);
        Assert.True(allocated < 1_000_000, $"allocated {allocated} bytes for {w.RowCount} edges");
        Assert.Equal(truth.Rows, w.RowCount);
    }

    [Fact]
    public void Drift_FollowsTemperatureTimesTempcoFromParts()
    {
        // docs/references.md: df/f = -(alpha_L + alpha_C)/2, copper expansion 16.5 ppm/K (CRC, memory), polystyrene about
        // -125 ppm/K (secondary sources): +54.25 ppm/K. A ramp of +2 K over 1 s at 100 kHz: +10.85 Hz.
        var scene = Quiet(100_000, 1.0);
        scene.Oscillator.TempcoPpmPerK = null;
        scene.Oscillator.Capacitor = CapacitorDielectric.Polystyrene;
        scene.Temperature = new SceneTemperature { Kind = TemperatureProfileKind.Ramps, StartC = 20, Points = { new TemperaturePoint { TimeS = 1.0, TempC = 22 } } };
        var model = new SceneModel(scene);
        Assert.Equal(54.25, model.TempcoPpmPerK, 1e-12);
        Assert.Equal(10.85, model.CountedIntendedHz(1.0) - model.CountedIntendedHz(0.0), 1e-6);
        // C0G coil: -8.25 ppm/K.
        scene.Oscillator.Capacitor = CapacitorDielectric.C0g;
        Assert.Equal(-8.25, new SceneModel(scene).TempcoPpmPerK, 1e-12);
        // And the edges follow it: the last 0.1 s runs 10.85 * 0.95 Hz above the first 0.1 s (linear ramp, centres 0.9 s apart: 9.765 Hz).
        scene.Oscillator.Capacitor = CapacitorDielectric.Polystyrene;
        var w = Run(scene).Writer;
        var t = Unwrap(w.Rows, 64);
        double early = 80e6 / SlopeTicks(t.Take(10_000).ToList());
        double late = 80e6 / SlopeTicks(t.Skip(t.Count - 10_000).ToList());
        Assert.Equal(9.765, late - early, 0.01);
    }

    [Fact]
    public void TemperatureProfiles_Evaluate()
    {
        var settle = new SceneTemperature { Kind = TemperatureProfileKind.Settling, StartC = 10, AmbientC = 20, TimeConstantS = 100 };
        Assert.Equal(20 - 10 * Math.Exp(-1), settle.At(100), 1e-12);
        var steps = new SceneTemperature { Kind = TemperatureProfileKind.Steps, StartC = 5, Points = { new() { TimeS = 1, TempC = 7 }, new() { TimeS = 2, TempC = 9 } } };
        Assert.Equal(5, steps.At(0.5));
        Assert.Equal(7, steps.At(1.5));
        Assert.Equal(9, steps.At(3));
        var ramps = new SceneTemperature { Kind = TemperatureProfileKind.Ramps, StartC = 0, Points = { new() { TimeS = 2, TempC = 4 }, new() { TimeS = 4, TempC = 0 } } };
        Assert.Equal(2, ramps.At(1), 1e-12);
        Assert.Equal(2, ramps.At(3), 1e-12);
        Assert.Equal(0, ramps.At(9), 1e-12);
    }

    [Fact]
    public void BeatMode_CountsDifference_AndSideFromTuning()
    {
        var scene = Quiet(100_000, 0.5);
        scene.Reference = new SceneReference { FrequencyHz = 100_400, WhiteFmAdev1s = 0, FlickerAdev = 0 };
        scene.Hardware.ClockHz = 1e6;
        var (w, truth, sim) = Run(scene);
        Assert.Equal(SignalKind.Beat, sim.Metadata.Signal);
        Assert.Equal(BeatSide.Below, sim.Metadata.BeatSide);
        Assert.Equal("below", truth.BeatSide);
        Assert.Equal(400, 1e6 / SlopeTicks(Unwrap(w.Rows, 64)), 400 * 1e-4);
        Assert.Equal(-3.0, sim.Model.CountedShiftHz(3.0));
        scene.Reference.FrequencyHz = 99_600;
        Assert.Equal(BeatSide.Above, new SceneModel(scene).BeatSide);
    }

    [Fact]
    public void LowBeatOnARamp_EdgesSitAtWholeCyclesOfTheExactPhase()
    {
        // Phase integration check (derived): the beat falls linearly from 60 Hz to 20 Hz over 4 s (search ramps up by
        // 40 Hz towards the reference), so the phase is exactly phi(t) = 60 t - 5 t^2 cycles. Recorded edges must sit at
        // whole cycles of it: |phi(t_n) - phi(t_0) - n| < 1e-4 cycles (1 GHz clock: 1 ns quantisation is < 6e-8 cycles).
        var scene = Quiet(100_000, 4.0);
        scene.Reference = new SceneReference { FrequencyHz = 100_060, WhiteFmAdev1s = 0, FlickerAdev = 0 };
        scene.Oscillator.TempcoPpmPerK = 100; // 10 Hz/K
        scene.Temperature = new SceneTemperature { Kind = TemperatureProfileKind.Ramps, StartC = 20, Points = { new TemperaturePoint { TimeS = 4, TempC = 24 } } };
        scene.Hardware.ClockHz = 1e9;
        var (w, _, _) = Run(scene);
        var t = Unwrap(w.Rows, 64);
        long offset = (long)w.Rows[0].Tick; // the unwrapped list starts at the first raw tick
        double Phi(long tick) { double x = (tick - offset + FirstEdgeTicks(scene, w)) / 1e9; return 60 * x - 5 * x * x; }
        double p0 = Phi(t[0]);
        Assert.InRange(w.Rows.Count, 159, 161); // integral of the beat over 4 s = 160 cycles
        for (int n = 0; n < t.Count; n++)
        {
            Assert.True(Math.Abs(Phi(t[n]) - p0 - n) < 1e-4, $"edge {n}: phase error {Phi(t[n]) - p0 - n}");
        }
    }

    /// <summary>The first edge's true time (ticks) after t = 0: found from the phase so that edge 1 is exactly one cycle later.</summary>
    private static double FirstEdgeTicks(Scene scene, MemoryCaptureWriter w)
    {
        // Solve 60 (x0 + d) - 5 (x0 + d)^2 - (60 x0 - 5 x0^2) = 1 for x0, with d = interval between the first two edges.
        double d = (double)(w.Rows[1].Tick - w.Rows[0].Tick) / 1e9;
        // 60 d - 10 x0 d - 5 d^2 = 1  ->  x0 = (60 d - 5 d^2 - 1) / (10 d)
        return (60 * d - 5 * d * d - 1) / (10 * d) * 1e9;
    }

    [Fact]
    public void LongRun_NoAccumulatedTimingError()
    {
        // 200 s at exactly 100 kHz divided by 1000 on a 1 GHz 64-bit clock (2e11 ticks): edge n lies at n * 1e7 ticks after
        // the first within one tick (quantisation) - the long + fraction time keeps no rounding drift.
        var scene = Quiet(100_000, 200.0);
        scene.Hardware.ClockHz = 1e9;
        scene.Hardware.Prescale = 1000;
        var (w, _, _) = Run(scene);
        var t = Unwrap(w.Rows, 64);
        Assert.InRange(t.Count, 19_999, 20_001);
        for (int n = 0; n < t.Count; n += 997)
        {
            Assert.InRange(t[n] - t[0] - n * 10_000_000L, -1, 1);
        }

        Assert.InRange(t[^1] - t[0] - (t.Count - 1) * 10_000_000L, -1, 1);
    }

    [Fact]
    public void BeatThroughZero_LocksWithoutEdges_AndRecovers()
    {
        // The search drifts from 20 Hz below the reference to 20 Hz above it in 4 s: the beat passes zero at 2 s, where
        // real oscillators lock; the simulator emits no edges below 1 Hz, says so in the truth, and goes on afterwards.
        var scene = Quiet(100_000, 4.0);
        scene.Reference = new SceneReference { FrequencyHz = 100_020, WhiteFmAdev1s = 0, FlickerAdev = 0 };
        scene.Oscillator.TempcoPpmPerK = 100; // 10 Hz/K
        scene.Temperature = new SceneTemperature { Kind = TemperatureProfileKind.Ramps, StartC = 20, Points = { new TemperaturePoint { TimeS = 4, TempC = 24 } } };
        scene.Hardware.ClockHz = 1e6;
        var (w, truth, _) = Run(scene);
        Assert.Equal(1, truth.LockedCount);
        Assert.InRange(truth.LockedStartTimesS[0], 1.85, 2.0);
        Assert.Contains(truth.Warnings, x => x.Contains("near zero beat"));
        long lastTick = (long)w.Rows[^1].Tick - (long)w.Rows[0].Tick;
        Assert.True(lastTick > 3.9e6, "edges resume after the lock");
    }

    [Fact]
    public void Snapshots_CountGrowsAtTheIntendedRate_AndWraps()
    {
        var scene = Quiet(130_000, 1.0);
        scene.Hardware.Kind = CaptureKind.Snapshots;
        scene.Hardware.ClockHz = 1e6;
        scene.Hardware.CountBits = 16;
        scene.Hardware.ReadJitterS = 0;
        var (w, _, sim) = Run(scene);
        Assert.Equal(CaptureKind.Snapshots, sim.Metadata.Kind);
        Assert.InRange(w.Rows.Count, 999, 1001);
        Assert.All(w.Rows, r => Assert.True(r.Count < 65536));
        // Unwrap counts and fit count on time: 130 000 per second within whole-count quantisation.
        long c = 0;
        var counts = new List<long>();
        for (int i = 0; i < w.Rows.Count; i++)
        {
            if (i > 0) c += (long)((w.Rows[i].Count - w.Rows[i - 1].Count + 65536UL) % 65536UL);
            counts.Add(c);
        }

        var ticks = Unwrap(w.Rows, 32);
        double n = counts.Count, mt = ticks.Average(x => (double)(x - ticks[0])), mc = counts.Average();
        double sxy = 0, sxx = 0;
        for (int i = 0; i < counts.Count; i++)
        {
            double dt = ticks[i] - ticks[0] - mt;
            sxy += dt * (counts[i] - mc);
            sxx += dt * dt;
        }

        Assert.Equal(130_000, sxy / sxx * 1e6, 2.0);
        Assert.True(counts[^1] > 65536, "the 16-bit count wrapped");
    }

    [Fact]
    public void TempColumn_WhenAsked()
    {
        var scene = Quiet(10_000, 0.1);
        scene.Hardware.TempEveryRows = 100;
        scene.Temperature = new SceneTemperature { StartC = 21.3 };
        var (w, _, sim) = Run(scene);
        Assert.Contains("temp_c", sim.Metadata.ExtraColumns);
        var temps = w.Rows.Where(r => r.TemperatureC.HasValue).ToList();
        Assert.Equal(10, temps.Count);
        Assert.All(temps, r => Assert.Equal(21.3125, r.TemperatureC!.Value, 1e-9)); // 0.0625 deg C resolution
    }

    [Fact]
    public void TargetPass_ShiftsTheFrequencyAsTheTruthSays()
    {
        // A copper sphere under the line: the frequency rises, peaking at the truth's time by the truth's amount.
        var scene = Quiet(100_000);
        scene.DurationS = null;
        scene.Sweep = new SceneSweep { StartM = -0.5, EndM = 0.5, SpeedMPerS = 0.5, HeightM = 0.02, Passes = 1, LeadInS = 0.5, TailS = 0.5 };
        scene.Targets.Add(new SceneTarget { Name = "ball", Material = "copper", RadiusM = 0.01, DepthM = 0.08, PositionM = 0.1 });
        var sim = new CaptureSimulator(new SceneModel(scene));
        var truth = sim.Run(new MemoryCaptureWriter(keep: false));
        var target = Assert.Single(truth.Targets);
        Assert.Equal("non-ferrous", target.SignRuleClass);
        var pass = Assert.Single(target.Passes);
        Assert.Equal(0.5 + 0.6 / 0.5, pass.ClosestTimeS, 1e-9);
        Assert.True(pass.PeakSearchShiftHz > 0);
        double atPeak = sim.Model.CountedIntendedHz(pass.PeakTimeS) - 100_000;
        Assert.Equal(pass.PeakSearchShiftHz, atPeak, Math.Abs(pass.PeakSearchShiftHz) * 1e-6);
        Assert.True(sim.Model.CountedIntendedHz(0.1) - 100_000 < 0.01 * pass.PeakSearchShiftHz);
    }

    [Fact]
    public void DemoFloorScan_AnchorAboveCrossover_FixingBelow()
    {
        var scene = DemoScenes.FloorScan();
        var model = new SceneModel(scene);
        var sim = new CaptureSimulator(model);
        var truth = sim.Run(new MemoryCaptureWriter(keep: false));
        var fixing = truth.Targets.Single(t => t.Name == "small steel fixing");
        var anchor = truth.Targets.Single(t => t.Name == "large steel anchor");
        var pipe = truth.Targets.Single(t => t.Name == "copper pipe");
        Assert.Equal("ferrous", fixing.MaterialClass);
        Assert.Equal("ferrous", fixing.SignRuleClass);
        Assert.False(fixing.AboveCrossover);
        Assert.Equal("ferrous", anchor.MaterialClass);
        Assert.Equal("non-ferrous", anchor.SignRuleClass);
        Assert.True(anchor.AboveCrossover);
        Assert.Contains("above this part's crossover", anchor.Explanation);
        Assert.Equal("non-ferrous", pipe.SignRuleClass);
        Assert.All(fixing.Passes, p => Assert.True(p.PeakSearchShiftHz < 0));
        Assert.All(anchor.Passes, p => Assert.True(p.PeakSearchShiftHz > 0));
        Assert.All(pipe.Passes, p => Assert.True(p.PeakSearchShiftHz > 0));
        Assert.Equal(4, pipe.Passes.Count);
    }
}
