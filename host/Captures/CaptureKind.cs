namespace FreqReadout.Host.Captures;

/// <summary>What the data rows of a capture hold.</summary>
public enum CaptureKind
{
    /// <summary>One row per recorded rising edge: the raw timer value (column <c>tick</c>).</summary>
    Edges,

    /// <summary>Hardware pulse-counter reads: time and cumulative count (columns <c>tick,count</c>).</summary>
    Snapshots,
}
