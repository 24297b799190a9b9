using FreqReadout.Host.Demo;
using FreqReadout.Host.Replay;

namespace FreqReadout.Host.Bench;

/// <summary>Passes matched to events (one per pass, event null when missed) and the events that matched no pass (false events).</summary>
public sealed record BenchMatchResult(IReadOnlyList<DemoPassMatch> Matches, IReadOnlyList<ReplayEvent> Unmatched);
