namespace FreqReadout.Host.Bench;

/// <summary>A whole bench run: what ran, the table, and every scene.</summary>
/// <param name="SeedSet">tune, report, or the master seed given.</param>
/// <param name="MasterSeed">The master seed the scene seeds were drawn from.</param>
/// <param name="Quick">True for the quick subset.</param>
/// <param name="Rows">Per kind and way (modes together), kind order, then way order.</param>
/// <param name="ModeRows">Per kind, mode and way.</param>
/// <param name="Scenes">Every scene, in key order.</param>
/// <param name="ElapsedSeconds">Wall time, s.</param>
/// <param name="Jobs">Scenes run at once.</param>
public sealed record QualityBenchReport(
    string SeedSet,
    long MasterSeed,
    bool Quick,
    IReadOnlyList<QualityRow> Rows,
    IReadOnlyList<QualityRow> ModeRows,
    IReadOnlyList<BenchSceneOutcome> Scenes,
    double ElapsedSeconds,
    int Jobs)
{
    /// <summary>Simulated capture time, s.</summary>
    public double SimulatedSeconds => Scenes.Sum(s => s.DurationSeconds);

    /// <summary>Capture rows simulated and replayed.</summary>
    public long CaptureRows => Scenes.Sum(s => s.Rows);

    /// <summary>True when the readout's score beats both plain ways' on <paramref name="kind"/> (all modes).</summary>
    public bool ReadoutBetter(BenchKind kind)
    {
        int readout = Rows.Single(r => r.Kind == kind && r.Way == BenchWay.Readout).Score;
        return Rows.Where(r => r.Kind == kind && r.Way != BenchWay.Readout).All(r => readout > r.Score);
    }
}
