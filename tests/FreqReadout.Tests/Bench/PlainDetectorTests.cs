using FreqReadout.Detection;
using FreqReadout.Host.Bench;

namespace FreqReadout.Tests.Bench;

/// <summary>
/// The plain ways on tiny hand-made gate series whose events are worked out by hand (in the comments): the noise is the
/// sample standard deviation of the first 3 s, the threshold 6 sigma, merging below 0.5 s, class by sign.
/// </summary>
public class PlainDetectorTests
{
    /// <summary>Gates every 0.25 s (exact in binary) from 0.25 s to <paramref name="endSeconds"/>; the first 3 s alternate 100.3, 99.7.</summary>
    private static List<PlainGate> Gates(double endSeconds, Func<double, double> after3s)
    {
        var gates = new List<PlainGate>();
        for (int k = 1; k * 0.25 <= endSeconds; k++)
        {
            double t = k * 0.25;
            gates.Add(new PlainGate(t, t <= 3.0 ? (k % 2 == 1 ? 100.3 : 99.7) : after3s(t)));
        }

        return gates;
    }

    // First 3 s: 12 gates, mean 100, sample sd sqrt(12 x 0.09 / 11) = 0.313340, threshold 6 sd = 1.880040.
    private static readonly double Sigma = Math.Sqrt(12 * 0.09 / 11);

    private static double Fixed(double t) => t switch
    {
        5.0 => 102.0,   // over (+2.0)
        5.25 => 102.5,  // over (+2.5): event A = [5.0, 5.25], peak +2.5
        5.5 => 101.0,   // under (+1.0)
        5.75 => 97.5,   // over; 5.75 - 5.25 = 0.5 s is not closer than 0.5 s: event B starts
        6.0 => 97.0,    // over: B = [5.75, 6.0], peak -3.0, ferrous
        6.5 => 102.2,   // over, 0.5 s after B: event C = [6.5, 6.5]
        8.0 => 103.0,   // over: event D = [8.0, 8.0]
        8.5 => 98.0,    // over (-2.0), 0.5 s after D: event E starts
        8.75 => 97.9,   // over (-2.1)
        9.0 => 103.0,   // over (+3.0): E = [8.5, 9.0], mixed sign, peak +3.0 at 9.0
        9.5 => 97.0,    // over, 0.5 s after E: event F = [9.5, 9.5], peak -3.0
        12.0 => 102.0,  // over at the last gate: event G, closed at the end of the run
        _ => 100.0,
    };

    [Fact]
    public void FixedBaseline_FindsTheHandWorkedEvents()
    {
        PlainDetectionResult r = PlainDetector.Detect(Gates(12.0, Fixed), PlainBaseline.Fixed, +1, 100_000);
        Assert.Equal(Sigma, r.NoiseHz, 12);
        var e = r.Events;
        Assert.Equal(7, e.Count);
        Expect(e[0], 5.0, 5.25, 5.25, +2.5, TargetClass.NonFerrous, false, EventEnd.Released);
        Expect(e[1], 5.75, 6.0, 6.0, -3.0, TargetClass.Ferrous, false, EventEnd.Released);
        Expect(e[2], 6.5, 6.5, 6.5, +2.2, TargetClass.NonFerrous, false, EventEnd.Released);
        Expect(e[3], 8.0, 8.0, 8.0, +3.0, TargetClass.NonFerrous, false, EventEnd.Released);
        Expect(e[4], 8.5, 9.0, 9.0, +3.0, TargetClass.NonFerrous, true, EventEnd.Released);
        Expect(e[5], 9.5, 9.5, 9.5, -3.0, TargetClass.Ferrous, false, EventEnd.Released);
        Expect(e[6], 12.0, 12.0, 12.0, +2.0, TargetClass.NonFerrous, false, EventEnd.EndOfRun);
        Assert.Equal(3.0 / Sigma, e[1].PeakSigma, 9);
        Assert.Equal(-30.0, e[1].PeakShiftPpm, 9); // -3 Hz of 100 kHz
        Assert.Equal(Sigma, e[1].NoiseHz, 12);
    }

    [Fact]
    public void EventsCloserThanHalfASecondMerge()
    {
        // Over at 5.0, under at 5.25, over at 5.5: 0.5 s apart, not closer, two events. Over at 7.0, under at 7.25, over at an
        // uneven gate at 7.4: 0.4 s apart, merged into one event [7.0, 7.4] with both signs, peak -3 at 7.0.
        var gates = Gates(9.0, t => t switch { 5.0 => 103.0, 5.5 => 97.0, 7.0 => 97.0, _ => 100.0 });
        int at = gates.FindIndex(g => g.EndSeconds == 7.25);
        gates.Insert(at + 1, new PlainGate(7.4, 102.0));
        PlainDetectionResult r = PlainDetector.Detect(gates, PlainBaseline.Fixed, +1, 0);
        Assert.Equal(3, r.Events.Count);
        Expect(r.Events[0], 5.0, 5.0, 5.0, +3.0, TargetClass.NonFerrous, false, EventEnd.Released);
        Expect(r.Events[1], 5.5, 5.5, 5.5, -3.0, TargetClass.Ferrous, false, EventEnd.Released);
        Expect(r.Events[2], 7.0, 7.4, 7.0, -3.0, TargetClass.Ferrous, true, EventEnd.Released);
        Assert.False(r.Events[2].HasPpm); // no search_hz given
    }

