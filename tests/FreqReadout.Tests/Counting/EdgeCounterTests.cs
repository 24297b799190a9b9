using FreqReadout.Counting;

namespace FreqReadout.Tests.Counting;

public class EdgeCounterTests
{
    private static CounterSettings Settings(double clockHz, GateMode mode = GateMode.Time, double gateSeconds = 0.1,
        int gateEdges = 100, EstimatorKind estimator = EstimatorKind.Regression, int prescale = 1, double jitter = 0)
    {
        return new CounterSettings
        {
            ClockHz = clockHz,
            Mode = mode,
            GateSeconds = gateSeconds,
            GateEdges = gateEdges,
            Estimator = estimator,
            Prescale = prescale,
            JitterTicks = jitter,
        };
    }

    [Fact]
    public void Invalid_settings_are_refused_with_the_setting_named()
    {
        var ex = Assert.Throws<ArgumentException>(() => new EdgeCounter(new CounterSettings { ClockHz = 0 }));
        Assert.Contains("clock_hz", ex.Message);
        ex = Assert.Throws<ArgumentException>(() => new EdgeCounter(Settings(1e6, estimator: EstimatorKind.SnapshotRegression)));
        Assert.Contains("estimator", ex.Message);
        Assert.Throws<ArgumentNullException>(() => new EdgeCounter(null!));
    }

    /// <summary>
    /// Gate semantics of docs/json-output.md ("count --json"): time 0 is the first edge, a time gate
    /// closes on the first edge at or after T, gates share their boundary edge, Edges counts both
    /// boundary edges. 200 kHz on 80 MHz is exactly 400 ticks per edge (exact arithmetic).
    /// </summary>
    [Fact]
    public void Time_gates_close_at_or_after_T_and_share_their_boundary_edge()
    {
        var c = new EdgeCounter(Settings(80e6, gateSeconds: 0.01));
        Assert.Equal(800_000, c.GateTicks);
        long start = 123_456_789;
        var results = new List<GateResult>();
        for (long k = 0; k <= 6000; k++)
        {
            if (c.AddEdge(start + 400 * k, out GateResult r)) results.Add(r);
        }

        Assert.Equal(3, results.Count);
        for (int g = 0; g < 3; g++)
        {
            GateResult r = results[g];
            Assert.Equal(GateState.Ok, r.State);
            Assert.True(r.HasFrequency);
            Assert.Equal(2001, r.Edges);
            Assert.Equal(start + 800_000L * g, r.StartTick);
            Assert.Equal(start + 800_000L * (g + 1), r.EndTick);
            Assert.Equal(0.01 * g, r.StartSeconds, 12);
            Assert.Equal(0.01 * (g + 1), r.EndSeconds, 12);
            Assert.Equal(200_000.0, r.FrequencyHz, 9);
            Assert.Equal(200_000.0, r.ReciprocalHz, 9);
            Assert.Equal(200_000.0, r.RegressionHz, 9);
            Assert.Equal(EstimatorKind.Regression, r.Estimator);
        }

        // Not exactly on T: an edge spacing of 300 ticks, 800000/300 = 2666.67 -> closes on edge 2667.
        var c2 = new EdgeCounter(Settings(80e6, gateSeconds: 0.01));
        GateResult first = default;
        for (long k = 0; k <= 3000; k++)
        {
            if (c2.AddEdge(300 * k, out GateResult r)) { first = r; break; }
        }

        Assert.Equal(2668, first.Edges);
        Assert.Equal(2667 * 300L, first.EndTick);
    }

