using FreqReadout.Detection;
using BenchmarkDotNet.Attributes;
using FreqReadout.Counting;
using FreqReadout.Readout;

namespace FreqReadout.Benchmarks;

/// <summary>
/// The readout pipeline the device runs (baseline capture, drift tracker, detection, sign rule):
/// <see cref="PipelinePerGate"/> times <see cref="ReadoutPipeline.Process"/> alone, per gate, over
/// 20 000 prepared 10 ms gates (200 s) of a 100 kHz search oscillator with slow drift and target passes;
/// <see cref="EdgesThroughCounterAndPipeline"/> times the whole chain per recorded edge: 32-bit timer
/// unwrap, regression counting, then the pipeline on every closed gate.
/// Run: dotnet run -c Release --project tests/FreqReadout.Benchmarks -- --filter '*ReadoutPipeline*' --job short
/// </summary>
[MemoryDiagnoser]
public class ReadoutPipelineBenchmarks
{
    private const double ClockHz = 80e6;
    private const double SearchHz = 100_000;
    private const int Edges = 2_000_000; // 20 s at 100 kHz
    private ulong[] _raw = Array.Empty<ulong>();
    private GateResult[] _gates = Array.Empty<GateResult>();

    [GlobalSetup]
    public void Setup()
    {
        // Edges: 100 kHz with +1 Hz/min drift, a +5 Hz target pass of 0.5 s every 4 s, +-2 ticks jitter.
        var rng = new Random(7);
        _raw = new ulong[Edges];
        double t = 4_000_000_000.0 / ClockHz; // seconds; starts near the 32-bit wrap
        for (int k = 0; k < Edges; k++)
        {
            _raw[k] = (ulong)((t * ClockHz) + (rng.NextDouble() * 4) - 2) & 0xFFFFFFFFUL;
            t += 1.0 / FrequencyAt(k / SearchHz);
        }

        // Gates for the pipeline-only benchmark: counted once from a longer run of the same signal.
        var gates = new List<GateResult>();
        var u = new TimerUnwrapper(32);
        var c = new EdgeCounter(Counter());
        double tt = 0;
        long edge = 0;
        while (gates.Count < 20_000)
        {
            long tick = (long)(tt * ClockHz) + rng.Next(-2, 3) + 1000;
            var r = new GateResult();
            if (u.TryUnwrap((ulong)tick & 0xFFFFFFFFUL, out long unwrapped) && c.AddEdge(unwrapped, r))
            {
                gates.Add(r);
            }

            tt += 1.0 / FrequencyAt(edge / SearchHz);
            edge++;
        }

        _gates = gates.ToArray();
    }

    private static double FrequencyAt(double seconds)
    {
        double shift = (seconds % 4.0) is double p && p > 2.0 && p < 2.5 ? 5.0 : 0.0;
        return SearchHz + (seconds / 60.0) + shift;
    }

    private static CounterSettings Counter() => new() { ClockHz = ClockHz, GateSeconds = 0.01, JitterTicks = 1.2 };

    private static ReadoutSettings Readout() => new() { SearchHz = SearchHz };

    [Benchmark(OperationsPerInvoke = 20_000)]
    public int PipelinePerGate()
    {
        var pipeline = new ReadoutPipeline(Readout());
        var reading = new Reading();
        var e = new DetectionEvent();
        int present = 0;
        GateResult[] gates = _gates;
        for (int i = 0; i < gates.Length; i++)
        {
            if (pipeline.Process(gates[i], reading) && reading.TargetPresent)
            {
                present++;
            }

            while (pipeline.TryTakeEvent(e))
            {
            }
        }

        return present;
    }

    [Benchmark(OperationsPerInvoke = Edges)]
    public int EdgesThroughCounterAndPipeline()
    {
        var u = new TimerUnwrapper(32);
        var c = new EdgeCounter(Counter());
        var pipeline = new ReadoutPipeline(Readout());
        var gate = new GateResult();
        var reading = new Reading();
        var e = new DetectionEvent();
        int present = 0;
        ulong[] raw = _raw;
        for (int k = 0; k < raw.Length; k++)
        {
            if (u.TryUnwrap(raw[k], out long tick) && c.AddEdge(tick, gate)
                && pipeline.Process(gate, reading) && reading.TargetPresent)
            {
                present++;
            }

            while (pipeline.TryTakeEvent(e))
            {
            }
        }

        return present;
    }
}
