using FreqReadout.Host.Captures;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Simulation;

/// <summary>Every shipped scene also simulates as pulse-counter snapshots, for its whole length.</summary>
public sealed class SnapshotSimulationTests
{
    [Theory]
    [InlineData("bench-beat-pin-events.json")]
    [InlineData("demo-floor-scan.json")]
    public async Task Shipped_scene_as_snapshots_runs_to_its_end_with_one_row_per_read(string file)
    {
        // Regression: `simulate --scene host/Scenes/bench-beat-pin-events.json --kind snapshots` never finished: the
        // phase integration asked for the next control-step boundary at a time that was itself a boundary, got the
        // same time back (timeS / step rounded just below a whole number) and looped forever. Run on a worker so a
        // return of that bug fails here instead of stalling the suite (a hang guard, not a timing).
        var scene = Scene.Load(Path.Combine(SceneFileTests.RepoRoot(), "host", "Scenes", file));
        scene.Hardware.Kind = CaptureKind.Snapshots;
        scene.Hardware.Prescale = 1;
        var model = new SceneModel(scene, file);
        var run = Task.Run(() => new CaptureSimulator(model).Run(new MemoryCaptureWriter(keep: false)));
        Task finished = await Task.WhenAny(run, Task.Delay(TimeSpan.FromMinutes(2)));
        Assert.True(finished == run, "the snapshot simulation did not finish");
        SimulationTruth truth = await run;
        // One read every snapshot_interval_s over the capture's length (the last read falls before the end).
        double expected = model.DurationS / scene.Hardware.SnapshotIntervalS;
        Assert.InRange(truth.Rows, (long)expected - 2, (long)expected + 1);
    }
}