    [Fact]
    public void Edge_gates_hold_gate_edges_intervals_and_prescaler_and_signal_are_carried()
    {
        var s = Settings(8e6, mode: GateMode.Edges, gateEdges: 100, prescale: 4, estimator: EstimatorKind.Reciprocal);
        s.Signal = SignalKind.Beat;
        var c = new EdgeCounter(s);
        var results = new List<GateResult>();
        // 8 MHz / 1000 ticks = 8 kHz recorded; input = 4 x 8 kHz = 32 kHz.
        for (long k = 0; k <= 1000; k++)
        {
            if (c.AddEdge(1000 * k, out GateResult r)) results.Add(r);
        }

        Assert.Equal(10, results.Count);
        foreach (GateResult r in results)
        {
            Assert.Equal(101, r.Edges);
            Assert.Equal(4, r.Prescale);
            Assert.Equal(SignalKind.Beat, r.Signal);
            Assert.Equal(EstimatorKind.Reciprocal, r.Estimator);
            Assert.Equal(32_000.0, r.FrequencyHz, 9);
            Assert.Equal(r.ReciprocalHz, r.FrequencyHz);
        }

        for (int g = 1; g < results.Count; g++) Assert.Equal(results[g - 1].EndTick, results[g].StartTick);
        Assert.Equal(10, c.GatesTotal);
    }

    /// <summary>
    /// Reciprocal counter resolution +-1/(f_clk T), independent of f: the measured span between the
    /// gate's first and last edge is within +-1 tick of the true span (Boyes (ed.), Instrumentation
    /// Reference Book, 3rd ed., 2003, Fig. 20.75; Hewlett-Packard Application Note 200, "Fundamentals
    /// of the Electronic Counters", from memory). Quantisation-only edges, 2000 frequency ratios
    /// f/f_clk from a seeded RNG, random phase.
    /// </summary>
    [Fact]
    public void Reciprocal_estimate_is_within_one_tick_over_the_gate_for_many_frequency_ratios()
    {
        var rng = new Random(2003);
        int checkedGates = 0;
        for (int trial = 0; trial < 2000; trial++)
        {
            // Period num/den ticks between 2.1 and 5000 ticks: f/f_clk from 2e-4 to 0.48.
            long den = rng.Next(1000, 1_000_000);
            long num = (long)(den * (2.1 + rng.NextDouble() * rng.NextDouble() * 5000));
            double clock = rng.Next(2) == 0 ? 80e6 : 1e6 + rng.Next(0, 100_000_000);
            double period = (double)num / den;
            double f = clock / period;
            int intervals = rng.Next(5, 3000);
            var c = new EdgeCounter(Settings(clock, mode: GateMode.Edges, gateEdges: intervals, estimator: EstimatorKind.Reciprocal));
            long phase = rng.NextInt64(0, den);
            long start = rng.NextInt64(0, 1L << 50);
            GateResult r = default;
            bool got = false;
            for (long k = 0; k <= intervals && !got; k++)
            {
                got = c.AddEdge(EdgeStreams.QuantisedTick(start, phase, num, den, k), out r);
            }

            Assert.True(got);
            double spanTicks = r.EndTick - r.StartTick;
            double bound = f / spanTicks; // relative 1/(f_clk T) with T the measured gate span
            Assert.True(Math.Abs(r.ReciprocalHz - f) <= bound * (1 + 1e-9),
                $"f={f} clock={clock} N={r.Edges}: error {r.ReciprocalHz - f} Hz exceeds the 1-tick bound {bound} Hz");
            Assert.Equal(r.ReciprocalHz, r.FrequencyHz);
            checkedGates++;
        }

        Assert.Equal(2000, checkedGates);
    }

    /// <summary>
    /// Variance ratio Pi/Omega = N (N+1) / (6 (N-1)): docs/references.md check values N=10: 2.037,
    /// N=100: 17.00, N=1000: 167.0 (Rubiola, Rev. Sci. Instrum. 76, 054703, 2005; Danielson,
    /// Vernotte, Rubiola, arXiv:1604.01004, 2016, eq. 21), reproduced from the two variance formulas.
    /// </summary>
    [Theory]
    [InlineData(10, 2.037, 0.0005)]
    [InlineData(100, 17.00, 0.005)]
    [InlineData(1000, 167.0, 0.05)]
    public void Variance_ratio_formula_matches_the_published_check_values(int n, double expected, double tol)
    {
        double sx2 = 1.0 / 12 + 25;
        double pi = 2 * sx2 / ((double)(n - 1) * (n - 1));
        double omega = 12 * sx2 / ((double)n * ((double)n * n - 1));
        Assert.Equal(expected, pi / omega, tol);
        Assert.Equal(expected, n * (n + 1.0) / (6.0 * (n - 1)), tol);
    }

