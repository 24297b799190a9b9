using FreqReadout.Host.Captures;
using FreqReadout.Host.Simulation;
using Xunit.Abstractions;

namespace FreqReadout.Tests.Simulation;

/// <summary>
/// The fast simulator (coupling from a position table, lean edge path, batched rows) against the previous one, kept as
/// <see cref="ReferenceCaptureSimulator"/>: the same frequency trace, and the same Allan deviation (white FM scaling,
/// flicker component) within the estimates' statistical errors.
/// </summary>
public class FastSimulatorStatisticsTests
{
    private readonly ITestOutputHelper _output;

    public FastSimulatorStatisticsTests(ITestOutputHelper output) => _output = output;

    /// <summary>Keeps only the raw ticks and counts (the rows' other columns are not compared here).</summary>
    private sealed class TickCollector : ICaptureWriter
    {
        public List<ulong> Ticks { get; } = new();

        public List<ulong> Counts { get; } = new();

        public void WriteRow(in CaptureRow row)
        {
            Ticks.Add(row.Tick);
            Counts.Add(row.Count);
        }

        public void Complete(IReadOnlyList<KeyValuePair<string, string>> trailer)
        {
        }

        public void Dispose()
        {
        }
    }

    private static TickCollector RunFast(Scene scene)
    {
        var w = new TickCollector();
        new CaptureSimulator(new SceneModel(scene)).Run(w);
        return w;
    }

    private static TickCollector RunReference(Scene scene)
    {
        var w = new TickCollector();
        new ReferenceCaptureSimulator(new SceneModel(scene)).Run(w);
        return w;
    }

    /// <summary>Ticks unwrapped from <paramref name="bits"/> bits, relative to the first.</summary>
    private static long[] Unwrap(List<ulong> ticks, int bits)
    {
        var result = new long[ticks.Count];
        ulong mask = bits == 64 ? ulong.MaxValue : (1UL << bits) - 1;
        for (int i = 1; i < ticks.Count; i++)
        {
            result[i] = result[i - 1] + (long)((ticks[i] - ticks[i - 1]) & mask);
        }

        return result;
    }

    /// <summary>Counted frequency of consecutive gates of <paramref name="edgesPerGate"/> recorded intervals, Hz.</summary>
    private static List<double> GateFrequencies(long[] ticks, int edgesPerGate, double clockHz, int prescale)
    {
        var f = new List<double>();
        for (int i = 0; i + edgesPerGate < ticks.Length; i += edgesPerGate)
        {
            f.Add(edgesPerGate * prescale * clockHz / (ticks[i + edgesPerGate] - ticks[i]));
        }

        return f;
    }

    [Theory]
    [InlineData(true)]
    [InlineData(false)]
    public void DemoScene_FrequencyTraceMatchesTheReference(bool noise)
    {
        // The same scene and seed make the same random draws in both, so the recorded edges may differ only where the
        // tabulated coupling (within 1e-5 of the peak, InductanceChangeTableTests) moves an edge across a tick boundary:
        // by at most one tick, and rarely. Gate frequencies (0.1 s, 312 recorded edges at 100 kHz / 32) then agree within
        // two ticks per gate: 2 x 12.5 ns / 0.1 s = 2.5e-7 relative (0.025 Hz at 100 kHz), against a copper-pipe peak of
        // about +29 Hz and a white-FM gate scatter of about 0.016 Hz.
        // The first 48 s: the lead-in and two passes over all three targets.
        var scene = DemoScenes.FloorScan();
        scene.DurationS = 48;
        if (!noise)
        {
            scene.Oscillator.WhiteFmAdev1s = 0;
            scene.Oscillator.FlickerAdev = 0;
        }

        var fast = RunFast(scene);
        var reference = RunReference(scene);
        Assert.Equal(reference.Ticks.Count, fast.Ticks.Count);
        Assert.Equal(reference.Ticks[0], fast.Ticks[0]);
        long[] tf = Unwrap(fast.Ticks, 32);
        long[] tr = Unwrap(reference.Ticks, 32);
        int differing = 0;
        for (int i = 0; i < tf.Length; i++)
        {
            long d = tf[i] - tr[i];
            Assert.InRange(d, -1, 1);
            differing += d != 0 ? 1 : 0;
        }

        _output.WriteLine($"{differing} of {tf.Length} edges differ by a tick");
        Assert.True(differing <= tf.Length / 1000, $"{differing} of {tf.Length} edges differ by a tick");

        var ff = GateFrequencies(tf, 312, 80e6, 32);
        var fr = GateFrequencies(tr, 312, 80e6, 32);
        double maxDiff = 0;
        double maxShift = 0;
        for (int i = 0; i < ff.Count; i++)
        {
            maxDiff = Math.Max(maxDiff, Math.Abs(ff[i] - fr[i]));
            maxShift = Math.Max(maxShift, fr[i] - fr[0]);
        }

        _output.WriteLine($"gate frequencies differ by up to {maxDiff:G3} Hz; largest rise {maxShift:F3} Hz");
        Assert.True(maxDiff <= 100_000 * 2.5e-7 * 1.01, $"gate frequencies differ by up to {maxDiff:G3} Hz");
        Assert.True(maxShift > 20, $"the trace shows the pipe (+29 Hz; largest rise {maxShift:F2} Hz)"); // the trace is not flat
    }

