using FreqReadout.Detection;
using FreqReadout.Firmware.Device;
using FreqReadout.Firmware.Ports;
using FreqReadout.Readout;
using Moq;

namespace FreqReadout.Firmware.Tests;

/// <summary>The alert pattern's mapping from readings (invented) to tones: the design stated in AlertPattern's doc.</summary>
public class AlertPatternTests
{
    private static Reading Make(bool target, double sigma, TargetClass cls, ReadoutState state = ReadoutState.Target, bool belowFloor = false)
    {
        var r = new Reading();
        r.Set(state, 1.0, 0.2, true, 100_000, true, 100_000, sigma * 0.5, false, 0, sigma, 0.5, 0, 0,
            target, state == ReadoutState.Hold, belowFloor, target ? cls : TargetClass.None, false);
        return r;
    }

    /// <summary>The tones over one second sampled every ms after an update at t = 0: (highest tone, ms sounding, on/off switches).</summary>
    private static (int MaxHz, int OnMs, int Switches) Listen(AlertPattern p)
    {
        int max = 0, on = 0, switches = 0, last = -1;
        for (long ms = 0; ms < 1000; ms++)
        {
            int hz = p.ToneAt(ms * 1000);
            max = Math.Max(max, hz);
            on += hz > 0 ? 1 : 0;
            if (last >= 0 && (hz > 0) != (last > 0))
            {
                switches++;
            }

            last = hz;
        }

        return (max, on, switches);
    }

    [Theory]
    [InlineData(TargetClass.None)]
    [InlineData(TargetClass.Ferrous)]
    [InlineData(TargetClass.NonFerrous)]
    [InlineData(TargetClass.Unclear)]
    public void Silent_without_a_target_whatever_the_shift(TargetClass cls)
    {
        var p = new AlertPattern();
        foreach (double sigma in new[] { 0.0, 5, 50, -50, double.NaN })
        {
            p.Update(Make(false, sigma, cls, ReadoutState.Tracking), 0);
            Assert.Equal((0, 0, 0), Listen(p));
        }
    }

    [Theory]
    [InlineData(ReadoutState.NoSignal)]
    [InlineData(ReadoutState.Settling)]
    public void Silent_without_signal_or_while_settling(ReadoutState state)
    {
        var p = new AlertPattern();
        p.Update(Make(true, 20, TargetClass.NonFerrous, state), 0);
        Assert.Equal(0, Listen(p).MaxHz);
    }

    [Theory]
    [InlineData(TargetClass.Ferrous)]
    [InlineData(TargetClass.NonFerrous)]
    [InlineData(TargetClass.Unclear)]
    public void Pitch_rises_with_the_shift_in_sigmas_and_is_clamped(TargetClass cls)
    {
        var p = new AlertPattern();
        int previous = 0;
        var tones = new List<int>();
        for (double sigma = 0; sigma <= 60; sigma += 0.5)
        {
            p.Update(Make(true, sigma, cls), 0);
            Assert.True(p.ToneHz >= previous, $"{cls}: tone fell from {previous} to {p.ToneHz} Hz at {sigma} sigma");
            previous = p.ToneHz;
            tones.Add(p.ToneHz);
        }

        Assert.True(tones[^1] > tones[0], cls + ": pitch does not rise");
        p.Update(Make(true, AlertPattern.SigmaHigh, cls), 0);
        int top = p.ToneHz;
        p.Update(Make(true, 1e9, cls), 0);
        Assert.Equal(top, p.ToneHz);
        p.Update(Make(true, -1e9, cls), 0); // |shift|: the sign is the class's business, not the pitch's
        Assert.Equal(top, p.ToneHz);
        p.Update(Make(true, 0, cls), 0);
        int bottom = p.ToneHz;
        p.Update(Make(true, AlertPattern.SigmaLow, cls), 0);
        Assert.Equal(bottom, p.ToneHz);
        Assert.True(bottom > 0);
    }

    [Fact]
    public void Classes_have_distinct_patterns()
    {
        var p = new AlertPattern();
        p.Update(Make(true, 10, TargetClass.NonFerrous), 0);
        var nonFerrous = Listen(p);
        p.Update(Make(true, 10, TargetClass.Ferrous), 0);
        var ferrous = Listen(p);
        p.Update(Make(true, 10, TargetClass.Unclear), 0);
        var unclear = Listen(p);

        Assert.Equal(1000, nonFerrous.OnMs);      // steady
        Assert.Equal(0, nonFerrous.Switches);
        Assert.InRange(ferrous.OnMs, 450, 550);   // chopped, on half the time
        Assert.True(ferrous.Switches >= 8, "ferrous switches " + ferrous.Switches);
        Assert.InRange(unclear.OnMs, 80, 120);    // short blips, 40 of each 400 ms
        Assert.InRange(unclear.Switches, 4, 6);

        // Pitch ranges do not overlap: the class is heard even without the rhythm (an LED shows only the rhythm).
        Assert.True(AlertPattern.FerrousHighHz < AlertPattern.UnclearLowHz && AlertPattern.UnclearHighHz < AlertPattern.NonFerrousLowHz);
        Assert.True(ferrous.MaxHz < unclear.MaxHz && unclear.MaxHz < nonFerrous.MaxHz);
    }

