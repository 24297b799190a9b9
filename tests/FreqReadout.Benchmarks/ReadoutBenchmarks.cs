using BenchmarkDotNet.Attributes;
using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Readout;

namespace FreqReadout.Benchmarks;

/// <summary>
/// Cost of one reading through the readout pipeline (tracking, detection, default settings with a
/// 512-gate noise window) on a stream of 0.1 s gates with drift and target passes. Each operation is
/// one gate (OperationsPerInvoke), so the mean is the time per reading.
/// Run: dotnet run -c Release --project tests/FreqReadout.Benchmarks -- --filter '*Readout*' --job short
/// </summary>
[MemoryDiagnoser]
public class ReadoutBenchmarks
{
    private const int Gates = 100_000;
    private GateResult[] _gates = Array.Empty<GateResult>();

    [GlobalSetup]
    public void Setup()
    {
        var rng = new Random(1);
        _gates = new GateResult[Gates];
        for (int k = 0; k < Gates; k++)
        {
            double t0 = k * 0.1;
            double t1 = t0 + 0.1;
            double f = 100_000 + (0.001 * t1) + (k % 200 > 195 ? 2.0 : 0) + (0.1 * (rng.NextDouble() - 0.5) * 3.46);
            _gates[k] = new GateResult();
            _gates[k].Set(GateState.Ok, EstimatorKind.Regression, SignalKind.Search, true, f, 0, f, f, 10_000, 1, 0, 0, t0, t1, 0, 0, 9_999, 0);
        }
    }

    [Benchmark(OperationsPerInvoke = Gates)]
    public int PipelineProcess()
    {
        var p = new ReadoutPipeline(new ReadoutSettings());
        var reading = new Reading();
        var e = new DetectionEvent();
        int events = 0;
        GateResult[] gates = _gates;
        for (int k = 0; k < gates.Length; k++)
        {
            p.Process(gates[k], reading);
            while (p.TryTakeEvent(e))
            {
                events++;
            }
        }

        return events;
    }
}
