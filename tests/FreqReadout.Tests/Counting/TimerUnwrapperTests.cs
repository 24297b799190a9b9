using FreqReadout.Counting;

namespace FreqReadout.Tests.Counting;

public class TimerUnwrapperTests
{
    [Theory]
    [InlineData(0)]
    [InlineData(8)]
    [InlineData(12)]
    [InlineData(31)]
    [InlineData(63)]
    [InlineData(65)]
    public void Unsupported_width_is_refused(int bits)
    {
        var ex = Assert.Throws<ArgumentException>(() => new TimerUnwrapper(bits));
        Assert.Contains("16, 24, 32 or 64", ex.Message);
    }

    [Theory]
    [InlineData(16)]
    [InlineData(24)]
    [InlineData(32)]
    public void Value_at_or_above_two_to_the_bits_is_rejected_and_state_kept(int bits)
    {
        var u = new TimerUnwrapper(bits);
        ulong top = 1UL << bits;
        Assert.True(u.TryUnwrap(top - 1, out long t0));
        Assert.Equal(0, t0);
        Assert.False(u.TryUnwrap(top, out long t1));
        Assert.Equal(0, t1);
        Assert.False(u.TryUnwrap(ulong.MaxValue, out _));
        Assert.Equal(2, u.Rejected);
        // The next good value unwraps from the last good one: (5 - (2^bits - 1)) mod 2^bits = 6.
        Assert.True(u.TryUnwrap(5, out long t2));
        Assert.Equal(6, t2);
        Assert.Equal(1, u.Wraps);
    }

    [Fact]
    public void First_value_of_a_narrow_timer_may_be_zero_or_the_top_of_the_range()
    {
        var a = new TimerUnwrapper(24);
        Assert.True(a.TryUnwrap(0, out long ta));
        Assert.Equal(0, ta);
        var b = new TimerUnwrapper(24);
        Assert.True(b.TryUnwrap((1UL << 24) - 1, out long tb));
        Assert.Equal(0, tb);
        Assert.True(b.TryUnwrap(0, out tb));
        Assert.Equal(1, tb);
        Assert.Equal((1UL << 24) - 1, b.FirstRaw);
    }

    /// <summary>
    /// Truth: a run of true ticks (random intervals, each less than one wrap) starting anywhere in
    /// the range, recorded modulo 2^bits; unwrapping must give back true tick - first tick exactly,
    /// across many wraps.
    /// </summary>
    [Theory]
    [InlineData(16, 1)]
    [InlineData(16, 2)]
    [InlineData(24, 3)]
    [InlineData(24, 4)]
    [InlineData(32, 5)]
    [InlineData(32, 6)]
    public void Capture_crossing_many_wraps_unwraps_exactly_from_any_start(int bits, int seed)
    {
        var rng = new Random(seed);
        ulong wrap = 1UL << bits;
        ulong mask = wrap - 1;
        for (int run = 0; run < 20; run++)
        {
            ulong start = (ulong)rng.NextInt64(0, (long)wrap);
            if (run == 0) start = 0;
            if (run == 1) start = mask;
            var u = new TimerUnwrapper(bits);
            long truth = 0;
            long maxStep = (long)(wrap - 1);
            for (int k = 0; k < 5000; k++)
            {
                if (k > 0)
                {
                    // Mostly large steps (so many wraps), some tiny ones.
                    long step = rng.Next(4) == 0 ? rng.NextInt64(1, 100) : rng.NextInt64(1, maxStep + 1);
                    truth += step;
                }

                ulong trueTick = start + (ulong)truth;
                ulong raw = trueTick & mask;
                Assert.True(u.TryUnwrap(raw, out long tick));
                Assert.Equal(truth, tick);
            }

            Assert.True(u.Wraps > 1000, "the capture must cross many wraps, crossed " + u.Wraps);
        }
    }

