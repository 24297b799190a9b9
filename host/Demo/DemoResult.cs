using FreqReadout.Host.Replay;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Host.Demo;

/// <summary>What the demo simulated (truth), what the readout reported (replay), and how they match.</summary>
public sealed record DemoResult(
    SimulationTruth Truth,
    ReplayReport Report,
    IReadOnlyList<DemoPassMatch> Matches,
    IReadOnlyList<ReplayEvent> UnmatchedEvents,
    string CapturePath);
