using FreqReadout.Host.Captures;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Simulation;

/// <summary>
/// Mains pickup (frequency modulation of the search oscillator) and explicit sweep legs in the simulator. The expected values
/// are the scene's own definitions (SceneMains, SceneSweepLeg); the edges are read back without the counting core.
/// </summary>
public class MainsAndLegsTests
{
    private const double F0 = 100_000;

    private static Scene Quiet(double durationS)
    {
        return new Scene
        {
            Name = "test",
            Seed = 11,
            DurationS = durationS,
            Oscillator = new SceneOscillator { FrequencyHz = F0, TempcoPpmPerK = 0, WhiteFmAdev1s = 0, FlickerAdev = 0 },
            Hardware = new SceneHardware { ClockHz = 80e6, TimerBits = 64 },
        };
    }

    private static List<long> Ticks(Scene scene)
    {
        var w = new MemoryCaptureWriter();
        new CaptureSimulator(new SceneModel(scene)).Run(w);
        return w.Rows.Select(r => (long)r.Tick).ToList();
    }

    /// <summary>Mean frequency over blocks of <paramref name="edgesPerBlock"/> intervals: (time of block centre s, Hz).</summary>
    private static List<(double T, double F)> Blocks(List<long> ticks, int edgesPerBlock, double clockHz)
    {
        var list = new List<(double, double)>();
        for (int i = 0; i + edgesPerBlock < ticks.Count; i += edgesPerBlock)
        {
            double a = (ticks[i] - ticks[0]) / clockHz;
            double b = (ticks[i + edgesPerBlock] - ticks[0]) / clockHz;
            list.Add(((a + b) / 2, edgesPerBlock / (b - a)));
        }

        return list;
    }

    [Theory]
    [InlineData(50.0, 20.0, 30.0)]
    [InlineData(60.0, 8.0, -75.0)]
    public void Mains_ModulatesTheSearchFrequencyWithTheGivenDeviationFrequencyAndPhase(double mainsHz, double ppm, double phaseDeg)
    {
        Scene scene = Quiet(0.4);
        scene.Mains = new SceneMains { DeviationPpm = ppm, FrequencyHz = mainsHz, PhaseDeg = phaseDeg };
        scene.Hardware.ClockHz = 1e10; // 0.1 ns ticks: 0.2 ppm resolution per 0.5 ms block, so quantisation does not blur the fit
        List<(double T, double F)> blocks = Blocks(Ticks(scene), 50, 1e10); // 0.5 ms blocks

        // Least squares f = c + a sin(w t) + b cos(w t) (three normal equations, solved by MathNet).
        double w = 2 * Math.PI * mainsHz;
        var x = MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.Dense(blocks.Count, 3, (i, j) => j switch
        {
            0 => 1.0,
            1 => Math.Sin(w * blocks[i].T),
            _ => Math.Cos(w * blocks[i].T),
        });
        var y = MathNet.Numerics.LinearAlgebra.Vector<double>.Build.Dense(blocks.Select(b => b.F).ToArray());
        var p = x.Solve(y);
        double amplitudePpm = Math.Sqrt((p[1] * p[1]) + (p[2] * p[2])) / F0 * 1e6;
        double phase = Math.Atan2(p[2], p[1]) * 180 / Math.PI;

        // The 1 ms control step integrates the modulation's phase (theta/2) cot(theta/2) times the true one (theta = 2 pi / N
        // steps per cycle): 0.8 % low at 50 Hz, 1.2 % at 60 Hz; the 0.5 ms blocks average it by sinc, under 0.1 %.
        Assert.InRange(amplitudePpm, ppm * 0.98, ppm * 1.003);
        Assert.InRange(phase, phaseDeg - 2, phaseDeg + 2);
        Assert.InRange(p[0], F0 - 0.01, F0 + 0.01);
    }

    [Theory]
    [InlineData(50.0)]
    [InlineData(60.0)]
    public void Mains_CancelsInTenthSecondReciprocalGates_WhichSpanWholeMainsPeriods(double mainsHz)
    {
        Scene plain = Quiet(3.0);
        Scene mains = Quiet(3.0);
        mains.Mains = new SceneMains { DeviationPpm = 50, FrequencyHz = mainsHz, PhaseDeg = 10 };
        List<double> a = Gates(Ticks(plain));
        List<double> b = Gates(Ticks(mains));
        Assert.Equal(a.Count, b.Count);
        double worst = a.Zip(b, (u, v) => Math.Abs(u - v)).Max();

        // 0.1 s is 5 periods of 50 Hz and 6 of 60 Hz: what is left is the gate's overshoot of one edge period (10 us) of a
        // 50 ppm swing, well under 1 % of the deviation.
        Assert.True(worst < 0.01 * 50e-6 * F0, $"worst gate difference {worst} Hz");

        static List<double> Gates(List<long> ticks)
        {
            var gates = new List<double>();
            int open = 0;
            for (int i = 1; i < ticks.Count; i++)
            {
                if (ticks[i] - ticks[open] >= 8_000_000)
                {
                    gates.Add((i - open) * 80e6 / (ticks[i] - ticks[open]));
                    open = i;
                }
            }

            return gates;
        }
    }

