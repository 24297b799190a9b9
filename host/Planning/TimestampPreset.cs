using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Planning;

/// <summary>
/// One way of timestamping the counted signal, as <c>plan</c> models it: its rms timing jitter, its time resolution (the
/// timer clock), how fast it can take edges and, for pulse-counter snapshots, how often the loop reads. The presets are in
/// <see cref="TimestampPresets"/> and in the table of hardware-notes/timestamp-methods.md (a test keeps the two equal).
/// </summary>
public sealed class TimestampPreset
{
    /// <summary>A preset or custom method.</summary>
    public TimestampPreset(string name, CaptureKind input, double jitterS, double clockHz, double readRateHz, double maxEdgeRateHz, string description)
    {
        Name = name;
        Input = input;
        JitterS = jitterS;
        ClockHz = clockHz;
        ReadRateHz = readRateHz;
        MaxEdgeRateHz = maxEdgeRateHz;
        Description = description;
    }

    /// <summary>Name used on the command line and in output (pin-event, pulse-counter, edge-capture, custom).</summary>
    public string Name { get; }

    /// <summary>Edges (one timestamp per recorded edge) or snapshots (count and time read together).</summary>
    public CaptureKind Input { get; }

    /// <summary>Rms timing jitter of one timestamp (edges) or of one read's time against its count (snapshots), s.</summary>
    public double JitterS { get; }

    /// <summary>Timer clock, Hz: the time resolution is one tick, 1 / clock.</summary>
    public double ClockHz { get; }

    /// <summary>Snapshots: reads a second the loop makes; 0 for edge methods (every recorded edge is read).</summary>
    public double ReadRateHz { get; }

    /// <summary>Most edges a second the method can take (recorded edges for edge methods; input edges for the counter), /s.</summary>
    public double MaxEdgeRateHz { get; }

    /// <summary>One line on what the method is.</summary>
    public string Description { get; }

    /// <summary>The estimators the method feeds: reciprocal and regression for edges, snapshot-regression for snapshots.</summary>
    public IReadOnlyList<string> Estimators => Input == CaptureKind.Snapshots
        ? new[] { PlanEstimators.SnapshotRegression }
        : new[] { PlanEstimators.Reciprocal, PlanEstimators.Regression };

    /// <summary>The same method on another timer clock.</summary>
    public TimestampPreset WithClock(double clockHz) => new(Name, Input, JitterS, clockHz, ReadRateHz, MaxEdgeRateHz, Description);
}
