namespace FreqReadout.Host.Bench;

/// <summary>How one way did on one scene.</summary>
/// <param name="Way">Readout or a plain way.</param>
/// <param name="Match">Passes matched to its events, and its false events.</param>
/// <param name="Rebaselines">Automatic, manual or signal-restored re-baselines the readout reported (0 for the plain ways).</param>
public sealed record BenchWayOutcome(BenchWay Way, BenchMatchResult Match, int Rebaselines)
{
    /// <summary>Passes with an event.</summary>
    public int Found => Match.Matches.Count(m => m.Event != null);

    /// <summary>Passes with an event of the class the sign rule gives.</summary>
    public int Right => Match.Matches.Count(m => m.ClassAsExpected);

    /// <summary>Events that matched no pass.</summary>
    public int FalseEvents => Match.Unmatched.Count;

    /// <summary>|found peak - truth peak| / |truth peak| of each found pass.</summary>
    public IEnumerable<double> PeakErrors => Match.Matches
        .Where(m => m.Event != null && m.TruthPeakShiftHz != 0)
        .Select(m => Math.Abs(m.Event!.Event.PeakShiftHz - m.TruthPeakShiftHz) / Math.Abs(m.TruthPeakShiftHz));
}
