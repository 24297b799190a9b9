using BenchmarkDotNet.Attributes;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Benchmarks;

/// <summary>
/// Throughput of the capture simulator: 1 s of a 100 kHz search oscillator (100 000 edges) with white and flicker-like FM,
/// 5 ns jitter and one copper target under a sweeping coil, into a writer that only counts rows. Each operation is one edge
/// (OperationsPerInvoke), so the mean is the time per simulated edge; an hour at 100 kHz is 360 M edges.
/// Run: dotnet run -c Release --project tests/FreqReadout.Benchmarks -- --filter '*Simulator*' --job short
/// </summary>
[MemoryDiagnoser]
public class SimulatorBenchmarks
{
    private const int Edges = 100_000;
    private SceneModel _model = null!;

    [GlobalSetup]
    public void Setup()
    {
        var scene = new Scene
        {
            DurationS = 1.0,
            Oscillator = new SceneOscillator { FrequencyHz = 100_000, WhiteFmAdev1s = 5e-8, FlickerAdev = 2e-8 },
            Targets = { new SceneTarget { Material = "copper", RadiusM = 0.01, DepthM = 0.08, PositionM = 0.2 } },
            Sweep = new SceneSweep { StartM = 0, EndM = 0.4, SpeedMPerS = 0.4, Passes = 1, LeadInS = 0, TailS = 0 },
            Hardware = new SceneHardware { ClockHz = 80e6, TimerBits = 32, TimestampMethod = TimestampMethod.Custom, JitterS = 5e-9 },
        };
        _model = new SceneModel(scene);
    }

    [Benchmark(OperationsPerInvoke = Edges)]
    public long SimulateEdges()
    {
        var writer = new CountingWriter();
        new CaptureSimulator(_model).Run(writer);
        return writer.Rows;
    }

    private sealed class CountingWriter : ICaptureWriter
    {
        public long Rows;

        public void WriteRow(in CaptureRow row) => Rows++;

        public void Complete(IReadOnlyList<KeyValuePair<string, string>> trailer)
        {
        }

        public void Dispose()
        {
        }
    }
}
