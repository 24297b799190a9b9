namespace FreqReadout.Host.Bench;

/// <summary>
/// One row of the tracking-quality table: one way on one kind (all modes, or one mode when <see cref="Mode"/> is set).
/// Score = right - false events (in scenes with targets and in drift-only scenes together).
/// </summary>
/// <param name="Kind">Drift kind.</param>
/// <param name="Mode">The mode, or null for all modes together.</param>
/// <param name="Way">Readout or a plain way.</param>
/// <param name="Targets">Passes in the scenes with targets.</param>
/// <param name="Found">Passes matched by an event.</param>
/// <param name="Right">Found with the sign rule's class.</param>
/// <param name="FalseInTargetScenes">Events matching no pass in the scenes with targets.</param>
/// <param name="FalseInDriftOnly">Events in the drift-only scenes.</param>
/// <param name="DriftOnlyHours">Length of the drift-only scenes, h.</param>
/// <param name="PeakErrorMedian">Median over found passes of |event peak - truth peak| / |truth peak| (a fraction); null when none was found.</param>
/// <param name="GateNoisePpmLow">Least gate noise of the row's scenes, ppm (NaN without scenes).</param>
/// <param name="GateNoisePpmHigh">Largest gate noise of the row's scenes, ppm (NaN without scenes).</param>
public sealed record QualityRow(
    BenchKind Kind,
    BenchMode? Mode,
    BenchWay Way,
    int Targets,
    int Found,
    int Right,
    int FalseInTargetScenes,
    int FalseInDriftOnly,
    double DriftOnlyHours,
    double? PeakErrorMedian,
    double GateNoisePpmLow,
    double GateNoisePpmHigh)
{
    /// <summary>False events per hour of drift-only capture (NaN without any).</summary>
    public double FalsePerHour => DriftOnlyHours > 0 ? FalseInDriftOnly / DriftOnlyHours : double.NaN;

    /// <summary>Right minus all false events.</summary>
    public int Score => Right - FalseInTargetScenes - FalseInDriftOnly;
}