    [Fact]
    public void BeatModeAndSnapshots_WithATarget_MatchTheReference()
    {
        // Beat mode (search 100 kHz tuned 1 kHz below the reference, so the beat falls as a copper sphere raises the search
        // frequency) under a sweeping coil, as edges and as snapshots.
        var scene = new Scene
        {
            Name = "beat",
            Seed = 17,
            Oscillator = new SceneOscillator { FrequencyHz = 100_000, WhiteFmAdev1s = 1e-7, FlickerAdev = 3e-8 },
            Reference = new SceneReference { FrequencyHz = 101_000, WhiteFmAdev1s = 5e-8, FlickerAdev = 0 },
            Targets = { new SceneTarget { Name = "ball", Material = "copper", RadiusM = 0.01, DepthM = 0.05, PositionM = 0.3 } },
            Sweep = new SceneSweep { StartM = 0, EndM = 0.6, SpeedMPerS = 0.3, HeightM = 0.02, Passes = 2, PauseS = 1, LeadInS = 1, TailS = 1 },
            Hardware = new SceneHardware { ClockHz = 80e6, TimerBits = 32 },
        };
        var fast = RunFast(scene);
        var reference = RunReference(scene);
        Assert.Equal(reference.Ticks.Count, fast.Ticks.Count);
        long[] tf = Unwrap(fast.Ticks, 32);
        long[] tr = Unwrap(reference.Ticks, 32);
        for (int i = 0; i < tf.Length; i++)
        {
            Assert.InRange(tf[i] - tr[i], -1, 1);
        }

        scene.Hardware = new SceneHardware { Kind = CaptureKind.Snapshots, ClockHz = 1e6, TimerBits = 32 };
        fast = RunFast(scene);
        reference = RunReference(scene);
        Assert.Equal(reference.Ticks, fast.Ticks);
        for (int i = 0; i < fast.Counts.Count; i++)
        {
            // The count is the floor of the integrated phase: the table may move it across a whole count, rarely.
            Assert.InRange((long)(fast.Counts[i] - reference.Counts[i]), -1, 1);
        }
    }

    [Fact]
    public void OverlappingAllanDeviation_MatchesSp1065Tables()
    {
        // NIST SP 1065 (Riley 2008) Table 30, nine-point frequency data, tau0 = 1: OADEV(2) = 85.95287; ADEV(1) = 91.22945
        // (the overlapping and the plain estimate agree at m = 1).
        double[] y9 = { 892, 809, 823, 798, 671, 644, 883, 903, 677 };
        var x9 = OverlappingAllanDeviation.PhaseFromFrequency(y9, 1.0);
        Assert.Equal(91.22945, Math.Sqrt(OverlappingAllanDeviation.Variance(x9, 1, 1.0)), 91.22945 * 1e-6);
        Assert.Equal(85.95287, Math.Sqrt(OverlappingAllanDeviation.Variance(x9, 2, 1.0)), 85.95287 * 1e-6);

        // SP 1065 Table 31, 1000-point data n_{i+1} = 16807 n_i mod 2147483647, y = n / 2147483647: OADEV at tau = 1, 10,
        // 100 = 2.922319e-01, 9.159953e-02, 3.241343e-02 (relative tolerance 1e-4, customary).
        var y = new double[1000];
        long n = 1234567890;
        for (int i = 0; i < 1000; i++)
        {
            y[i] = n / 2147483647.0;
            n = 16807 * n % 2147483647;
        }

        var x = OverlappingAllanDeviation.PhaseFromFrequency(y, 1.0);
        Assert.Equal(2.922319e-01, Math.Sqrt(OverlappingAllanDeviation.Variance(x, 1, 1.0)), 2.922319e-01 * 1e-4);
        Assert.Equal(9.159953e-02, Math.Sqrt(OverlappingAllanDeviation.Variance(x, 10, 1.0)), 9.159953e-02 * 1e-4);
        Assert.Equal(3.241343e-02, Math.Sqrt(OverlappingAllanDeviation.Variance(x, 100, 1.0)), 3.241343e-02 * 1e-4);
    }

