using FreqReadout.Firmware.Board;

namespace FreqReadout.Firmware.Tests;

/// <summary>
/// The board loop's wait: within a 10 ms tick and a 2 ms margin of the deadline it only yields; further away it sleeps
/// whole milliseconds that end at least one tick before the deadline, wasting less than a millisecond more.
/// </summary>
public class LoopSleepTests
{
    [Theory]
    [InlineData(0L)]
    [InlineData(1L)]
    [InlineData(2000L)]
    [InlineData(9999L)]
    [InlineData(12000L)]
    public void Near_deadlines_only_yield(long untilDue)
    {
        Assert.Equal(0, LoopSleep.MillisecondsToSleep(untilDue));
    }

    [Fact]
    public void Far_deadlines_sleep_to_at_least_one_tick_before_them()
    {
        for (long untilDue = 12001; untilDue < 2_000_000; untilDue += 997)
        {
            int ms = LoopSleep.MillisecondsToSleep(untilDue);
            long wakeBefore = untilDue - (ms * 1000L);
            Assert.True(ms >= 2, untilDue + " us: slept " + ms + " ms");
            Assert.True(wakeBefore >= LoopSleep.SystemTickMicroseconds, untilDue + " us: wakes " + wakeBefore + " us before the deadline, less than a tick");
            Assert.True(wakeBefore < LoopSleep.SystemTickMicroseconds + 1000, untilDue + " us: wakes " + wakeBefore + " us early, a millisecond more than needed");
        }
    }

    [Fact]
    public void A_huge_wait_is_capped_at_int_max()
    {
        Assert.Equal(int.MaxValue, LoopSleep.MillisecondsToSleep(long.MaxValue));
    }
}
