using FreqReadout.Host.Demo;
using FreqReadout.Host.Replay;
using static FreqReadout.Host.Bench.QualityBenchDefinition;

namespace FreqReadout.Host.Bench;

/// <summary>
/// Matches events to truth passes, one to one. A pass's span is its leg (the coil's travel over the stretch where the
/// target's |shift| is at least 0.5 % of its peak) widened by one gate (0.1 s) on each side; an event's span runs from one
/// gate (0.1 s) before its first reading to its last reading. Passes are taken in time order; each takes, among the events
/// not yet taken whose span overlaps its own, the one whose peak lies nearest its truth peak. An event taken by no pass is a
/// false event (a second event inside an already matched pass is one too).
/// </summary>
public static class BenchPassMatcher
{
    /// <summary>The matches, one per pass in time order (the demo's record: event null when missed), and the events left over.</summary>
    public static BenchMatchResult Match(IReadOnlyList<BenchPass> passes, IReadOnlyList<ReplayEvent> events)
    {
        var used = new bool[events.Count];
        var matches = new List<DemoPassMatch>(passes.Count);
        foreach (BenchPass pass in passes.OrderBy(p => p.StartSeconds))
        {
            double from = pass.StartSeconds - MatchWideningSeconds;
            double to = pass.EndSeconds + MatchWideningSeconds;
            int best = -1;
            for (int i = 0; i < events.Count; i++)
            {
                var e = events[i].Event;
                if (used[i] || e.StartSeconds - EventGateSeconds > to || e.EndSeconds < from)
                {
                    continue;
                }

                if (best < 0 || Math.Abs(e.PeakSeconds - pass.PeakSeconds) < Math.Abs(events[best].Event.PeakSeconds - pass.PeakSeconds))
                {
                    best = i;
                }
            }

            if (best >= 0)
            {
                used[best] = true;
            }

            matches.Add(new DemoPassMatch(pass.Target, pass.Index, pass.PeakSeconds, pass.PeakShiftHz, pass.MaterialClass, pass.SignRuleClass, best >= 0 ? events[best] : null));
        }

        var unmatched = new List<ReplayEvent>();
        for (int i = 0; i < events.Count; i++)
        {
            if (!used[i])
            {
                unmatched.Add(events[i]);
            }
        }

        return new BenchMatchResult(matches, unmatched);
    }
}
