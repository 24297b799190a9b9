using FreqReadout.Counting;
using Xunit.Abstractions;

namespace FreqReadout.Tests.Counting;

/// <summary>
/// The reported ErrorHz against the real scatter of the gates, over a sweep of frequency ratios
/// (generic ones drawn from a seeded RNG, and the bad ones by construction: a period within a few
/// 1/N of a whole tick, of a half and of a third, and a whole-tick-plus-1/(N-1) period with edge gates
/// whose start phase never moves), timer clocks, gate lengths and Gaussian jitter of 0, 0.1, 0.3, 1
/// and 3 ticks rms, each point over 200 gates (test data, invented). Requirement (issue 8): the rms of
/// the gate errors about the true frequency is at most 1.5 x the mean ErrorHz everywhere; where jitter
/// dominates (1 tick rms or more, the white model of Rubiola 2005 applies) it is at least 0.7 x; and
/// without jitter, at the generic ratios, the figure is not absurdly pessimistic (median rms at least
/// 0.25 x ErrorHz; the model's own bound there is about 0.5, see QuantisationErrorModel).
/// </summary>
public class ErrorModelSweepTests
{
    private const int Gates = 200;
    private static readonly double[] Jitters = { 0, 0.1, 0.3, 1, 3 };
    private readonly ITestOutputHelper _out;

    public ErrorModelSweepTests(ITestOutputHelper output) => _out = output;

    private sealed record Point(string Kind, double Clock, int N, double Period, double Jitter, EstimatorKind Estimator, double Rms, double Error)
    {
        public double Ratio => Rms / Error;
        public override string ToString() => FormattableString.Invariant(
            $"{Estimator} {Kind} clock {Clock:G4} N {N} P {Period:R} J {Jitter}: rms {Rms:G4} Hz, error {Error:G4} Hz, ratio {Ratio:F3}");
    }

    /// <summary>Runs one stream through a regression and a reciprocal counter; adds one point per estimator.</summary>
    private static void Run(List<Point> points, string kind, double clock, int n, long periodNum, long periodDen, double jitter, bool edgeGates, Random rng)
    {
        double period = (double)periodNum / periodDen;
        double f = clock / period;
        CounterSettings Make(EstimatorKind e) => new()
        {
            ClockHz = clock,
            Mode = edgeGates ? GateMode.Edges : GateMode.Time,
            GateEdges = n - 1,
            GateSeconds = Math.Round((n - 1) * period) / clock,
            Estimator = e,
            JitterTicks = jitter,
            NoSignalSeconds = 1e6 / clock * period,
        };
        var reg = new EdgeCounter(Make(EstimatorKind.Regression));
        var rec = new EdgeCounter(Make(EstimatorKind.Reciprocal));
        var rr = new GateResult();
        var rc = new GateResult();
        long phase = rng.NextInt64(0, periodDen);
        long start = rng.NextInt64(0, 1L << 40);
        double s2Reg = 0, s2Rec = 0, eReg = 0, eRec = 0;
        int got = 0;
        for (long k = 0; got < Gates; k++)
        {
            long tick = EdgeStreams.QuantisedTick(start, phase, periodNum, periodDen, k);
            if (jitter > 0)
            {
                // floor(tau + n): the exact quantised time plus the jitter, re-quantised.
                double frac = (double)(((Int128)k * periodNum + phase) % periodDen) / periodDen;
                tick += (long)Math.Floor(frac + jitter * EdgeStreams.Gaussian(rng));
            }

            bool a = reg.AddEdge(tick, rr);
            bool b = rec.AddEdge(tick, rc);
            Assert.Equal(a, b);
            if (!a) continue;
            Assert.Equal(GateState.Ok, rr.State);
            Assert.Equal(0, rr.InferredEdges);
            got++;
            s2Reg += (rr.RegressionHz - f) * (rr.RegressionHz - f);
            s2Rec += (rc.ReciprocalHz - f) * (rc.ReciprocalHz - f);
            eReg += rr.ErrorHz;
            eRec += rc.ErrorHz;
        }

        points.Add(new Point(kind, clock, n, period, jitter, EstimatorKind.Regression, Math.Sqrt(s2Reg / Gates), eReg / Gates));
        points.Add(new Point(kind, clock, n, period, jitter, EstimatorKind.Reciprocal, Math.Sqrt(s2Rec / Gates), eRec / Gates));
    }

