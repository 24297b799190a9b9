using FreqReadout.Detection;
using FreqReadout.Readout;

namespace FreqReadout.Tests.Detection;

/// <summary>
/// The merger's hold: a pass's own tail, which the resolver reports a second or more after the pass was released (with a
/// start up to 1 s before the candidate that led to it), is still merged into the pass rather than counted as a second
/// event. Invented event times and sizes; the rule itself (events of one sign closer than 0.5 s are one) is common
/// practice, no source.
/// </summary>
public class EventMergerTests
{
    [Fact]
    public void A_tail_reported_after_the_gap_but_starting_inside_it_is_merged_into_its_pass()
    {
        var queue = new DetectionEventQueue(8);
        var merger = new EventMerger(queue);
        Fill(merger.NextSlot(), 20.1, 21.0, 20.5, 0.028, 12.3, TargetClass.NonFerrous, EventEnd.Released);
        merger.Commit();

        // 0.7 s after the pass ended no candidate is open yet: the pass is still held.
        merger.Tick(21.7, false, 0);
        var taken = new DetectionEvent();
        Assert.False(queue.TryDequeue(taken));

        // A candidate opens at 21.9; the resolver decides it at 23.2 and reports a pass starting 0.3 s after the first ended.
        merger.Tick(22.0, true, 21.9);
        Fill(merger.NextSlot(), 21.3, 21.4, 21.3, 0.0067, 6.7, TargetClass.NonFerrous, EventEnd.Resolved);
        merger.Commit();
        merger.Tick(23.2, false, 0);
        merger.Flush();

        Assert.True(queue.TryDequeue(taken));
        Assert.Equal(20.1, taken.StartSeconds);
        Assert.Equal(21.4, taken.EndSeconds);
        Assert.Equal(0.028, taken.PeakShiftHz);
        Assert.False(queue.TryDequeue(taken));
    }

    [Fact]
    public void A_held_pass_is_queued_once_the_hold_has_passed_with_no_candidate()
    {
        var queue = new DetectionEventQueue(8);
        var merger = new EventMerger(queue);
        Fill(merger.NextSlot(), 20.1, 21.0, 20.5, 0.028, 12.3, TargetClass.NonFerrous, EventEnd.Released);
        merger.Commit();
        var taken = new DetectionEvent();

        merger.Tick(22.4, false, 0);
        Assert.False(queue.TryDequeue(taken));
        merger.Tick(22.6, false, 0);
        Assert.True(queue.TryDequeue(taken));
        Assert.Equal(21.0, taken.EndSeconds);
    }

    [Fact]
    public void Merged_passes_keep_a_peak_with_a_class_before_a_larger_one_without()
    {
        var queue = new DetectionEventQueue(8);
        var merger = new EventMerger(queue);
        Fill(merger.NextSlot(), 25.9, 26.6, 26.3, -0.079, 6.2, TargetClass.Unclear, EventEnd.Released);
        merger.Commit();
        Fill(merger.NextSlot(), 26.9, 27.4, 26.9, -0.072, 7.8, TargetClass.Ferrous, EventEnd.Resolved);
        merger.Commit();
        merger.Flush();

        var taken = new DetectionEvent();
        Assert.True(queue.TryDequeue(taken));
        Assert.Equal(TargetClass.Ferrous, taken.Class);
        Assert.Equal(-0.072, taken.PeakShiftHz);
        Assert.Equal(25.9, taken.StartSeconds);
        Assert.Equal(27.4, taken.EndSeconds);
    }

    private static void Fill(DetectionEvent slot, double start, double end, double peakSeconds, double peakHz, double peakSigma, TargetClass cls, EventEnd how)
    {
        slot.Set(start, end, peakSeconds, peakHz, false, 0, peakSigma, 0.001, cls, false, false, how);
    }
}