    /// <summary>
    /// White timestamp jitter of 5 ticks rms (Gaussian, seeded) on top of quantisation: the measured
    /// SD of both estimators over 2000 gates is within 10 % of theory, Var_Pi = 2 sigma_x^2/(N-1)^2
    /// and Var_Omega = 12 sigma_x^2/(N (N^2-1)) with sigma_x^2 = 1/12 + 5^2 (Rubiola, Rev. Sci.
    /// Instrum. 76, 054703, 2005; Danielson, Vernotte, Rubiola, arXiv:1604.01004, 2016, eq. 21), the
    /// reported ErrorHz equals that theory, and the measured variance ratio is within 15 % of
    /// N (N+1) / (6 (N-1)) (same sources).
    /// </summary>
    [Theory]
    [InlineData(10)]
    [InlineData(100)]
    [InlineData(1000)]
    public void White_jitter_SD_of_both_estimators_matches_theory(int n)
    {
        const double jitter = 5.0;
        const double clock = 80e6;
        const long num = 6_481_237; // period 648.1237 ticks: about 123.43 kHz
        const long den = 10_000;
        double period = (double)num / den;
        double f = clock / period;
        const int gates = 2000;
        var rng = new Random(1000 + n);
        var rec = new EdgeCounter(Settings(clock, mode: GateMode.Edges, gateEdges: n - 1, estimator: EstimatorKind.Reciprocal, jitter: jitter));
        var reg = new EdgeCounter(Settings(clock, mode: GateMode.Edges, gateEdges: n - 1, estimator: EstimatorKind.Regression, jitter: jitter));
        double sumRec = 0, sumRec2 = 0, sumReg = 0, sumReg2 = 0;
        int count = 0;
        double errRec = 0, errReg = 0;
        long edges = (long)gates * (n - 1);
        for (long k = 0; k <= edges; k++)
        {
            double t = (k * (double)num / den) + jitter * EdgeStreams.Gaussian(rng);
            long tick = 5_000_000 + (long)Math.Floor(t);
            bool a = rec.AddEdge(tick, out GateResult ra);
            bool b = reg.AddEdge(tick, out GateResult rb);
            Assert.Equal(a, b);
            if (!a) continue;
            Assert.Equal(ra.ReciprocalHz, rb.ReciprocalHz);
            Assert.Equal(ra.RegressionHz, rb.RegressionHz);
            Assert.Equal(n, ra.Edges);
            sumRec += ra.ReciprocalHz - f; sumRec2 += (ra.ReciprocalHz - f) * (ra.ReciprocalHz - f);
            sumReg += rb.RegressionHz - f; sumReg2 += (rb.RegressionHz - f) * (rb.RegressionHz - f);
            errRec = ra.ErrorHz; errReg = rb.ErrorHz;
            count++;
        }

        Assert.Equal(gates, count);
        double sx2 = 1.0 / 12 + jitter * jitter;
        double theoryRec = f * Math.Sqrt(2 * sx2 / ((double)(n - 1) * (n - 1))) / period;
        double theoryReg = f * Math.Sqrt(12 * sx2 / ((double)n * ((double)n * n - 1))) / period;
        // ErrorHz is f sigma_P / P at the measured f and P, so it agrees with theory to the (tiny) frequency error.
        Assert.Equal(theoryRec, errRec, theoryRec * 1e-3);
        Assert.Equal(theoryReg, errReg, theoryReg * 1e-3);
        double varRec = (sumRec2 - sumRec * sumRec / count) / (count - 1);
        double varReg = (sumReg2 - sumReg * sumReg / count) / (count - 1);
        double sdRec = Math.Sqrt(varRec), sdReg = Math.Sqrt(varReg);
        Assert.InRange(sdRec / theoryRec, 0.9, 1.1);
        Assert.InRange(sdReg / theoryReg, 0.9, 1.1);
        double ratio = varRec / varReg;
        double expected = n * (n + 1.0) / (6.0 * (n - 1));
        Assert.InRange(ratio / expected, 0.85, 1.15);
    }

