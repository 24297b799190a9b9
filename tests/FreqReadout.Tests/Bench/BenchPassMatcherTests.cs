using FreqReadout.Detection;
using FreqReadout.Host.Bench;
using FreqReadout.Host.Replay;

namespace FreqReadout.Tests.Bench;

/// <summary>Matching events to passes: span overlap (pass widened by a gate, event from a gate before its first reading), one to one, nearest peak.</summary>
public class BenchPassMatcherTests
{
    private static ReplayEvent Event(double start, double end, double peakAt, double peakHz, TargetClass cls)
    {
        var e = new DetectionEvent();
        e.Set(start, end, peakAt, peakHz, false, 0, 10, 0.1, cls, false, false, EventEnd.Released);
        return new ReplayEvent(e, null);
    }

    private static readonly BenchPass[] Passes =
    {
        new("t0", 0, 10.0, 12.0, 11.0, +5.0, "non-ferrous", "non-ferrous", 20),
        new("t1", 1, 20.0, 21.0, 20.5, -5.0, "ferrous", "ferrous", 20),
        new("t2", 2, 30.0, 31.0, 30.5, +5.0, "ferrous", "non-ferrous", 20),
    };

    [Fact]
    public void OverlapWithinAGate_OneEventPerPass_NearestPeakWins_TheRestAreFalse()
    {
        var events = new[]
        {
            Event(12.05, 12.3, 12.1, +4.0, TargetClass.NonFerrous),  // span [11.95, 12.3] meets t0's [9.9, 12.1]
            Event(12.25, 12.4, 12.3, +3.0, TargetClass.NonFerrous),  // span [12.15, 12.4]: past t0's widened end: false
            Event(19.5, 19.95, 19.9, -2.0, TargetClass.Ferrous),     // meets t1's [19.9, 21.1], peak 0.6 s from the truth's
            Event(20.2, 20.7, 20.4, -5.0, TargetClass.Unclear),      // meets t1, peak 0.1 s away: taken; the one above is false
            Event(29.0, 29.8, 29.5, +5.0, TargetClass.NonFerrous),   // span ends 29.8, before t2's widened start 29.9: false
        };
        BenchMatchResult r = BenchPassMatcher.Match(Passes, events);
        Assert.Equal(3, r.Matches.Count);
        Assert.Same(events[0], r.Matches[0].Event);
        Assert.True(r.Matches[0].ClassAsExpected);
        Assert.Same(events[3], r.Matches[1].Event);
        Assert.False(r.Matches[1].ClassAsExpected); // unclear is not right
        Assert.Null(r.Matches[2].Event);
        Assert.Equal(new[] { events[1], events[2], events[4] }, r.Unmatched);
    }

    [Fact]
    public void OneLongEventTakesOnlyOnePass_TheClassScoredIsTheSignRules()
    {
        var events = new[] { Event(9.0, 32.0, 30.4, +6.0, TargetClass.NonFerrous) };
        BenchMatchResult r = BenchPassMatcher.Match(Passes, events);
        Assert.Same(events[0], r.Matches[0].Event); // t0 comes first in time and takes it
        Assert.Null(r.Matches[1].Event);
        Assert.Null(r.Matches[2].Event);
        Assert.Empty(r.Unmatched);

        // Iron above its crossover: non-ferrous is right.
        BenchMatchResult t2 = BenchPassMatcher.Match(new[] { Passes[2] }, events);
        Assert.True(t2.Matches[0].ClassAsExpected);
    }
}
