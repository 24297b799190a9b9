namespace FreqReadout.Host.Bench;

/// <summary>What the bench scene counts (names in output: search, beat-above, beat-below, snapshots).</summary>
public enum BenchMode
{
    /// <summary>Edges of the search oscillator.</summary>
    Search,

    /// <summary>Edges of the beat note, search tuned above the reference.</summary>
    BeatAbove,

    /// <summary>Edges of the beat note, search tuned below the reference (a beat rise is a search fall).</summary>
    BeatBelow,

    /// <summary>Pulse-counter snapshots of the search oscillator.</summary>
    Snapshots,
}
