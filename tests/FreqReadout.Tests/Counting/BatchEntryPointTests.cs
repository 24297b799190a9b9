using FreqReadout.Counting;

namespace FreqReadout.Tests.Counting;

/// <summary>
/// EdgeCounter.AddEdges and TimerUnwrapper.UnwrapRun against AddEdge and TryUnwrap one value at a time, on random
/// streams with jitter, glitches, missed edges, dropouts, no-signal gaps, backward steps and timer wraps: every gate
/// result (bit for bit), every total and the running period must be the same after every call.
/// </summary>
public class BatchEntryPointTests
{
    private static ulong[] RandomRaw(int seed, int count, int bits)
    {
        var rng = new Random(seed);
        ulong mask = bits == 64 ? ulong.MaxValue : (1UL << bits) - 1;
        var raw = new ulong[count];
        double period = 200 + rng.Next(0, 2000);
        double t = bits == 64 ? 1e6 : rng.NextDouble() * mask;
        for (int k = 0; k < count; k++)
        {
            int pick = rng.Next(0, 400);
            double step = period * (1 + ((rng.NextDouble() - 0.5) * 0.002)) + ((rng.NextDouble() - 0.5) * 6);
            if (pick == 0) step = period * 0.1; // glitch
            else if (pick == 1) step = period * rng.Next(2, 10); // missed edges or a dropout
            else if (pick == 2) step = period * 40000; // a long gap
            else if (pick == 3) step = -period * rng.Next(1, 5); // a step back
            else if (pick == 4) step = period * 1.6; // between 1.5 and 1.75 periods
            else if (pick == 5) step = 0; // a repeat
            t += step;
            raw[k] = (ulong)(long)Math.Max(0, t) & mask;
        }

        return raw;
    }

    private static string Text(GateResult r) =>
        $"{r.State} {r.HasFrequency} {BitConverter.DoubleToInt64Bits(r.FrequencyHz)} {BitConverter.DoubleToInt64Bits(r.ErrorHz)} " +
        $"{BitConverter.DoubleToInt64Bits(r.ReciprocalHz)} {BitConverter.DoubleToInt64Bits(r.RegressionHz)} {r.Edges} {r.StartTick} {r.EndTick} " +
        $"{BitConverter.DoubleToInt64Bits(r.StartSeconds)} {BitConverter.DoubleToInt64Bits(r.EndSeconds)} {r.Glitches} {r.Dropouts} {r.InputEdges} {r.InferredEdges}";

    private static string State(EdgeCounter c) =>
        $"{c.GlitchesTotal} {c.DropoutsTotal} {c.InferredTotal} {c.EdgesTotal} {c.GatesTotal} {c.HasRunningPeriod} {BitConverter.DoubleToInt64Bits(c.RunningPeriodTicks)}";

    [Theory]
    [InlineData(1, 32, GateMode.Time, true, 2000)]
    [InlineData(2, 24, GateMode.Time, true, 2000)]
    [InlineData(3, 16, GateMode.Edges, true, 2000)]
    [InlineData(4, 64, GateMode.Time, false, 2000)]
    [InlineData(5, 32, GateMode.Edges, false, 2000)]
    [InlineData(6, 32, GateMode.Time, true, 1.2)]
    public void Batches_give_what_one_edge_at_a_time_gives(int seed, int bits, GateMode mode, bool infer, double dropoutPeriods)
    {
        const int Count = 200_000;
        ulong[] raw = RandomRaw(seed, Count, bits);
        var settings = new CounterSettings
        {
            ClockHz = 80e6, Mode = mode, GateSeconds = 0.002, GateEdges = 37, JitterTicks = 0.5, NoSignalSeconds = 0.05,
            InferMissedEdges = infer, DropoutPeriods = Math.Min(dropoutPeriods, 8),
        };
        ulong maxStep = (ulong)(settings.NoSignalSeconds * settings.ClockHz / 3);

        var oneU = new TimerUnwrapper(bits);
        var oneC = new EdgeCounter(settings);
        var oneR = new GateResult();
        var expected = new List<string>();
        var expectedAfter = new List<string>();
        for (int k = 0; k < Count; k++)
        {
            if (oneU.TryUnwrap(raw[k], out long tick))
            {
                if (oneC.AddEdge(tick, oneR))
                {
                    expected.Add(Text(oneR));
                }

                if (oneC.HasRunningPeriod)
                {
                    oneU.ExpectedIntervalTicks = oneC.RunningPeriodTicks;
                }
            }

            expectedAfter.Add(State(oneC) + " " + oneU.LastTick + " " + oneU.Wraps + " " + oneU.Rejected);
        }

        var u = new TimerUnwrapper(bits);
        var c = new EdgeCounter(settings);
        var r = new GateResult();
        var got = new List<string>();
        var run = new long[Count];
        int tookRuns = 0;
        for (int k = 0; k < Count;)
        {
            int m = u.UnwrapRun(raw, k, Math.Min(Count - k, 1000), maxStep, run, 0);
            for (int j = 0; j < m;)
            {
                j += c.AddEdges(run, j, m - j, r, out bool closed);
                if (closed)
                {
                    got.Add(Text(r));
                }

                if (c.HasRunningPeriod)
                {
                    u.ExpectedIntervalTicks = c.RunningPeriodTicks;
                }
            }

            if (m > 0)
            {
                tookRuns += m;
                k += m;
                Assert.Equal(expectedAfter[k - 1], State(c) + " " + u.LastTick + " " + u.Wraps + " " + u.Rejected);
                continue;
            }

            if (u.TryUnwrap(raw[k], out long tick))
            {
                if (c.AddEdges([tick], 0, 1, r, out bool closed) == 1 && closed)
                {
                    got.Add(Text(r));
                }

                if (c.HasRunningPeriod)
                {
                    u.ExpectedIntervalTicks = c.RunningPeriodTicks;
                }
            }

            Assert.Equal(expectedAfter[k], State(c) + " " + u.LastTick + " " + u.Wraps + " " + u.Rejected);
            k++;
        }

        Assert.True(tookRuns > Count / 2, $"only {tookRuns} values in runs");
        Assert.True(expected.Count > 20, $"only {expected.Count} gates");
        Assert.Equal(expected, got);
    }

    [Fact]
    public void Out_of_range_arguments_are_refused()
    {
        var c = new EdgeCounter(new CounterSettings { ClockHz = 1e6 });
        Assert.Throws<ArgumentOutOfRangeException>(() => c.AddEdges(new long[4], 2, 3, new GateResult(), out _));
        Assert.Throws<ArgumentOutOfRangeException>(() => c.AddEdges(new long[4], 0, 0, new GateResult(), out _));
        Assert.Throws<ArgumentNullException>(() => c.AddEdges(null!, 0, 1, new GateResult(), out _));
        var u = new TimerUnwrapper(32);
        Assert.Equal(0, u.UnwrapRun(new ulong[4], 0, 4, 100, new long[4], 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => u.UnwrapRun(new ulong[4], 0, 4, 100, new long[3], 0));
    }
}