    [Theory]
    [InlineData(80e6, 20)]
    [InlineData(80e6, 150)]
    [InlineData(80e6, 1500)]
    [InlineData(16e6, 157)]
    [InlineData(1e6, 60)]
    [InlineData(1e6, 600)]
    public void Rms_of_gate_errors_stays_within_1_5_x_the_reported_error_at_every_ratio(double clock, int n)
    {
        var rng = new Random((int)(clock / 1000) + n);
        var points = new List<Point>();
        const long den = 1L << 20;
        foreach (double jitter in Jitters)
        {
            long minK = (long)(12 * jitter) + 4;
            long K() => minK + rng.Next(0, 3000);
            // Generic ratios: a period drawn log-uniformly.
            for (int g = 0; g < 6; g++)
            {
                double p = minK * Math.Pow(3000.0 / minK, rng.NextDouble());
                Run(points, "generic", clock, n, (long)(p * den), den, jitter, false, rng);
            }

            // Within u / N of a whole tick, of a half and of a third.
            foreach (double u in new[] { 0.3, 1.0, 2.5 })
            {
                Run(points, "integer+u/N", clock, n, K() * den + (long)(u / n * den), den, jitter, false, rng);
                Run(points, "half+u/N", clock, n, K() * den + den / 2 + (long)(u / n * den), den, jitter, false, rng);
                Run(points, "third+u/N", clock, n, K() * 3 * den + den + (long)(u / n * 3 * den), 3 * den, jitter, false, rng);
            }

            // Whole tick + 1/(N-1) with edge gates of N-1 periods: the gate spans a whole number of ticks,
            // so every gate starts at the same phase and repeats its error (the worst case for a model of
            // phase averages); four phases.
            for (int ph = 0; ph < 4; ph++)
            {
                long k = K();
                Run(points, "stuck", clock, n, k * (n - 1) + 1, n - 1, jitter, true, rng);
            }
        }

        foreach (Point p in points.OrderByDescending(p => p.Ratio).Take(5)) _out.WriteLine("largest: " + p);
        foreach (Point p in points.Where(p => p.Jitter >= 1).OrderBy(p => p.Ratio).Take(3)) _out.WriteLine("smallest, jitter >= 1: " + p);
        var bad = points.Where(p => p.Ratio > 1.5).ToList();
        Assert.True(bad.Count == 0, "rms above 1.5 x error:\n" + string.Join("\n", bad));
        var pessimistic = points.Where(p => p.Jitter >= 1 && p.Ratio < 0.7).ToList();
        Assert.True(pessimistic.Count == 0, "rms below 0.7 x error where jitter dominates:\n" + string.Join("\n", pessimistic));
        foreach (EstimatorKind e in new[] { EstimatorKind.Regression, EstimatorKind.Reciprocal })
        {
            var generic = points.Where(p => p.Jitter == 0 && p.Kind == "generic" && p.Estimator == e).Select(p => p.Ratio).OrderBy(r => r).ToList();
            double median = generic[generic.Count / 2];
            _out.WriteLine(FormattableString.Invariant($"{e}: median ratio at generic ratios without jitter {median:F3}"));
            Assert.True(median >= 0.25, $"{e}: median rms / error {median} at generic ratios without jitter");
        }
    }

    /// <summary>
    /// Pulse-counter snapshots read on strictly periodic deadlines (the count quantisation is then a
    /// deterministic sawtooth of the counts per read), recorded with read jitter of 0, 0.3, 1 and 3
    /// ticks; generic rates and rates within u / n counts per read of a whole count or a half; 200
    /// gates of 0.1 s per point. The rms of the gate errors stays within 1.5 x the reported ErrorHz.
    /// </summary>
    [Theory]
    [InlineData(1e6, 1000)]
    [InlineData(80e6, 80_000)]
    [InlineData(1e6, 500)]
    public void Strictly_periodic_snapshot_reads_stay_within_1_5_x_the_reported_error(double clock, long readTicks)
    {
        var rng = new Random((int)(clock / 1000) + (int)readTicks);
        var points = new List<Point>();
        int reads = (int)Math.Round(0.1 * clock / readTicks); // reads per gate
        foreach (double jitter in new[] { 0, 0.3, 1, 3 })
        {
            var rates = new List<(string Kind, double R)>();
            for (int g = 0; g < 8; g++) rates.Add(("generic", 0.3 * Math.Pow(2000 / 0.3, rng.NextDouble())));
            foreach (double u in new[] { 0.3, 1.0, 2.5 })
            {
                rates.Add(("integer+u/n", rng.Next(1, 2000) + u / reads));
                rates.Add(("half+u/n", rng.Next(1, 2000) + 0.5 + u / reads));
            }

            foreach (var (kind, countsPerRead) in rates)
            {
                double f = countsPerRead * clock / readTicks;
                var c = new SnapshotCounter(new CounterSettings { ClockHz = clock, GateSeconds = 0.1, JitterTicks = jitter });
                var r = new GateResult();
                double phase = rng.NextDouble();
                double s2 = 0, e = 0;
                int got = 0;
                for (long k = 0; got < Gates; k++)
                {
                    long latch = 1000 + k * readTicks;
                    long count = (long)Math.Floor(phase + k * countsPerRead);
                    long tick = latch + (jitter > 0 ? (long)Math.Round(jitter * EdgeStreams.Gaussian(rng)) : 0);
                    if (!c.AddSnapshot(tick, count, r) || !r.HasFrequency) continue;
                    got++;
                    s2 += (r.FrequencyHz - f) * (r.FrequencyHz - f);
                    e += r.ErrorHz;
                }

                points.Add(new Point(kind, clock, reads + 1, countsPerRead, jitter, EstimatorKind.SnapshotRegression, Math.Sqrt(s2 / Gates), e / Gates));
            }
        }

        foreach (Point p in points.OrderByDescending(p => p.Ratio).Take(5)) _out.WriteLine("largest: " + p);
        var bad = points.Where(p => p.Ratio > 1.5).ToList();
        Assert.True(bad.Count == 0, "rms above 1.5 x error:\n" + string.Join("\n", bad));
    }
}
