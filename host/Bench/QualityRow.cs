namespace FreqReadout.Host.Bench;

/// <summary>
/// One row of the tracking-quality table: one way on one kind (all modes, or one mode when <see cref="Mode"/> is set).
/// Score = right - false events (in scenes with targets and in drift-only scenes together).
/// </summary>
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