    /// <summary>
    /// 1 s gates at (about) 200 kHz on an 80 MHz clock, with the capture starting near 2^32 ticks,
    /// after three hours of ticks, and near 2^62: both estimators are compared with the exact truth
    /// computed in 128-bit integers from the same edges (reciprocal: (N-1) f_clk / span; regression:
    /// the least-squares slope n Sum(i t) - Sum(i) Sum(t) over n Sum(i^2) - Sum(i)^2), and with the
    /// true rate within the one-tick bound (Boyes 2003, Fig. 20.75).
    /// </summary>
    [Theory]
    [InlineData(4294967296L - 800_000_000L, 0)]       // crosses 2^32 ticks in the run
    [InlineData(4294967296L - 800_000_000L, 32)]      // the same through a 32-bit timer that wraps in the run
    [InlineData(3L * 3600 * 80_000_000, 0)]           // three hours of 80 MHz ticks
    [InlineData(3L * 3600 * 80_000_000, 24)]          // ... through a 24-bit timer (wraps every 0.2 s, 100 times)
    [InlineData(4611686018427387904L, 0)]             // 2^62
    [InlineData(4611686018427387904L, 64)]            // 2^62 as a raw 64-bit timer value
    public void One_second_gates_at_200_kHz_on_80_MHz_stay_exact_far_beyond_two_to_the_32(long start, int timerBits)
    {
        TimerUnwrapper? u = timerBits == 0 ? null : new TimerUnwrapper(timerBits);
        ulong mask = timerBits == 64 ? ulong.MaxValue : timerBits == 0 ? 0 : (1UL << timerBits) - 1;
        const double clock = 80e6;
        const long num = 800_000_000; // period 8e8/1999993 = 400.0014 ticks: 199 999.3 Hz
        const long den = 1_999_993;
        double fTrue = clock * den / num;
        var c = new EdgeCounter(Settings(clock, gateSeconds: 1.0));
        int gates = 0;
        Int128 si = 0, sii = 0, st = 0, sit = 0;
        long gateFirst = 0;
        int idx = 0;
        long k = 0;
        while (gates < 20)
        {
            long tick = EdgeStreams.QuantisedTick(start, 12345, num, den, k++);
            if (idx == 0) gateFirst = tick;
            Int128 rel = tick - gateFirst;
            si += idx; sii += (Int128)idx * idx; st += rel; sit += idx * rel;
            idx++;
            long fed = tick;
            if (u != null)
            {
                Assert.True(u.TryUnwrap((ulong)tick & mask, out fed));
                Assert.Equal(tick - start, fed);
            }

            if (!c.AddEdge(fed, out GateResult r)) continue;
            gates++;
            Int128 n = idx;
            Int128 numer = n * sit - si * st;
            Int128 denom = n * sii - si * si;
            double exactRegPeriod = (double)(numer / denom) + (double)(numer % denom) / (double)denom;
            double exactRegHz = clock / exactRegPeriod;
            double exactRecHz = (double)(idx - 1) * clock / (tick - gateFirst);
            Assert.Equal(exactRecHz, r.ReciprocalHz, exactRecHz * 1e-13);
            Assert.Equal(exactRegHz, r.RegressionHz, exactRegHz * 1e-12);
            double bound = fTrue / (r.EndTick - r.StartTick);
            Assert.True(Math.Abs(r.ReciprocalHz - fTrue) <= bound);
            Assert.True(Math.Abs(r.RegressionHz - fTrue) <= bound);
            Assert.Equal(1.0, r.SpanSeconds, 5);
            Assert.Equal(tick - (u == null ? 0 : start), r.EndTick);
            Assert.InRange(r.Edges, 199_999, 200_002);
            // The closing edge opens the next gate.
            si = 0; sii = 0; st = 0; sit = 0; idx = 1; gateFirst = tick;
        }

        Assert.True(c.EdgesTotal > 3_999_000);
        if (timerBits == 24) Assert.True(u!.Wraps >= 95, "wraps " + u.Wraps);
    }

