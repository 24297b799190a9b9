using FreqReadout.Counting;

namespace FreqReadout.Tests.Counting;

public class SnapshotCounterTests
{
    private static CounterSettings Settings(double clockHz, double gateSeconds = 0.1, double jitter = 0, int prescale = 1)
        => new() { ClockHz = clockHz, GateSeconds = gateSeconds, JitterTicks = jitter, Prescale = prescale };

    /// <summary>
    /// Synthetic pulse-counter reads like the contract sample: 1 MHz timer, reads every 1 ms, the
    /// recorded tick off the true latch time by +-20 us uniform (read jitter, rms 20/sqrt(3) us),
    /// input 130 kHz, random phase. Over 2000 gates of 0.1 s the measured SD is within 10 % of the
    /// documented model's ErrorHz and the mean within 4 standard errors of the truth. The model is the
    /// ordinary least-squares slope variance sigma_y^2 / Sxx with white count quantisation (1/12) and
    /// time errors turned into counts by the slope (common practice, no source).
    /// </summary>
    [Fact]
    public void Read_jitter_of_20_us_at_1_MHz_matches_the_error_model_over_2000_gates()
    {
        const double f = 130_000;
        const double clock = 1e6;
        double jitterRms = 20 / Math.Sqrt(3);
        var c = new SnapshotCounter(Settings(clock, 0.1, jitterRms));
        var rng = new Random(130);
        double phase = rng.NextDouble();
        double sum = 0, sum2 = 0, err = 0;
        int gates = 0;
        for (long k = 0; gates < 2000; k++)
        {
            double latch = k * 1000.0 + 250 * rng.NextDouble();        // true latch time, ticks (irregular reads)
            long count = (long)Math.Floor(phase + f * latch / clock);
            long tick = (long)Math.Floor(latch + (rng.NextDouble() * 40 - 20)); // recorded with read jitter
            if (!c.AddSnapshot(tick, count, out GateResult r)) continue;
            Assert.Equal(GateState.Ok, r.State);
            Assert.True(r.HasFrequency);
            sum += r.FrequencyHz - f; sum2 += (r.FrequencyHz - f) * (r.FrequencyHz - f);
            err = r.ErrorHz;
            gates++;
        }

        double mean = sum / gates;
        double sd = Math.Sqrt((sum2 - sum * sum / gates) / (gates - 1));
        Assert.InRange(sd / err, 0.9, 1.1);
        Assert.InRange(mean, -4 * sd / Math.Sqrt(gates), 4 * sd / Math.Sqrt(gates));
        // The model's own figure for this case, written out: sigma_y^2 = 1/12 + s^2 (1/12 + J^2), s = 0.13
        // counts/tick; Sxx ~ n T^2/12 with n ~ 100 reads over T ~ 1e5 ticks.
        double s = f / clock;
        double sigmaY = Math.Sqrt(1.0 / 12 + s * s * (1.0 / 12 + jitterRms * jitterRms));
        double approx = clock * sigmaY / Math.Sqrt(101 * 1e10 / 12);
        Assert.InRange(err / approx, 0.85, 1.15);
    }

    /// <summary>Snapshots at 80 MHz far beyond 2^32 (near 2^62): the counter's slope equals the exact 128-bit least-squares slope of the same reads.</summary>
    [Theory]
    [InlineData(4611686018427387904L, 1)]
    [InlineData(5_000_000_000L, 4)]
    public void Regression_equals_the_exact_least_squares_slope_far_beyond_two_to_the_32(long start, int prescale)
    {
        const double clock = 80e6;
        var c = new SnapshotCounter(Settings(clock, 0.5, 0, prescale));
        var exact = new ExactLine();
        var rng = new Random(62);
        double rate = 199_999.3 / clock; // counts per tick
        int gates = 0;
        long countStart = 1L << 40;
        for (long k = 0; gates < 10; k++)
        {
            long tick = start + k * 80_000 + rng.Next(-1600, 1600);
            long count = countStart + (long)Math.Floor((tick - start) * rate);
            exact.Add(tick, count);
            if (!c.AddSnapshot(tick, count, out GateResult r)) continue;
            gates++;
            double exactHz = exact.Slope * clock * prescale;
            Assert.Equal(exactHz, r.FrequencyHz, exactHz * 1e-12);
            Assert.Equal(exact.Count, r.Edges);
            Assert.InRange(r.FrequencyHz, prescale * 199_999.3 - 4 * r.ErrorHz, prescale * 199_999.3 + 4 * r.ErrorHz);
            Assert.Equal(prescale, r.Prescale);
            exact.Clear();
            exact.Add(tick, count);
        }
    }

