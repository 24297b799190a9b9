using BenchmarkDotNet.Attributes;
using FreqReadout.Counting;

namespace FreqReadout.Benchmarks;

/// <summary>
/// Throughput of the counting core: recorded edges (or snapshots) per second through
/// EdgeCounter / SnapshotCounter with the 32-bit TimerUnwrapper in front. Each operation is one
/// edge (OperationsPerInvoke), so the reported mean is the time per edge; edges/s = 1 / mean.
/// Run: dotnet run -c Release --project tests/FreqReadout.Benchmarks -- --filter '*Counting*' --job short
/// </summary>
[MemoryDiagnoser]
public class CountingBenchmarks
{
    private const int Edges = 1_000_000;
    private ulong[] _raw = Array.Empty<ulong>();
    private long[] _counts = Array.Empty<long>();
    private readonly long[] _run = new long[8192];

    [GlobalSetup]
    public void Setup()
    {
        var rng = new Random(1);
        _raw = new ulong[Edges];
        _counts = new long[Edges];
        double t = 4_000_000_000.0; // near the 32-bit wrap
        for (int k = 0; k < Edges; k++)
        {
            t += 400.0014 + rng.NextDouble() * 4 - 2; // about 200 kHz on 80 MHz with +-2 ticks jitter
            _raw[k] = (ulong)t & 0xFFFFFFFFUL;
            _counts[k] = (long)(t * 0.0025);
        }
    }

    [Benchmark(OperationsPerInvoke = Edges)]
    public double EdgeCounterRegression100msGates()
    {
        var u = new TimerUnwrapper(32);
        var c = new EdgeCounter(new CounterSettings { ClockHz = 80e6, GateSeconds = 0.1, JitterTicks = 1.2 });
        var r = new GateResult();
        double sum = 0;
        ulong[] raw = _raw;
        for (int k = 0; k < raw.Length; k++)
        {
            if (u.TryUnwrap(raw[k], out long tick) && c.AddEdge(tick, r))
            {
                sum += r.FrequencyHz;
            }
        }

        return sum;
    }

    /// <summary>
    /// The host's per-edge steps before the batch entry points: TryUnwrap, AddEdge, then the running period handed
    /// back to the unwrapper (the before of <see cref="HostPathBatched"/>, same data, same gates).
    /// </summary>
    [Benchmark(OperationsPerInvoke = Edges, Baseline = true)]
    public double HostPathOneByOne()
    {
        var u = new TimerUnwrapper(32);
        var c = new EdgeCounter(new CounterSettings { ClockHz = 80e6, GateSeconds = 0.1, JitterTicks = 1.2 });
        var r = new GateResult();
        double sum = 0;
        ulong[] raw = _raw;
        for (int k = 0; k < raw.Length; k++)
        {
            if (u.TryUnwrap(raw[k], out long tick))
            {
                if (c.AddEdge(tick, r))
                {
                    sum += r.FrequencyHz;
                }

                if (c.HasRunningPeriod)
                {
                    u.ExpectedIntervalTicks = c.RunningPeriodTicks;
                }
            }
        }

        return sum;
    }

    /// <summary>
    /// The same through the batch entry points, in batches of 8192 rows as the host reads them: UnwrapRun of the plain
    /// timer steps, then AddEdges (a run of plain edges, or one other edge, per call), the single-value path for the rest.
    /// </summary>
    [Benchmark(OperationsPerInvoke = Edges)]
    public double HostPathBatched()
    {
        var u = new TimerUnwrapper(32);
        var c = new EdgeCounter(new CounterSettings { ClockHz = 80e6, GateSeconds = 0.1, JitterTicks = 1.2 });
        var r = new GateResult();
        double sum = 0;
        ulong[] raw = _raw;
        long[] run = _run;
        ulong maxStep = 80_000_000; // 1 s, the default no-signal time at 80 MHz
        for (int start = 0; start < raw.Length; start += run.Length)
        {
            int n = Math.Min(run.Length, raw.Length - start);
            for (int k = start; k < start + n;)
            {
                int m = u.UnwrapRun(raw, k, start + n - k, maxStep, run, 0);
                for (int j = 0; j < m;)
                {
                    j += c.AddEdges(run, j, m - j, r, out bool closed);
                    if (closed)
                    {
                        sum += r.FrequencyHz;
                    }

                    if (c.HasRunningPeriod)
                    {
                        u.ExpectedIntervalTicks = c.RunningPeriodTicks;
                    }
                }

                k += m;
                if (m == 0 || k >= start + n)
                {
                    if (m == 0)
                    {
                        if (u.TryUnwrap(raw[k], out long tick))
                        {
                            if (c.AddEdge(tick, r))
                            {
                                sum += r.FrequencyHz;
                            }

                            if (c.HasRunningPeriod)
                            {
                                u.ExpectedIntervalTicks = c.RunningPeriodTicks;
                            }
                        }

                        k++;
                    }
                }
            }
        }

        return sum;
    }

    [Benchmark(OperationsPerInvoke = Edges)]
    public double SnapshotCounter100msGates()
    {
        var u = new TimerUnwrapper(32);
        var c = new SnapshotCounter(new CounterSettings { ClockHz = 80e6, GateSeconds = 0.1 });
        var r = new GateResult();
        double sum = 0;
        ulong[] raw = _raw;
        long[] counts = _counts;
        for (int k = 0; k < raw.Length; k++)
        {
            if (u.TryUnwrap(raw[k], out long tick) && c.AddSnapshot(tick, counts[k], r))
            {
                sum += r.FrequencyHz;
            }
        }

        return sum;
    }
}
