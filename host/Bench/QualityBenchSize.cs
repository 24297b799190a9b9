namespace FreqReadout.Host.Bench;

/// <summary>How much the bench runs: the full set (the table in the README) or the quick subset (CI).</summary>
/// <param name="TargetScenesPerMode">Scenes with targets per kind and mode.</param>
/// <param name="TargetsPerScene">Targets (one pass each) per scene with targets.</param>
/// <param name="DriftScenesPerMode">Drift-only scenes per kind and mode.</param>
/// <param name="DriftSceneSeconds">Length of each drift-only scene, s.</param>
/// <param name="CalibrationSeconds">Length of the drift-free stretch that measures each scene's gate noise, s.</param>
public sealed record QualityBenchSize(int TargetScenesPerMode, int TargetsPerScene, int DriftScenesPerMode, double DriftSceneSeconds, double CalibrationSeconds)
{
    /// <summary>
    /// The full bench: 20 scenes x 5 targets per kind and mode (400 targets per kind), 15 drift-only scenes of 300 s per kind
    /// and mode (5 h per kind, 20 h in all). A goal of 98 % needs that many: with 80 targets a kind, one set's count has a
    /// standard error of 1.6 points at 98 % (binomial), as large as the margin it is to decide.
    /// </summary>
    public static QualityBenchSize Full { get; } = new(20, 5, 15, 300.0, 30.0);

    /// <summary>The quick subset for CI: 1 scene x 4 targets per kind and mode (16 per kind), 1 drift-only scene of 60 s per kind and mode.</summary>
    public static QualityBenchSize Quick { get; } = new(1, 4, 1, 60.0, 15.0);
}