    /// <summary>Nominals badly off (first read interval 300 ticks, then 1000; first count step far from the rest): re-nominalisation keeps the result equal to the exact slope.</summary>
    [Fact]
    public void Badly_off_nominals_are_re_nominalised_exactly()
    {
        var c = new SnapshotCounter(Settings(1e6, 20.0));
        var exact = new ExactLine();
        long tick = 0, count = 0;
        GateResult r = default;
        bool got = false;
        for (int k = 0; !got; k++)
        {
            if (k == 1) { tick += 300; count += 5000; }
            else if (k > 1) { tick += 1000; count += 130 + (k % 3); }
            exact.Add(tick, count);
            got = c.AddSnapshot(tick, count, out r);
        }

        Assert.InRange(r.Edges, 19_990, 20_010); // u and v pass 2^22 long before the end
        Assert.Equal(exact.Slope * 1e6, r.FrequencyHz, 1e-9 * r.FrequencyHz);
    }

    [Fact]
    public void Snapshots_with_wrapped_16_bit_count_and_24_bit_timer_unwrap_and_count()
    {
        var ut = new TimerUnwrapper(24);
        var uc = new TimerUnwrapper(16, true);
        var c = new SnapshotCounter(Settings(1e6, 1.0));
        ulong t0 = (1UL << 24) - 12345, c0 = 65_000;
        GateResult r = default;
        int results = 0;
        for (long k = 0; k <= 3000; k++)
        {
            long t = k * 1000;
            ulong rawT = (t0 + (ulong)t) & 0xFFFFFF;
            ulong rawC = (c0 + (ulong)(t * 130_000 / 1_000_000)) & 0xFFFF;
            Assert.True(ut.TryUnwrap(rawT, out long tick));
            Assert.True(uc.TryUnwrap(rawC, out long cnt));
            if (c.AddSnapshot(tick, cnt, out r)) { results++; Assert.Equal(130_000.0, r.FrequencyHz, 1e-6); }
        }

        Assert.Equal(3, results);
        Assert.True(uc.Wraps >= 5 && ut.Wraps >= 1);
    }

    [Fact]
    public void Read_gap_is_a_dropout_and_a_stalled_count_closes_the_gate_then_gives_no_signal()
    {
        var s = Settings(1e6, 0.1);
        s.NoSignalSeconds = 0.3;
        var c = new SnapshotCounter(s);
        var results = new List<GateResult>();
        long count = 0;
        for (long k = 0; k <= 900; k++)
        {
            if (k > 150 && k < 170) continue;   // 20 reads missing: a gap of 20 intervals > 8
            if (k < 250 || k >= 700) count = k * 50; // 50 kHz; the count stands still from 249 ms to 700 ms
            if (c.AddSnapshot(k * 1000, count, out GateResult r)) results.Add(r);
        }

        var drops = results.Where(r => r.State == GateState.Dropout).ToList();
        Assert.Equal(2, drops.Count);
        Assert.Equal(2, c.DropoutsTotal);
        // Read gap: closes at the last read before it.
        Assert.Equal(100_000, drops[0].StartTick);
        Assert.Equal(150_000, drops[0].EndTick);
        Assert.Equal(51, drops[0].Edges);
        Assert.Equal(50_000.0, drops[0].FrequencyHz, 1e-6);
        // Count stall: 50 counts expected per read, none came at 250 ms: closes at 249 ms, no flat read inside.
        Assert.Equal(170_000, drops[1].StartTick);
        Assert.Equal(249_000, drops[1].EndTick);
        Assert.Equal(50_000.0, drops[1].FrequencyHz, 1e-6);

        var noSignal = results.Where(r => r.State == GateState.NoSignal).ToList();
        Assert.Single(noSignal); // 0.3 s after the last count change (549 ms); the next would be due at 849 ms
        Assert.Equal(249_000, noSignal[0].StartTick);
        Assert.Equal(549_000, noSignal[0].EndTick);
        Assert.False(noSignal[0].HasFrequency);
        Assert.Equal(0.0, noSignal[0].FrequencyHz);

        // After the count moves again at 700 ms, the next gate opens there: no stale or mixed number.
        var after = results.Where(r => r.StartTick >= 549_000).ToList();
        Assert.Equal(2, after.Count);
        Assert.Equal(700_000, after[0].StartTick);
        Assert.All(after, r => { Assert.Equal(GateState.Ok, r.State); Assert.Equal(50_000.0, r.FrequencyHz, 1e-6); });
    }

