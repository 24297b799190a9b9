using FreqReadout.Counting;
using FreqReadout.Firmware.Device;
using FreqReadout.Firmware.Ports;
using FreqReadout.Readout;
using FreqReadout.Tracking;
using Moq;

namespace FreqReadout.Firmware.Tests;

/// <summary>The loop's button port over scripted raw levels (invented), alone and driving a device loop.</summary>
public class DebouncedButtonsTests
{
    /// <summary>Raw levels set by the test, and a microsecond clock it advances.</summary>
    private sealed class ScriptedLevels : IButtonLevelPort, IClockPort
    {
        public bool Down;
        public bool? Switch;
        public ulong NowUs;

        public bool TryReadButtonDown(out bool down)
        {
            down = Down;
            return true;
        }

        public bool TryReadHoldSwitchOn(out bool on)
        {
            on = Switch ?? false;
            return Switch.HasValue;
        }

        public bool TryReadNow(out ulong rawTick)
        {
            rawTick = NowUs;
            return true;
        }
    }

    /// <summary>Steps the port every ms for <paramref name="ms"/> with the button at <paramref name="down"/>; returns the presses taken.</summary>
    private static int Step(DebouncedButtons port, ScriptedLevels levels, bool down, int ms)
    {
        int presses = 0;
        for (int i = 0; i < ms; i++)
        {
            levels.Down = down;
            presses += port.TryTakeRebaselinePress() ? 1 : 0;
            levels.NowUs += 1000;
        }

        return presses;
    }

    [Fact]
    public void A_short_press_is_one_rebaseline_and_a_long_press_toggles_hold()
    {
        var levels = new ScriptedLevels();
        var port = new DebouncedButtons(levels, levels);
        Assert.Equal(0, Step(port, levels, false, 50));
        Assert.True(port.TryReadHold(out bool hold));
        Assert.False(hold);

        Assert.Equal(1, Step(port, levels, true, 3) + Step(port, levels, false, 2) + Step(port, levels, true, 200) + Step(port, levels, false, 100));
        Assert.True(port.TryReadHold(out hold));
        Assert.False(hold);

        Assert.Equal(0, Step(port, levels, true, 1500) + Step(port, levels, false, 100));
        Assert.True(port.TryReadHold(out hold));
        Assert.True(hold);
    }

    [Fact]
    public void A_wired_hold_switch_replaces_the_toggle_and_is_debounced()
    {
        var levels = new ScriptedLevels { Switch = false };
        var port = new DebouncedButtons(levels, levels);
        Step(port, levels, false, 50);
        levels.Switch = true;
        Step(port, levels, false, 10);
        port.TryReadHold(out bool hold);
        Assert.False(hold);                            // not yet steady for 25 ms
        Step(port, levels, false, 30);
        port.TryReadHold(out hold);
        Assert.True(hold);
        Step(port, levels, true, 1500);                // a long press does not override the switch
        Step(port, levels, false, 100);
        port.TryReadHold(out hold);
        Assert.True(hold);
        levels.Switch = false;
        Step(port, levels, false, 40);
        port.TryReadHold(out hold);
        Assert.False(hold);
    }

    [Fact]
    public void A_long_press_puts_the_device_loop_in_hold_without_a_rebaseline()
    {
        const double clockHz = 1_000_000;
        var settings = new DeviceSettings(new CounterSettings { ClockHz = clockHz, GateSeconds = 0.1, JitterTicks = 0.5 }, new ReadoutSettings())
        {
            Input = InputKind.Edges,
            MaxEdgesPerStep = 100, // 10 ms of a 10 kHz signal a step
        };
        var source = new QueueEdgeSource();
        var levels = new ScriptedLevels();
        var buttons = new DebouncedButtons(levels, levels);
        var loop = new DeviceLoop(settings, source, source, new Mock<IDisplayPort>().Object, buttons);
        ulong tick = 0;
        void FeedAndStep(double seconds, bool down)
        {
            int edges = (int)(seconds * 10_000);
            for (int i = 0; i < edges; i++)
            {
                tick += 100;
                source.Enqueue(tick & 0xFFFF_FFFFUL);
            }

            while (source.Pending > 0)
            {
                levels.Down = down;
                loop.Step();
                levels.NowUs += 10_000; // the button's clock: 10 ms a step, as the edges say
            }
        }

        FeedAndStep(8, false);
        Assert.True(loop.Pipeline.HasBaseline);
        FeedAndStep(1.5, true);   // held 1.5 s: hold toggles on while held
        FeedAndStep(1.0, false);
        var r = new Reading();
        Assert.True(loop.TryGetLastReading(r));
        Assert.True(r.HoldActive, "hold not on after a long press; state " + r.State);
        var n = new RebaselineNotice();
        while (loop.Pipeline.TryTakeRebaseline(n))
        {
            Assert.NotEqual(RebaselineReason.Manual, n.Reason);
        }

        FeedAndStep(1.2, true);   // a second long press clears it
        FeedAndStep(1.0, false);
        Assert.True(loop.TryGetLastReading(r));
        Assert.False(r.HoldActive);
    }
}
