using FreqReadout.Firmware.Device;

namespace FreqReadout.Firmware.Tests;

/// <summary>
/// The read pacer under simulated microsecond clocks (invented timings): reads keep their schedule when the loop is on
/// time or a little late, a loop stuck for longer restarts the schedule and counts what it skipped, and a gap over the
/// stall limit is counted as a stall.
/// </summary>
public class ReadPacerTests
{
    [Fact]
    public void A_loop_polling_every_100_us_reads_once_per_millisecond_on_schedule()
    {
        var pacer = new ReadPacer(1000, 5000);
        var taken = new List<long>();
        for (long now = 0; now < 100_000; now += 100)
        {
            if (pacer.IsDue(now))
            {
                pacer.Taken(now);
                taken.Add(now);
            }
        }

        Assert.Equal(100, pacer.Reads);
        Assert.Equal(Enumerable.Range(0, 100).Select(k => k * 1000L), taken);
        Assert.Equal(0, pacer.Stalls);
        Assert.Equal(0, pacer.MissedDeadlines);
        Assert.Equal(1000, pacer.LongestGapMicroseconds);
    }

    [Fact]
    public void Reads_a_little_late_keep_the_schedule_and_do_not_drift()
    {
        var pacer = new ReadPacer(1000, 5000);
        pacer.Taken(0);
        pacer.Taken(1700);    // 700 us late for the deadline at 1000
        Assert.False(pacer.IsDue(1999));
        Assert.True(pacer.IsDue(2000));
        Assert.Equal(300, pacer.MicrosecondsUntilDue(1700));
        Assert.Equal(0, pacer.MissedDeadlines);
    }

    [Fact]
    public void A_loop_stuck_for_20_ms_counts_a_stall_and_the_deadlines_it_skipped()
    {
        var pacer = new ReadPacer(1000, 5000);
        pacer.Taken(0);
        pacer.Taken(1000);
        pacer.Taken(21_000);  // a pause (a garbage collection, a blocked call)
        Assert.Equal(1, pacer.Stalls);
        Assert.Equal(20_000, pacer.LongestGapMicroseconds);
        Assert.Equal(19, pacer.MissedDeadlines);
        Assert.False(pacer.IsDue(21_999));
        Assert.True(pacer.IsDue(22_000));
    }

    // Thread.Sleep(1) on nanoFramework lasts a whole 10 ms tick: a loop paced that way reads 100 times a second whatever
    // period it asked for, and the pacer says so in its counts.
    [Fact]
    public void A_loop_that_can_only_wake_every_10_ms_shows_as_missed_deadlines_not_stalls()
    {
        var pacer = new ReadPacer(1000, 15_000);
        for (long now = 0; now <= 1_000_000; now += 10_000)
        {
            if (pacer.IsDue(now))
            {
                pacer.Taken(now);
            }
        }

        Assert.Equal(101, pacer.Reads);
        Assert.Equal(0, pacer.Stalls);
        Assert.Equal(900, pacer.MissedDeadlines);
    }
}