    /// <summary>Glitch guard: a double-triggered edge 10 % of a period after a good edge is rejected and counted; the frequency is unchanged.</summary>
    [Fact]
    public void Double_triggered_edge_is_rejected_counted_and_flags_the_gate()
    {
        var clean = new EdgeCounter(Settings(1e6, mode: GateMode.Edges, gateEdges: 50));
        var dirty = new EdgeCounter(Settings(1e6, mode: GateMode.Edges, gateEdges: 50));
        var cleanResults = new List<GateResult>();
        var dirtyResults = new List<GateResult>();
        for (long k = 0; k <= 150; k++)
        {
            long t = 1000 + k * 1000 + (k * 7 % 3);
            if (clean.AddEdge(t, out GateResult a)) cleanResults.Add(a);
            if (dirty.AddEdge(t, out GateResult b)) dirtyResults.Add(b);
            if (k == 70) Assert.False(dirty.AddEdge(t + 100, out _));
        }

        Assert.Equal(3, dirtyResults.Count);
        Assert.Equal(GateState.Ok, dirtyResults[0].State);
        Assert.Equal(GateState.Glitch, dirtyResults[1].State);
        Assert.True(dirtyResults[1].HasFrequency);
        Assert.Equal(1, dirtyResults[1].Glitches);
        Assert.Equal(GateState.Ok, dirtyResults[2].State);
        Assert.Equal(1, dirty.GlitchesTotal);
        Assert.Equal(0, clean.GlitchesTotal);
        for (int g = 0; g < 3; g++)
        {
            Assert.Equal(cleanResults[g].FrequencyHz, dirtyResults[g].FrequencyHz);
            Assert.Equal(cleanResults[g].Edges, dirtyResults[g].Edges);
        }

        // A repeated or backwards tick is a glitch too, never a division by zero.
        Assert.False(dirty.AddEdge(151_000, out _)); // the last accepted tick again
        Assert.False(dirty.AddEdge(100, out _));
        Assert.Equal(3, dirty.GlitchesTotal);
    }

    /// <summary>Dropout: a gap of 51 periods (&gt; 8) closes the gate at the last good edge; the edge after the gap opens the next.</summary>
    [Fact]
    public void Gap_closes_the_gate_at_the_last_good_edge_and_the_next_gate_opens_after_it()
    {
        var c = new EdgeCounter(Settings(1e6, mode: GateMode.Edges, gateEdges: 100));
        var results = new List<GateResult>();
        for (long k = 0; k <= 400; k++)
        {
            if (k > 130 && k < 181) continue; // edges 131..180 missing: gap from 130 to 181
            if (c.AddEdge(k * 500, out GateResult r)) results.Add(r);
        }

        Assert.Equal(GateState.Ok, results[0].State);
        GateResult d = results[1];
        Assert.Equal(GateState.Dropout, d.State);
        Assert.True(d.HasFrequency);
        Assert.Equal(1, d.Dropouts);
        Assert.Equal(100 * 500, d.StartTick);
        Assert.Equal(130 * 500, d.EndTick);
        Assert.Equal(31, d.Edges);
        Assert.Equal(2000.0, d.FrequencyHz, 9);
        Assert.Equal(GateState.Ok, results[2].State);
        Assert.Equal(181 * 500, results[2].StartTick);
        Assert.Equal(101, results[2].Edges);
        Assert.Equal(1, c.DropoutsTotal);
    }

