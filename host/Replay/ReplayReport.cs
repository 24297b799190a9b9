using FreqReadout.Counting;

namespace FreqReadout.Host.Replay;

/// <summary>
/// The summary of a replay (the <c>replay --json</c> contract with the meanings of
/// docs/json-output.md): baseline_hz the first captured baseline of the counted signal; noise_hz the robust
/// sigma (1.482602218505602 x MAD) of all target-free residuals of the run, counted signal;
/// drift_hz_per_min the least-squares slope of the tracked baseline (counted signal) over the run.
/// Null where the run gave no baseline.
/// </summary>
public sealed record ReplayReport(
    long Edges,
    double DurationSeconds,
    SignalKind Signal,
    double? BaselineHz,
    double? NoiseHz,
    double? NoisePpm,
    double? DriftHzPerMinute,
    long Gates,
    IReadOnlyList<ReplayRebaseline> Rebaselines,
    IReadOnlyList<ReplayEvent> Events,
    IReadOnlyList<string> Warnings);