    [Theory]
    [InlineData(4611686018427387904UL)]      // 2^62
    [InlineData(18446744073709551615UL - 1000000000000UL)] // near the top of 64 bits
    [InlineData(0UL)]
    public void Sixty_four_bit_start_anywhere_and_strictly_increasing(ulong start)
    {
        var u = new TimerUnwrapper(64);
        Assert.True(u.TryUnwrap(start, out long t0));
        Assert.Equal(0, t0);
        Assert.True(u.TryUnwrap(start + 400, out long t1));
        Assert.Equal(400, t1);
        Assert.False(u.TryUnwrap(start + 400, out long same));   // equal: not strictly increasing
        Assert.Equal(400, same);
        Assert.False(u.TryUnwrap(start + 399, out _));           // backwards
        Assert.True(u.TryUnwrap(start + 1_000_000_000, out long t2));
        Assert.Equal(1_000_000_000, t2);
        Assert.Equal(start, u.FirstRaw);
    }

    [Fact]
    public void Sixty_four_bit_step_that_would_overflow_the_tick_is_rejected()
    {
        var u = new TimerUnwrapper(64);
        Assert.True(u.TryUnwrap(0, out _));
        Assert.False(u.TryUnwrap(ulong.MaxValue, out _)); // 2^64 - 1 > long.MaxValue
        Assert.True(u.TryUnwrap((ulong)long.MaxValue, out long t));
        Assert.Equal(long.MaxValue, t);
    }

    [Fact]
    public void Repeated_timestamp_is_rejected_but_repeated_count_is_accepted()
    {
        var ticks = new TimerUnwrapper(16);
        Assert.True(ticks.TryUnwrap(100, out _));
        Assert.False(ticks.TryUnwrap(100, out _));

        var counts = new TimerUnwrapper(16, true);
        Assert.True(counts.TryUnwrap(65530, out _));
        Assert.True(counts.TryUnwrap(65530, out long c1));
        Assert.Equal(0, c1);
        Assert.True(counts.TryUnwrap(4, out long c2));
        Assert.Equal(10, c2);

        var counts64 = new TimerUnwrapper(64, true);
        Assert.True(counts64.TryUnwrap(7, out _));
        Assert.True(counts64.TryUnwrap(7, out _));
        Assert.False(counts64.TryUnwrap(6, out _));
    }

    /// <summary>Fast-wrap rule of docs/capture-text-format.md: warn when the timer wraps in fewer than 8 expected intervals; once.</summary>
    [Fact]
    public void Fast_wrap_warning_is_given_once_and_only_when_due()
    {
        var u = new TimerUnwrapper(16);
        Assert.Equal(65536.0, u.WrapTicks);
        Assert.False(u.WrapsTooFast(8192));          // exactly 8 intervals per wrap: fine
        Assert.True(u.WrapsTooFast(8193));
        Assert.False(u.TryGetWrapWarning(1000, out string? none));
        Assert.Null(none);
        Assert.False(u.TryGetWrapWarning(0, out _)); // unknown interval
        Assert.True(u.TryGetWrapWarning(16000, out string? w));
        Assert.Contains("timer_bits = 16", w);
        Assert.Contains("65536", w);
        Assert.Contains("4.0 expected intervals", w);
        Assert.False(u.TryGetWrapWarning(16000, out _));
        u.Reset();
        Assert.True(u.TryGetWrapWarning(16000, out _));

        Assert.False(new TimerUnwrapper(64).WrapsTooFast(1e15));
        Assert.Equal(18446744073709551616.0, new TimerUnwrapper(64).WrapTicks);
    }