    [Fact]
    public void Mains_NeedsAControlStepOfAtMostASixteenthOfItsPeriod()
    {
        Scene scene = Quiet(1.0);
        scene.Mains = new SceneMains { DeviationPpm = 5, FrequencyHz = 100 };
        var e = Assert.Throws<SceneException>(() => scene.Validate("s.json"));
        Assert.Contains("hardware.control_step_s", e.Message);
        scene.Hardware.ControlStepS = 0.0005;
        scene.Validate("s.json");

        scene.Mains.DeviationPpm = -1;
        Assert.Contains("mains.deviation_ppm", Assert.Throws<SceneException>(() => scene.Validate("s.json")).Message);
    }

    [Fact]
    public void Mains_RoundTripsThroughTheSceneFile_AndIsLeftOutWhenAbsent()
    {
        Scene scene = Quiet(1.0);
        Assert.DoesNotContain("mains", scene.ToJson());
        scene.Mains = new SceneMains { DeviationPpm = 3, FrequencyHz = 60, PhaseDeg = 45 };
        Scene back = Scene.Parse(scene.ToJson(), "round trip");
        Assert.Equal(3, back.Mains!.DeviationPpm);
        Assert.Equal(60, back.Mains.FrequencyHz);
        Assert.Equal(45, back.Mains.PhaseDeg);
    }

    /// <summary>Two legs over two copper spheres 10 m apart, the coil lifted between them.</summary>
    private static Scene TwoLegs()
    {
        Scene scene = Quiet(14.0);
        scene.Targets.Add(new SceneTarget { Name = "a", Material = "copper", RadiusM = 0.01, DepthM = 0.1, PositionM = 0 });
        scene.Targets.Add(new SceneTarget { Name = "b", Material = "copper", RadiusM = 0.01, DepthM = 0.1, PositionM = 10 });
        scene.Sweep = new SceneSweep
        {
            HeightM = 0.02,
            TailS = 1,
            Legs = new List<SceneSweepLeg>
            {
                new() { StartS = 2, FromM = -1, ToM = 1, DurationS = 2 },
                new() { StartS = 8, FromM = 11, ToM = 9, DurationS = 4 },
            },
        };
        return scene;
    }

    [Fact]
    public void Legs_SetThePassTimes_AndTheCoilIsLiftedBetweenThem()
    {
        var model = new SceneModel(TwoLegs());
        Assert.Equal(2, model.Plan.Passes.Count);
        Assert.Equal(new SweepPass(0, 2, 4, -1, 1), model.Plan.Passes[0]);
        Assert.Equal(new SweepPass(1, 8, 12, 11, 9), model.Plan.Passes[1]);
        Assert.Equal(13, model.Plan.PlannedDurationS, 9); // last end + tail_s

        Assert.True(model.Plan.TryGetPosition(1.0, out double x) && x == -1); // resting at the first start
        Assert.True(model.Plan.TryGetPosition(3.0, out x) && Math.Abs(x) < 1e-12); // over target a
        Assert.False(model.Plan.TryGetPosition(6.0, out _)); // lifted: the next leg starts elsewhere
        Assert.True(model.Plan.TryGetPosition(10.0, out x) && Math.Abs(x - 10) < 1e-12); // over target b
        Assert.Equal(0.0, model.InductanceChangeAtH(6.0));
        Assert.True(model.InductanceChangeAtH(3.0) < 0); // copper lowers L
    }

    [Fact]
    public void Legs_TruthPeaksAtTheTargetOfEachLeg()
    {
        var sim = new CaptureSimulator(new SceneModel(TwoLegs()));
        SimulationTruth truth = sim.Run(new MemoryCaptureWriter(false));
        PassTruth a = truth.Targets[0].Passes[0];
        PassTruth b = truth.Targets[1].Passes[1];
        Assert.InRange(a.PeakTimeS, 2.99, 3.01);
        Assert.InRange(b.PeakTimeS, 9.99, 10.01);
        Assert.True(a.PeakSearchShiftHz > 0 && Math.Abs(a.PeakSearchShiftHz - b.PeakSearchShiftHz) < 1e-9 * Math.Abs(a.PeakSearchShiftHz));

        // Each target is 10 m from the other leg: nothing there.
        Assert.True(Math.Abs(truth.Targets[0].Passes[1].PeakSearchShiftHz) < 1e-6 * a.PeakSearchShiftHz);
    }

    [Fact]
    public void Legs_MustNotOverlap_AndNeedAPlausibleSpeed()
    {
        Scene scene = TwoLegs();
        scene.Sweep.Legs![1].StartS = 3;
        Assert.Contains("sweep.legs[1].start_s", Assert.Throws<SceneException>(() => scene.Validate("s.json")).Message);
        scene = TwoLegs();
        scene.Sweep.Legs![0].DurationS = 0.05; // 2 m in 50 ms
        Assert.Contains("sweep.legs[0].duration_s", Assert.Throws<SceneException>(() => scene.Validate("s.json")).Message);
    }
}
