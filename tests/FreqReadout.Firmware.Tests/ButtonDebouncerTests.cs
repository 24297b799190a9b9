using FreqReadout.Firmware.Device;

namespace FreqReadout.Firmware.Tests;

/// <summary>
/// The button debouncer with invented bouncing inputs: 25 ms debounce, 1 s long press (the defaults), fed every 1 ms
/// as a loop step would.
/// </summary>
public class ButtonDebouncerTests
{
    private const long Ms = 1000;

    /// <summary>Feeds a level for a span of time, one update a millisecond; returns the short presses taken meanwhile.</summary>
    private static int Hold(ButtonDebouncer d, ref long nowUs, bool down, long spanMs)
    {
        int presses = 0;
        for (long i = 0; i < spanMs; i++)
        {
            d.Update(down, nowUs);
            if (d.TryTakeShortPress())
            {
                presses++;
            }

            nowUs += Ms;
        }

        return presses;
    }

    /// <summary>Contact bounce: alternating levels every 1-3 ms for about 8 ms (invented).</summary>
    private static int Bounce(ButtonDebouncer d, ref long nowUs, int seed)
    {
        var rng = new Random(seed);
        int presses = 0;
        bool level = true;
        for (int i = 0; i < 5; i++)
        {
            presses += Hold(d, ref nowUs, level, rng.Next(1, 4));
            level = !level;
        }

        return presses;
    }

    [Fact]
    public void A_bouncing_short_press_counts_once_on_release()
    {
        var d = new ButtonDebouncer();
        long now = 0;
        int presses = Hold(d, ref now, false, 100);
        presses += Bounce(d, ref now, 1);
        presses += Hold(d, ref now, true, 150);
        Assert.True(d.IsDown);
        Assert.Equal(0, presses); // counted on release, not on press
        presses += Bounce(d, ref now, 2);
        presses += Hold(d, ref now, false, 100);
        Assert.Equal(1, presses);
        Assert.False(d.IsDown);
        Assert.False(d.HoldOn);
        Assert.False(d.TryTakeShortPress());
    }

    [Fact]
    public void Pulses_shorter_than_the_debounce_time_count_as_nothing()
    {
        var d = new ButtonDebouncer();
        long now = 0;
        int presses = Hold(d, ref now, false, 50);
        for (int i = 0; i < 40; i++)
        {
            // an invented burst of interference: 20 ms down, 5 ms up, repeated for a second
            presses += Hold(d, ref now, true, 20);
            presses += Hold(d, ref now, false, 5);
        }

        presses += Hold(d, ref now, false, 100);
        Assert.Equal(0, presses);
        Assert.False(d.IsDown);
        Assert.False(d.HoldOn);
    }

    [Fact]
    public void A_press_just_over_the_debounce_time_counts_and_one_just_under_does_not()
    {
        var d = new ButtonDebouncer();
        long now = 0;
        Hold(d, ref now, false, 50);
        int under = Hold(d, ref now, true, 24) + Hold(d, ref now, false, 60);
        int over = Hold(d, ref now, true, 27) + Hold(d, ref now, false, 60);
        Assert.Equal(0, under);
        Assert.Equal(1, over);
    }

    [Fact]
    public void A_long_press_toggles_hold_while_held_and_is_not_a_short_press()
    {
        var d = new ButtonDebouncer();
        long now = 0;
        int presses = Hold(d, ref now, false, 50);
        presses += Bounce(d, ref now, 3);
        presses += Hold(d, ref now, true, 900);
        Assert.False(d.HoldOn); // not yet a second
        presses += Hold(d, ref now, true, 200);
        Assert.True(d.HoldOn);  // toggled while still held
        presses += Bounce(d, ref now, 4);
        presses += Hold(d, ref now, false, 100);
        Assert.Equal(0, presses);
        Assert.True(d.HoldOn);

        presses += Hold(d, ref now, true, 1200);
        presses += Hold(d, ref now, false, 100);
        Assert.False(d.HoldOn); // a second long press toggles back
        Assert.Equal(0, presses);
    }

    [Fact]
    public void A_press_held_across_many_steps_toggles_once_and_counts_no_press()
    {
        var d = new ButtonDebouncer();
        long now = 0;
        Hold(d, ref now, false, 50);
        int presses = Hold(d, ref now, true, 60_000); // a minute, 60 000 steps
        Assert.True(d.HoldOn);
        Assert.True(d.IsDown);
        presses += Hold(d, ref now, false, 100);
        Assert.Equal(0, presses);
        Assert.True(d.HoldOn);
    }

    [Fact]
    public void Short_presses_in_a_row_each_count_once()
    {
        var d = new ButtonDebouncer();
        long now = 0;
        int presses = Hold(d, ref now, false, 50);
        for (int i = 0; i < 5; i++)
        {
            presses += Bounce(d, ref now, 10 + i);
            presses += Hold(d, ref now, true, 200);
            presses += Bounce(d, ref now, 20 + i);
            presses += Hold(d, ref now, false, 200);
        }

        Assert.Equal(5, presses);
        Assert.False(d.HoldOn);
    }

    [Fact]
    public void Sparse_updates_time_the_press_from_when_its_level_was_first_seen()
    {
        // A loop that stalls: samples 30 ms apart still debounce (the level held across two samples).
        var d = new ButtonDebouncer();
        d.Update(false, 0);
        d.Update(true, 30 * Ms);
        Assert.False(d.IsDown);
        d.Update(true, 60 * Ms);
        Assert.True(d.IsDown);
        d.Update(false, 90 * Ms);
        d.Update(false, 120 * Ms);
        Assert.True(d.TryTakeShortPress());
    }

    [Fact]
    public void Times_are_checked()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new ButtonDebouncer(-1, 1000));
        Assert.Throws<ArgumentOutOfRangeException>(() => new ButtonDebouncer(25000, 25000));
        var d = new ButtonDebouncer();
        Assert.Equal(ButtonDebouncer.DefaultDebounceMicroseconds, d.DebounceMicroseconds);
        Assert.InRange(d.DebounceMicroseconds, 20 * Ms, 30 * Ms);
        Assert.Equal(1000 * Ms, d.LongPressMicroseconds);
    }
}