    [Fact]
    public void Slow_count_with_many_flat_reads_is_not_a_stall()
    {
        // 400 Hz on 1 ms reads: 0.4 counts per read, most reads see no new count.
        var c = new SnapshotCounter(Settings(1e6, 1.0));
        int gates = 0;
        for (long k = 0; k <= 5000; k++)
        {
            if (!c.AddSnapshot(k * 1000 + 3, (k * 1000 + 3) * 400 / 1_000_000, out GateResult r)) continue;
            gates++;
            Assert.Equal(GateState.Ok, r.State);
            Assert.InRange(r.FrequencyHz, 400 - 3 * r.ErrorHz, 400 + 3 * r.ErrorHz);
        }

        Assert.Equal(5, gates);
        Assert.Equal(0, c.DropoutsTotal);
        Assert.Equal(2500.0, c.RunningCountPeriodTicks, 125.0); // measured between reads 2 or 3 ms apart, averaged
    }

    [Fact]
    public void Backwards_read_is_rejected_and_flags_the_gate()
    {
        var c = new SnapshotCounter(Settings(1e6, 0.01));
        GateResult r = default;
        bool got = false;
        for (long k = 0; k <= 10 && !got; k++)
        {
            if (k == 5) Assert.False(c.AddSnapshot(k * 1000 - 1500, k * 10, out _));
            got = c.AddSnapshot(k * 1000, k * 10, out r);
        }

        Assert.True(got);
        Assert.Equal(GateState.Glitch, r.State);
        Assert.Equal(1, r.Glitches);
        Assert.Equal(10_000.0, r.FrequencyHz, 1e-6);
        Assert.Equal(1, c.GlitchesTotal);
    }

    [Fact]
    public void Edge_mode_gates_hold_gate_edges_snapshot_intervals_and_share_the_boundary()
    {
        var s = Settings(1e6);
        s.Mode = GateMode.Edges;
        s.GateEdges = 50;
        s.Signal = SignalKind.Beat;
        var c = new SnapshotCounter(s);
        var results = new List<GateResult>();
        for (long k = 0; k <= 200; k++)
        {
            if (c.AddSnapshot(5 + k * 997, (5 + k * 997) * 400 / 1000, out GateResult r)) results.Add(r);
        }

        Assert.Equal(4, results.Count);
        Assert.All(results, r => { Assert.Equal(51, r.Edges); Assert.Equal(SignalKind.Beat, r.Signal); });
        for (int g = 1; g < 4; g++) Assert.Equal(results[g - 1].EndTick, results[g].StartTick);
        Assert.Equal(0.0, results[0].StartSeconds);
        Assert.InRange(results[0].FrequencyHz, 400_000 - 3 * results[0].ErrorHz, 400_000 + 3 * results[0].ErrorHz);
        c.Reset();
        Assert.Equal(0, c.SnapshotsTotal);
        Assert.False(c.AddSnapshot(10, 0, out _));
    }
}