    [Fact]
    public void Ferrous_chops_faster_as_the_shift_grows()
    {
        var p = new AlertPattern();
        long previous = long.MaxValue;
        for (double sigma = 0; sigma <= 40; sigma += 1)
        {
            p.Update(Make(true, sigma, TargetClass.Ferrous), 0);
            Assert.True(p.PeriodMicroseconds <= previous);
            previous = p.PeriodMicroseconds;
        }

        Assert.Equal(AlertPattern.FerrousFastPeriodMicroseconds, previous);
        p.Update(Make(true, 0, TargetClass.Ferrous), 0);
        Assert.Equal(AlertPattern.FerrousSlowPeriodMicroseconds, p.PeriodMicroseconds);
    }

    [Fact]
    public void A_beat_below_its_floor_sounds_as_unclear_whatever_the_class()
    {
        var p = new AlertPattern();
        p.Update(Make(true, 10, TargetClass.Unclear), 0);
        var unclear = Listen(p);
        p.Update(Make(true, 10, TargetClass.NonFerrous, belowFloor: true), 0);
        Assert.Equal(unclear, Listen(p));
    }

    [Fact]
    public void Hold_still_sounds_an_open_target()
    {
        var p = new AlertPattern();
        p.Update(Make(true, 10, TargetClass.NonFerrous, ReadoutState.Hold), 0);
        Assert.True(p.ToneHz > 0);
    }

    [Fact]
    public void Drive_calls_the_port_only_when_the_tone_changes_and_retries_after_a_failure()
    {
        var port = new Mock<IAlertPort>();
        var calls = new List<int>();
        bool fail = false;
        port.Setup(a => a.TrySetTone(It.IsAny<int>())).Returns<int>(hz => { calls.Add(hz); return !fail; });
        var p = new AlertPattern();
        p.Update(Make(false, 0, TargetClass.None, ReadoutState.Tracking), 0);
        for (long ms = 0; ms < 100; ms++)
        {
            p.Drive(port.Object, ms * 1000);
        }

        Assert.Equal(new[] { 0 }, calls);          // silenced once at start
        p.Update(Make(true, 10, TargetClass.NonFerrous), 100_000);
        for (long ms = 100; ms < 1100; ms++)
        {
            p.Drive(port.Object, ms * 1000);
        }

        Assert.Equal(2, calls.Count);              // one steady tone for a second
        Assert.True(calls[1] >= AlertPattern.NonFerrousLowHz);

        p.Update(Make(true, 10, TargetClass.Ferrous), 1_100_000);
        calls.Clear();
        for (long ms = 1100; ms < 2100; ms++)
        {
            p.Drive(port.Object, ms * 1000);
        }

        Assert.InRange(calls.Count, 8, 16);         // on and off at the chop rate, not per step
        Assert.Equal(calls[0], p.ToneHz);           // a new pattern starts on

        fail = true;
        calls.Clear();
        p.Update(Make(true, 10, TargetClass.NonFerrous), 2_100_000);
        p.Drive(port.Object, 2_100_000);
        p.Drive(port.Object, 2_101_000);
        Assert.Equal(2, calls.Count);              // a refused tone is asked for again at the next step
        Assert.Equal(2, p.PortFailures);
    }

    [Fact]
    public void A_forced_tone_sounds_steadily_without_a_target()
    {
        var p = new AlertPattern { ForcedToneHz = 1500 };
        p.Update(Make(false, 0, TargetClass.None, ReadoutState.Tracking), 0);
        Assert.Equal((1500, 1000, 0), Listen(p));
    }

    [Fact]
    public void Update_and_drive_allocate_nothing()
    {
        var p = new AlertPattern();
        var port = new CountingPort();
        Reading[] readings = [Make(true, 10, TargetClass.Ferrous), Make(true, 20, TargetClass.NonFerrous), Make(false, 0, TargetClass.None, ReadoutState.Tracking)];
        p.Update(readings[0], 0);
        p.Drive(port, 0);
        long before = GC.GetAllocatedBytesForCurrentThread();
        for (int i = 0; i < 3000; i++)
        {
            p.Update(readings[i % 3], i * 1000L);
            p.Drive(port, i * 1000L);
        }

        Assert.Equal(0, GC.GetAllocatedBytesForCurrentThread() - before);
        Assert.True(port.Calls > 100);
    }

    private sealed class CountingPort : IAlertPort
    {
        public int Calls;

        public bool TrySetTone(int frequencyHz)
        {
            Calls++;
            return true;
        }
    }
}
