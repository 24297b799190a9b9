namespace FreqReadout.Host.Bench;

/// <summary>One bench scene run: what was drawn, its truth passes, and how each way did.</summary>
/// <param name="Scene">The drawn scene.</param>
/// <param name="DurationSeconds">Capture length, s.</param>
/// <param name="Rows">Capture rows (edges or snapshots).</param>
/// <param name="Passes">Truth passes in time order.</param>
/// <param name="Ways">Readout, fixed-3s, moving-10s (in <see cref="BenchWay"/> order).</param>
/// <param name="Readout">The replay's report (events, re-baselines, noise, warnings).</param>
/// <param name="ElapsedSeconds">Wall time of this scene (drawing, simulating, replaying, plain ways), s.</param>
public sealed record BenchSceneOutcome(
    BenchScene Scene,
    double DurationSeconds,
    long Rows,
    IReadOnlyList<BenchPass> Passes,
    IReadOnlyList<BenchWayOutcome> Ways,
    FreqReadout.Host.Replay.ReplayReport Readout,
    double ElapsedSeconds);