    /// <summary>
    /// Pooled overlapping Allan variance of several runs (mean of the runs' estimates, edf summed) at each averaging factor,
    /// from phase x_j = t_{j d} / clock - j d P / f0 at every <paramref name="decimation"/>-th recorded edge.
    /// </summary>
    private static (double[] Variance, double[] Edf, double Tau0S) PooledAvar(
        IEnumerable<TickCollector> runs, int decimation, double clockHz, int prescale, double nominalHz, int[] factors, Func<int, int, double> edf)
    {
        double tau0 = decimation * prescale / nominalHz;
        var variance = new double[factors.Length];
        var dof = new double[factors.Length];
        int count = 0;
        foreach (var run in runs)
        {
            long[] t = Unwrap(run.Ticks, 64);
            var x = new List<double>();
            for (int j = 0; j * decimation < t.Length; j++)
            {
                x.Add((t[j * decimation] / clockHz) - (j * tau0));
            }

            for (int k = 0; k < factors.Length; k++)
            {
                variance[k] += OverlappingAllanDeviation.Variance(x, factors[k], tau0);
                dof[k] += edf(x.Count, factors[k]);
            }

            count++;
        }

        for (int k = 0; k < factors.Length; k++)
        {
            variance[k] /= count;
        }

        return (variance, dof, tau0);
    }

    private static Scene Static(long seed, double frequencyHz, int prescale, double durationS, double whiteFm, double flicker)
    {
        // 64-bit timer at 1 GHz: quantisation (white PM, sqrt(3) (1 ns / sqrt 12) / tau = 5e-10 / tau) stays far below the
        // levels tested at the shortest tau.
        return new Scene
        {
            Name = "static",
            Seed = seed,
            DurationS = durationS,
            Oscillator = new SceneOscillator { FrequencyHz = frequencyHz, TempcoPpmPerK = 0, WhiteFmAdev1s = whiteFm, FlickerAdev = flicker },
            Hardware = new SceneHardware { ClockHz = 1e9, TimerBits = 64, Prescale = prescale },
        };
    }