    [Fact]
    public void BeatBelow_FlipsTheSignBeforeTheClass()
    {
        PlainDetectionResult r = PlainDetector.Detect(Gates(12.0, Fixed), PlainBaseline.Fixed, -1, 100_000);
        Assert.Equal(7, r.Events.Count);
        Expect(r.Events[0], 5.0, 5.25, 5.25, -2.5, TargetClass.Ferrous, false, EventEnd.Released);
        Expect(r.Events[1], 5.75, 6.0, 6.0, +3.0, TargetClass.NonFerrous, false, EventEnd.Released);
    }

    [Fact]
    public void MovingBaseline_FollowsAStepWithinTheHandWorkedTime()
    {
        // A +3 step at 10 s. Gate t_i = 10 + 0.25 k sees the 40 gates of [t_i - 10, t_i) (from k = 1 on), k of them at 103:
        // shift = 3 (40 - k) / 40 (the alternating first 3 s have left the window for k >= 13 and add at most 0.3/40 before):
        // over 1.88004 up to k = 14 (1.95), under from k = 15 (1.875). So one event [10.0, 13.5], peak +3 at 10.0.
        var gates = Gates(20.0, t => t >= 10.0 ? 103.0 : 100.0);
        PlainDetectionResult moving = PlainDetector.Detect(gates, PlainBaseline.Moving, +1, 100_000);
        Assert.Equal(Sigma, moving.NoiseHz, 12);
        Expect(Assert.Single(moving.Events), 10.0, 13.5, 10.0, +3.0, TargetClass.NonFerrous, false, EventEnd.Released);

        // The fixed baseline never catches up: one event to the end.
        PlainDetectionResult fixedWay = PlainDetector.Detect(gates, PlainBaseline.Fixed, +1, 100_000);
        Expect(Assert.Single(fixedWay.Events), 10.0, 20.0, 10.0, +3.0, TargetClass.NonFerrous, false, EventEnd.EndOfRun);
    }

    [Fact]
    public void MovingBaseline_BeforeTenSecondsUsesEveryEarlierGate()
    {
        // At 4.0 s the window holds the 15 gates 0.25..3.75 s: mean (12 x 100 + 3 x 100) / 15 = 100; at 4.0 a +2 gate is over
        // (2 > 1.88), and at 4.25 a gate of 101.9 is not (the +2 gate raised the mean to 100.125: 1.775).
        var gates = Gates(6.0, t => t switch { 4.0 => 102.0, 4.25 => 101.9, _ => 100.0 });
        PlainDetectionResult r = PlainDetector.Detect(gates, PlainBaseline.Moving, +1, 0);
        Expect(Assert.Single(r.Events), 4.0, 4.0, 4.0, +2.0, TargetClass.NonFerrous, false, EventEnd.Released);

        // The fixed baseline calls both.
        Expect(Assert.Single(PlainDetector.Detect(gates, PlainBaseline.Fixed, +1, 0).Events), 4.0, 4.25, 4.0, +2.0, TargetClass.NonFerrous, false, EventEnd.Released);
    }

    [Fact]
    public void FewerThanTwoGatesInTheFirstThreeSeconds_NoNoise_NoEvents()
    {
        var gates = new List<PlainGate> { new(2.0, 100), new(3.5, 120), new(4.0, 80) };
        PlainDetectionResult r = PlainDetector.Detect(gates, PlainBaseline.Fixed, +1, 0);
        Assert.True(double.IsNaN(r.NoiseHz));
        Assert.Empty(r.Events);
    }

    private static void Expect(DetectionEvent e, double start, double end, double peakAt, double peak, TargetClass cls, bool mixed, EventEnd how)
    {
        string what = $"event {e.StartSeconds}-{e.EndSeconds} peak {e.PeakShiftHz} at {e.PeakSeconds}";
        Assert.True(Math.Abs(e.StartSeconds - start) < 1e-9, what);
        Assert.True(Math.Abs(e.EndSeconds - end) < 1e-9, what);
        Assert.True(Math.Abs(e.PeakSeconds - peakAt) < 1e-9, what);
        Assert.True(Math.Abs(e.PeakShiftHz - peak) < 1e-9, what);
        Assert.Equal(cls, e.Class);
        Assert.Equal(mixed, e.MixedSign);
        Assert.Equal(how, e.End);
    }
}
