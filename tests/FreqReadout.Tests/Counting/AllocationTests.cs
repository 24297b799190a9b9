using FreqReadout.Counting;

namespace FreqReadout.Tests.Counting;

/// <summary>
/// Hot paths allocate nothing (DEVELOPERS.md, nanoFramework rules: the device's garbage collector is slow and a
/// pause drops edges). Counted with GC.GetAllocatedBytesForCurrentThread over at least a million
/// inputs after a warm-up; the inputs include glitches, dropouts, no-signal polls and gate closes.
/// </summary>
[Collection("Allocation")]
public class AllocationTests
{
    private static long Feed(EdgeCounter c, TimerUnwrapper u, GateResult r, long from, long count, ref double sink)
    {
        long gates = 0;
        for (long k = from; k < from + count; k++)
        {
            ulong raw = (ulong)(k * 401 + (k * 13 % 7)) & 0xFFFFFFFFUL;
            if (k % 300_000 == 10) continue;                            // one missing edge (not a dropout)
            if (k % 400_000 == 20) continue;                            // two missing edges ...
            if (k % 400_000 > 20 && k % 400_000 < 40) continue;         // ... and a dropout of 20 periods
            if (!u.TryUnwrap(raw, out long tick)) continue;
            if (c.AddEdge(tick, r))
            {
                gates++;
                sink += r.FrequencyHz + r.ErrorHz;
            }

            if (k % 50_000 == 7 && u.TryUnwrap((raw + 20) & 0xFFFFFFFFUL, out long extra) && c.AddEdge(extra, r))
            {
                sink += r.FrequencyHz; // double trigger 20 ticks after the edge
            }

            if ((k & 1023) == 0 && c.Poll(tick, r)) sink += r.EndSeconds;
        }

        return gates;
    }

    [Fact]
    public void EdgeCounter_and_TimerUnwrapper_allocate_nothing_over_a_million_edges()
    {
        var c = new EdgeCounter(new CounterSettings { ClockHz = 80e6, GateSeconds = 0.01, JitterTicks = 2 });
        var u = new TimerUnwrapper(32);
        var r = new GateResult(); // caller-owned, filled in place by the counter
        double sink = 0;
        Feed(c, u, r, 0, 200_000, ref sink); // warm-up (JIT, tiering)

        // The least of three runs: on a loaded machine the runtime's own tier-up can be counted on this thread
        // inside one run; an allocation per edge or per gate would show in every run.
        var counts = new long[3];
        long gates = 0;
        for (int run = 0; run < counts.Length; run++)
        {
            long from = 200_000 + (run * 1_000_000L);
            long before = GC.GetAllocatedBytesForCurrentThread();
            gates += Feed(c, u, r, from, 1_000_000, ref sink);
            counts[run] = GC.GetAllocatedBytesForCurrentThread() - before;
        }

        Assert.True(counts.Min() == 0, "bytes allocated per run: " + string.Join(", ", counts));
        Assert.True(gates > 500, "gates " + gates);
        Assert.True(c.GlitchesTotal >= 24, "glitches " + c.GlitchesTotal);
        Assert.True(c.DropoutsTotal >= 3, "dropouts " + c.DropoutsTotal);
        Assert.True(sink > 0);
    }

    private static long FeedSnapshots(SnapshotCounter c, TimerUnwrapper ut, TimerUnwrapper uc, GateResult r, long from, long count, ref double sink)
    {
        long gates = 0;
        for (long k = from; k < from + count; k++)
        {
            if (k % 250_000 > 100 && k % 250_000 < 120) continue;           // a read gap (dropout)
            long t = k * 1000 + (k * 7919 % 41) - 20;                           // +-20 ticks of read jitter
            long n = (k % 500_000 > 1000 && k % 500_000 < 1200) ? (k - k % 500_000 + 1000) * 130 : t * 130 / 1000; // a count stall
            if (k % 100_003 == 5) { if (ut.TryUnwrap((ulong)(t - 5000) & 0xFFFFFFFF, out long bad)) c.AddSnapshot(bad, 0, r); }
            if (!ut.TryUnwrap((ulong)t & 0xFFFFFFFF, out long tick) || !uc.TryUnwrap((ulong)n & 0xFFFF, out long cnt)) continue;
            if (c.AddSnapshot(tick, cnt, r))
            {
                gates++;
                sink += r.FrequencyHz + r.ErrorHz + r.EndSeconds;
            }
        }

        return gates;
    }

    [Fact]
    public void SnapshotCounter_allocates_nothing_over_a_million_snapshots()
    {
        var c = new SnapshotCounter(new CounterSettings { ClockHz = 1e6, GateSeconds = 0.1, JitterTicks = 11.5 });
        var ut = new TimerUnwrapper(32);
        var uc = new TimerUnwrapper(16, true);
        var r = new GateResult();
        double sink = 0;
        FeedSnapshots(c, ut, uc, r, 0, 200_000, ref sink);
        long before = GC.GetAllocatedBytesForCurrentThread();
        long gates = FeedSnapshots(c, ut, uc, r, 200_000, 1_100_000, ref sink);
        long after = GC.GetAllocatedBytesForCurrentThread();
        Assert.Equal(0, after - before);
        Assert.True(gates > 10_000, "gates " + gates);
        Assert.True(c.DropoutsTotal >= 6, "dropouts " + c.DropoutsTotal);
        Assert.True(sink > 0);
    }
}