    [Fact]
    public void Gap_right_after_a_gate_boundary_gives_no_result_but_is_counted()
    {
        var c = new EdgeCounter(Settings(1e6, mode: GateMode.Edges, gateEdges: 10));
        int got = 0;
        for (long k = 0; k <= 10; k++) if (c.AddEdge(k * 500, out _)) got++;
        Assert.Equal(1, got);
        Assert.False(c.AddEdge(10 * 500 + 50 * 500, out _)); // gap: the gate held only its opening edge
        Assert.Equal(1, c.DropoutsTotal);
        Assert.True(c.HasRunningPeriod);
        for (long k = 61; k <= 69; k++) Assert.False(c.AddEdge(k * 500, out _));
        Assert.True(c.AddEdge(70 * 500, out GateResult r));
        Assert.Equal(60 * 500, r.StartTick);
        Assert.Equal(2000.0, r.FrequencyHz, 9);
    }

    /// <summary>No-signal: no edge within NoSignalSeconds gives NoSignal without a frequency, once per timeout; the open gate is never reported late.</summary>
    [Fact]
    public void No_edge_within_the_timeout_gives_no_signal_once_per_period_and_never_a_stale_number()
    {
        var s = Settings(1e6, mode: GateMode.Edges, gateEdges: 100);
        s.NoSignalSeconds = 0.5;
        var c = new EdgeCounter(s);
        Assert.False(c.Poll(0, out _));           // sets the reference
        Assert.True(c.Poll(500_000, out GateResult early));
        Assert.Equal(GateState.NoSignal, early.State);
        Assert.False(early.HasFrequency);

        long t = 600_000;
        for (int k = 0; k < 150; k++, t += 1000) c.AddEdge(t, out _);
        long last = t - 1000;
        Assert.False(c.Poll(last + 499_999, out _));
        Assert.True(c.Poll(last + 500_000, out GateResult ns));
        Assert.Equal(GateState.NoSignal, ns.State);
        Assert.False(ns.HasFrequency);
        Assert.Equal(0.0, ns.FrequencyHz);
        Assert.Equal(0.0, ns.ErrorHz);
        Assert.Equal(0, ns.Edges);
        Assert.Equal(last, ns.StartTick);
        Assert.Equal(last + 500_000, ns.EndTick);
        Assert.Equal((last + 500_000 - 600_000) / 1e6, ns.EndSeconds, 12);
        Assert.False(double.IsNaN(ns.FrequencyHz) || double.IsInfinity(ns.ErrorHz));
        Assert.False(c.Poll(last + 900_000, out _));          // once per timeout period
        Assert.True(c.Poll(last + 1_000_000, out GateResult again));
        Assert.Equal(GateState.NoSignal, again.State);

        // Signal back at a different rate: the first result holds only new edges.
        long back = last + 1_200_000;
        GateResult first = default;
        bool got = false;
        for (int k = 0; k <= 100 && !got; k++) got = c.AddEdge(back + k * 250L, out first);
        Assert.True(got);
        Assert.Equal(back, first.StartTick);
        Assert.Equal(4000.0, first.FrequencyHz, 9);
        Assert.Equal(GateState.Ok, first.State);
        Assert.Equal(0, c.DropoutsTotal);
    }

    [Fact]
    public void Long_gap_without_polling_is_a_dropout_and_the_period_is_learnt_again()
    {
        var c = new EdgeCounter(Settings(1e6, mode: GateMode.Edges, gateEdges: 100));
        for (int k = 0; k < 50; k++) c.AddEdge(k * 1000L, out _);
        Assert.True(c.AddEdge(49_000 + 2_000_000, out GateResult d));
        Assert.Equal(GateState.Dropout, d.State);
        Assert.Equal(50, d.Edges);
        Assert.False(c.HasRunningPeriod);
        // New rate 20x faster is accepted (not all glitches), since the period re-bootstraps.
        long s0 = 49_000 + 2_000_000;
        GateResult r = default;
        bool got = false;
        for (int k = 1; k <= 100 && !got; k++) got = c.AddEdge(s0 + k * 50L, out r);
        Assert.True(got);
        Assert.Equal(20_000.0, r.FrequencyHz, 9);
        Assert.Equal(0, c.GlitchesTotal);
    }

