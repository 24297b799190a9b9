namespace FreqReadout.Host.Replay;

/// <summary>
/// Matches known passes (their peak times) to reported events: for each pass in the order given, the unused event whose
/// peak is nearest to the pass's, within a window; an event serves one pass at most. Used by <c>demo</c> and by
/// <c>tune --truth</c>, so both score the same way.
/// </summary>
public static class PassMatching
{
    /// <summary>The event matched to each pass (null where none was within <paramref name="windowSeconds"/>), in the passes' order.</summary>
    public static ReplayEvent?[] Match(IReadOnlyList<double> passPeakSeconds, IReadOnlyList<ReplayEvent> events, double windowSeconds)
    {
        var used = new HashSet<ReplayEvent>();
        var matched = new ReplayEvent?[passPeakSeconds.Count];
        for (int p = 0; p < passPeakSeconds.Count; p++)
        {
            double peak = passPeakSeconds[p];
            ReplayEvent? best = events
                .Where(e => !used.Contains(e) && Math.Abs(e.Event.PeakSeconds - peak) <= windowSeconds)
                .OrderBy(e => Math.Abs(e.Event.PeakSeconds - peak))
                .FirstOrDefault();
            if (best != null)
            {
                used.Add(best);
            }

            matched[p] = best;
        }

        return matched;
    }
}
