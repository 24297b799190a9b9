using FreqReadout.Counting;
using FreqReadout.Host.Replay;
using FreqReadout.Readout;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Host.Demo;

/// <summary>What the demo simulated (truth), what the readout reported (replay), and how they match.</summary>
public sealed record DemoResult(
    SimulationTruth Truth,
    ReplayReport Report,
    IReadOnlyList<DemoPassMatch> Matches,
    IReadOnlyList<ReplayEvent> UnmatchedEvents,
    string CapturePath)
{
    /// <summary>The counting settings the replay used (replay's defaults for the capture); null when not recorded.</summary>
    public CounterSettings? Counter { get; init; }

    /// <summary>The readout settings the replay used (replay's defaults for the capture); null when not recorded.</summary>
    public ReadoutSettings? Readout { get; init; }
}
