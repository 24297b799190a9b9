using BenchmarkDotNet.Attributes;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Benchmarks;

/// <summary>
/// Throughput of the capture simulator.
/// <para><see cref="SimulateEdges"/>: 1 s of a 100 kHz search oscillator, every cycle recorded (prescale 1, 100 000 edges),
/// with white and flicker-like FM, 5 ns jitter and one copper target under a sweeping coil, into a writer that only counts
/// rows; each operation is one edge (OperationsPerInvoke).</para>
/// <para><see cref="SimulateDemoSceneText"/>: the whole built-in demo scene (82 s of a 100 kHz search oscillator, prescale
/// 32, three targets, temp_c every 300 rows) written as a text capture to a null stream; each operation is one oscillator
/// cycle (8.2 M per run). The truth's exact per-target peak search, a fixed cost of the command, is left out.</para>
/// Run: dotnet run -c Release --project tests/FreqReadout.Benchmarks -- --filter '*Simulator*' --job short
/// </summary>
[MemoryDiagnoser]
public class SimulatorBenchmarks
{
    private const int Edges = 100_000;
    private const int DemoCycles = 8_200_000;
    private SceneModel _model = null!;
    private SceneModel _demo = null!;

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
        _demo = new SceneModel(DemoScenes.FloorScan());
        if (Math.Abs((_demo.DurationS * _demo.SearchNominalHz) - DemoCycles) > 0.01 * DemoCycles)
        {
            throw new InvalidOperationException($"the demo scene is no longer {DemoCycles} cycles long; update DemoCycles");
        }
    }

    [Benchmark(OperationsPerInvoke = Edges)]
    public long SimulateEdges()
    {
        var writer = new CountingWriter();
        new CaptureSimulator(_model).Run(writer);
        return writer.Rows;
    }

    [Benchmark(OperationsPerInvoke = DemoCycles)]
    public long SimulateDemoSceneText()
    {
        var simulator = new CaptureSimulator(_demo);
        using var writer = new TextCaptureWriter(Stream.Null, simulator.Metadata);
        return simulator.Run(writer, null, CancellationToken.None, targetTruth: false).Rows;
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