    [Fact]
    public void WhiteFm_AllanDeviationScalesAsTauToTheMinusHalf_AndMatchesTheReference()
    {
        // White FM of ADEV(1 s) = 1e-7 has sigma_y(tau) = 1e-7 tau^-1/2 (NIST SP 1065, Riley 2008, section 5.2 slopes).
        // 100 kHz / 32, 3 independent 60 s runs each for the fast and the reference simulator (different seeds).
        // Checks, at tau = 0.032, 0.32, 3.2 s (phase every 10th edge, tau0 = 3.2 ms; m = 10, 100, 1000):
        // the expected variance lies inside the fast estimate's 99.9 % chi-square interval (white-FM edf, SP 1065 sec. 5.3),
        // and the fast / reference variance ratio inside the 99.9 % F bounds of two independent estimates.
        int[] m = { 10, 100, 1000 };
        var fastRuns = Enumerable.Range(1, 3).Select(s => RunFast(Static(s, 100_000, 32, 60, 1e-7, 0))).ToList();
        var refRuns = Enumerable.Range(11, 3).Select(s => RunReference(Static(s, 100_000, 32, 60, 1e-7, 0))).ToList();
        var (vf, edfF, tau0) = PooledAvar(fastRuns, 10, 1e9, 32, 100_000, m, OverlappingAllanDeviation.WhiteFmEdf);
        var (vr, edfR, _) = PooledAvar(refRuns, 10, 1e9, 32, 100_000, m, OverlappingAllanDeviation.WhiteFmEdf);
        for (int k = 0; k < m.Length; k++)
        {
            double tau = m[k] * tau0;
            double expected = 1e-14 / tau;
            var (low, high) = OverlappingAllanDeviation.VarianceInterval(vf[k], edfF[k], 0.999);
            _output.WriteLine($"tau {tau:G3} s: ADEV fast {Math.Sqrt(vf[k]):G4} (edf {edfF[k]:F0}), reference {Math.Sqrt(vr[k]):G4} (edf {edfR[k]:F0}), white FM {Math.Sqrt(expected):G4}");
            Assert.True(expected >= low && expected <= high, $"tau {tau} s: fast ADEV {Math.Sqrt(vf[k]):G4}, expected {Math.Sqrt(expected):G4} (99.9 % interval {Math.Sqrt(low):G4}..{Math.Sqrt(high):G4})");
            var (rLow, rHigh) = OverlappingAllanDeviation.RatioBounds(edfF[k], edfR[k], 0.999);
            double ratio = vf[k] / vr[k];
            Assert.True(ratio >= rLow && ratio <= rHigh, $"tau {tau} s: fast / reference variance {ratio:G4} outside {rLow:G4}..{rHigh:G4}");
        }

        // The slope over two decades, from the fast estimates: -1/2 within the estimates' errors (about 1 % and 11 % at the
        // ends, 1 sigma: 1/sqrt(2 edf) of the deviation; 3 sigma on the log ratio over log 100).
        double slope = Math.Log(Math.Sqrt(vf[2] / vf[0])) / Math.Log(100);
        double slopeError = 3 * Math.Sqrt((1 / (2 * edfF[0])) + (1 / (2 * edfF[2]))) / Math.Log(100);
        _output.WriteLine($"slope {slope:F4} +- {slopeError:F4}");
        Assert.InRange(slope, -0.5 - slopeError, -0.5 + slopeError);
    }

    [Fact]
    public void FlickerComponent_AllanDeviationFlat_AndMatchesTheReference()
    {
        // The flicker-like model's ADEV is flat near its floor from 0.3 s to 1000 s (FlickerNoise, derived design value, within
        // about 5 %). Floor 1e-7, white FM 1e-9 (negligible above 0.01 s), 10 kHz / 10, 4 independent 300 s runs each for the
        // fast and the reference simulator (different seeds), phase every 10th edge (tau0 = 10 ms). At tau = 1 and 10 s the
        // fast / reference variance ratio must lie inside the 99.9 % F bounds (flicker-FM edf, SP 1065 sec. 5.3, from
        // memory); the fast deviation inside 0.7..1.4 of the floor, and the ratio ADEV(10 s) / ADEV(1 s) inside 0.7..1.4
        // (flat: white FM alone would give 0.32).
        int[] m = { 100, 1000 };
        var fastRuns = Enumerable.Range(1, 4).Select(s => RunFast(Static(s, 10_000, 10, 300, 1e-9, 1e-7))).ToList();
        var refRuns = Enumerable.Range(21, 4).Select(s => RunReference(Static(s, 10_000, 10, 300, 1e-9, 1e-7))).ToList();
        var (vf, edfF, _) = PooledAvar(fastRuns, 10, 1e9, 10, 10_000, m, OverlappingAllanDeviation.FlickerFmEdf);
        var (vr, edfR, _) = PooledAvar(refRuns, 10, 1e9, 10, 10_000, m, OverlappingAllanDeviation.FlickerFmEdf);
        for (int k = 0; k < m.Length; k++)
        {
            var (rLow, rHigh) = OverlappingAllanDeviation.RatioBounds(edfF[k], edfR[k], 0.999);
            double ratio = vf[k] / vr[k];
            _output.WriteLine($"m {m[k]}: ADEV fast {Math.Sqrt(vf[k]):G4} (edf {edfF[k]:F0}), reference {Math.Sqrt(vr[k]):G4} (edf {edfR[k]:F0}); variance ratio {ratio:G4} in {rLow:G4}..{rHigh:G4}");
            Assert.True(ratio >= rLow && ratio <= rHigh, $"m {m[k]}: fast / reference variance {ratio:G4} outside {rLow:G4}..{rHigh:G4}");
            Assert.InRange(Math.Sqrt(vf[k]) / 1e-7, 0.7, 1.4);
        }

        Assert.InRange(Math.Sqrt(vf[1] / vf[0]), 0.7, 1.4);
    }
}