    [Fact]
    public void Double_trigger_on_the_very_first_interval_never_produces_a_number()
    {
        var c = new EdgeCounter(Settings(80e6, mode: GateMode.Edges, gateEdges: 100));
        var results = new List<GateResult>();
        Assert.False(c.AddEdge(0, out _));
        Assert.False(c.AddEdge(20, out _));          // double trigger: becomes the bootstrap interval
        for (long k = 1; k <= 1000; k++)
        {
            if (c.AddEdge(400 * k, out GateResult r)) results.Add(r);
        }

        Assert.NotEmpty(results);
        Assert.All(results, r => Assert.Equal(200_000.0, r.FrequencyHz, 1e-6));
        Assert.All(results, r => Assert.Equal(GateState.Ok, r.State));
        Assert.Equal(1, c.DropoutsTotal);
        Assert.Equal(400.0, c.RunningPeriodTicks, 1e-9);
    }

    [Fact]
    public void Reset_forgets_everything()
    {
        var c = new EdgeCounter(Settings(1e6, mode: GateMode.Edges, gateEdges: 10));
        for (int k = 0; k < 25; k++) c.AddEdge(k * 1000L, out _);
        c.AddEdge(24_500, out _);
        c.Reset();
        Assert.Equal(0, c.GlitchesTotal);
        Assert.Equal(0, c.EdgesTotal);
        Assert.False(c.HasTimeOrigin);
        Assert.False(c.HasRunningPeriod);
        GateResult r = default;
        for (int k = 0; k <= 10; k++) c.AddEdge(5 + k * 100L, out r);
        Assert.Equal(0.0, r.StartSeconds);
        Assert.Equal(10_000.0, r.FrequencyHz, 9);
    }
}

public class EdgeCounterNominalTests
{
    /// <summary>
    /// P0 badly off: the bootstrap interval is 500 ticks but the signal then runs at 400 ticks, so
    /// the residuals against P0 grow by 100 ticks per edge and pass 2^21 within the first gate; the
    /// re-nominalised sums must still give the exact least-squares slope (128-bit check) of the same edges.
    /// </summary>
    [Fact]
    public void Badly_off_nominal_period_is_re_nominalised_exactly()
    {
        var c = new EdgeCounter(new CounterSettings { ClockHz = 80e6, GateSeconds = 1.0 });
        var exact = new ExactLine();
        long tick = 1L << 40;
        GateResult r = default;
        bool got = false;
        for (int k = 0; !got; k++)
        {
            if (k == 1) tick += 500;
            else if (k > 1) tick += 400 + (k % 3 == 0 ? 1 : 0);
            exact.Add(k, tick);
            got = c.AddEdge(tick, out r);
        }

        Assert.InRange(r.Edges, 195_000, 205_000);
        double exactHz = 80e6 / exact.Slope;
        Assert.Equal(exactHz, r.RegressionHz, exactHz * 1e-12);
        double recHz = (r.Edges - 1) * 80e6 / (r.EndTick - r.StartTick);
        Assert.Equal(recHz, r.ReciprocalHz, recHz * 1e-13);
    }

    /// <summary>Low beat note with a long gate and a huge period (1.3 Hz on 80 MHz, 61.5 M ticks per edge): no overflow, exact.</summary>
    [Fact]
    public void Very_long_periods_stay_exact()
    {
        var c = new EdgeCounter(new CounterSettings { ClockHz = 80e6, GateSeconds = 20, NoSignalSeconds = 5 });
        var exact = new ExactLine();
        GateResult r = default;
        bool got = false;
        for (long k = 0; !got; k++)
        {
            long tick = EdgeStreams.QuantisedTick(1L << 62, 7, 800_000_000, 13, k);
            exact.Add(k, tick);
            got = c.AddEdge(tick, out r);
        }

        Assert.Equal(80e6 / exact.Slope, r.RegressionHz, 1e-12);
        Assert.Equal(1.3, r.RegressionHz, 1e-7);
        Assert.Equal(1.3, r.ReciprocalHz, 1.3 / (r.EndTick - r.StartTick));
    }
}