    /// <summary>
    /// Two swapped rows on a 32-bit timer: the later value comes first, so the earlier one lies one period
    /// below it. Taken as a forward step it would be a wrap of 2^32 - 1000 ticks (53.7 s at 80 MHz); with
    /// the running period known it is a backward step, rejected with its distance, and the state is kept.
    /// </summary>
    [Theory]
    [InlineData(24)]
    [InlineData(32)]
    public void A_small_step_back_is_rejected_as_backward_once_the_interval_is_known(int bits)
    {
        ulong wrap = 1UL << bits;
        var u = new TimerUnwrapper(bits) { ExpectedIntervalTicks = 1000 };
        Assert.True(u.TryUnwrap(wrap - 500, out _));
        Assert.True(u.TryUnwrap(1500, out long t1));          // crosses the wrap forwards: 2000 ticks
        Assert.Equal(2000, t1);
        Assert.False(u.TryUnwrap(500, out long kept));        // 1000 ticks back
        Assert.Equal(2000, kept);
        Assert.Equal(1000, u.LastBackwardTicks);
        Assert.Equal(1, u.BackwardSteps);
        Assert.Equal(1, u.Rejected);
        Assert.True(u.TryUnwrap(2500, out long t2));          // the next good row follows the last good one
        Assert.Equal(3000, t2);
        Assert.Equal(0, u.LastBackwardTicks);
        Assert.Equal(1, u.Wraps);
    }

    [Fact]
    public void A_long_forward_gap_stays_a_forward_step_and_the_check_is_off_without_an_interval()
    {
        // 8 expected intervals back is still a backward step; 9 (or a gap that is nearer forwards) is a forward gap.
        ulong wrap = 1UL << 32;
        var u = new TimerUnwrapper(32) { ExpectedIntervalTicks = 1000 };
        Assert.True(u.TryUnwrap(100_000, out _));
        Assert.False(u.TryUnwrap(100_000 - 8000, out _));
        Assert.Equal(8000, u.LastBackwardTicks);
        Assert.True(u.TryUnwrap(100_000 - 9000, out long gap));   // a gap of 2^32 - 9000 ticks forwards
        Assert.Equal((long)wrap - 9000, gap);
        Assert.True(u.TryUnwrap(100_000 + 3_000_000_000UL - 9000, out long half)); // 3e9 forwards, nearer than backwards
        Assert.Equal((long)wrap - 9000 + 3_000_000_000L, half);

        var off = new TimerUnwrapper(32);
        Assert.True(off.TryUnwrap(100_000, out _));
        Assert.True(off.TryUnwrap(99_000, out long wrapped));     // no interval known: a forward wrap, as before
        Assert.Equal((long)wrap - 1000, wrapped);
    }

    [Fact]
    public void In_a_fast_wrapping_timer_the_nearer_reading_wins()
    {
        // 16-bit timer, interval 14464 ticks (4.5 per wrap): every ordinary step is nearer forwards than
        // backwards, so none is rejected even though 8 intervals exceed the wrap.
        var u = new TimerUnwrapper(16) { ExpectedIntervalTicks = 14464 };
        ulong raw = 0;
        Assert.True(u.TryUnwrap(raw, out _));
        for (int i = 1; i <= 100; i++)
        {
            raw = (raw + 14464) & 0xFFFF;
            Assert.True(u.TryUnwrap(raw, out long t));
            Assert.Equal(14464L * i, t);
        }

        Assert.Equal(0, u.BackwardSteps);
    }

    [Fact]
    public void A_count_that_falls_back_a_little_is_a_backward_step()
    {
        var counts = new TimerUnwrapper(16, true) { ExpectedIntervalTicks = 100 };
        Assert.True(counts.TryUnwrap(1000, out _));
        Assert.True(counts.TryUnwrap(1000, out _));            // unchanged count: fine
        Assert.False(counts.TryUnwrap(990, out _));            // 10 counts back
        Assert.Equal(10, counts.LastBackwardTicks);
        Assert.True(counts.TryUnwrap(1100, out long c));
        Assert.Equal(100, c);
    }

    [Fact]
    public void The_fast_wrap_warning_says_the_frequency_may_be_aliased()
    {
        var u = new TimerUnwrapper(16);
        Assert.True(u.TryGetWrapWarning(14464, out string? w));
        Assert.Contains("the frequency may be aliased", w);
        Assert.Contains("search_hz", w);
    }
}
