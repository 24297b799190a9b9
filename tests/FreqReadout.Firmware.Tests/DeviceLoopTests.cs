using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Firmware.Device;
using FreqReadout.Firmware.Ports;
using FreqReadout.Readout;
using FreqReadout.Tracking;
using Moq;

namespace FreqReadout.Firmware.Tests;

public class DeviceLoopTests
{
    private const double ClockHz = 1_000_000;

    private static DeviceSettings Settings(InputKind input = InputKind.Edges, int timerBits = 32)
    {
        var counter = new CounterSettings { ClockHz = ClockHz, GateSeconds = 0.1, JitterTicks = 0.5 };
        var readout = new ReadoutSettings();
        return new DeviceSettings(counter, readout) { Input = input, TimerBits = timerBits, MaxEdgesPerStep = 10_000 };
    }

    /// <summary>Edges of a signal whose frequency follows <paramref name="frequencyAt"/>, on a wrapping timer, with a little jitter.</summary>
    private static double Feed(QueueEdgeSource source, double startS, double endS, Func<double, double> frequencyAt, int timerBits, Random rng)
    {
        double t = startS;
        ulong mask = timerBits == 64 ? ulong.MaxValue : (1UL << timerBits) - 1;
        const ulong offset = 0xFFFF_F000UL; // start just below a 32-bit wrap
        while (t < endS)
        {
            double jitter = (rng.NextDouble() - 0.5) * 2.0; // +-1 tick
            ulong raw = (offset + (ulong)Math.Round(t * ClockHz + jitter)) & mask;
            source.Enqueue(raw);
            t += 1.0 / frequencyAt(t);
        }

        return t;
    }

    private static void Run(DeviceLoop loop, QueueEdgeSource source)
    {
        while (source.Pending > 0)
        {
            loop.Step();
        }
    }

    [Fact]
    public void Edge_loop_shows_the_counted_frequency_across_a_timer_wrap()
    {
        var source = new QueueEdgeSource();
        var display = new Mock<IDisplayPort>();
        display.SetupGet(d => d.LineWidth).Returns(20);
        string? line1 = null;
        display.Setup(d => d.Show(It.IsAny<string>(), It.IsAny<string>(), It.IsAny<string>()))
            .Callback<string, string, string>((a, b, c) => line1 = a);
        var buttons = new Mock<IButtonPort>();
        var loop = new DeviceLoop(Settings(), source, source, display.Object, buttons.Object);

        Feed(source, 0, 2.0, _ => 12_500.0, 32, new Random(1));
        Run(loop, source);

        Assert.True(loop.Gates >= 18, "gates: " + loop.Gates);
        Assert.Equal(0, loop.RejectedTicks);
        var r = new Reading();
        Assert.True(loop.TryGetLastReading(r));
        Assert.True(r.HasFrequency);
        Assert.InRange(r.FrequencyHz, 12_499.9, 12_500.1); // truth of the generated edges, +-1 tick jitter
        Assert.Equal("F    12500.0 Hz     ", line1);
        // 20 gates of 0.1 s, refreshed every 0.5 s and on each change of state: far fewer refreshes than gates.
        display.Verify(d => d.Show(It.IsAny<string>(), It.IsAny<string>(), It.IsAny<string>()), Times.Exactly((int)loop.DisplayUpdates));
        Assert.InRange(loop.DisplayUpdates, 3, 10);
    }

    [Fact]
    public void A_step_in_frequency_after_settling_becomes_an_event_with_the_sign_rule_class()
    {
        var source = new QueueEdgeSource();
        var display = new Mock<IDisplayPort>();
        var buttons = new Mock<IButtonPort>();
        var loop = new DeviceLoop(Settings(), source, source, display.Object, buttons.Object);
        var rng = new Random(2);

        // 10 s quiet (settling and baseline), a 1 s rise of 2 Hz (non-ferrous by the default polarity), 5 s quiet.
        double t = Feed(source, 0, 10, _ => 10_000.0, 32, rng);
        t = Feed(source, t, t + 1, _ => 10_002.0, 32, rng);
        Feed(source, t, t + 5, _ => 10_000.0, 32, rng);
        Run(loop, source);

        var e = new DetectionEvent();
        Assert.True(loop.TryTakeEvent(e), "no event");
        Assert.Equal(TargetClass.NonFerrous, e.Class);
        Assert.InRange(e.PeakShiftHz, 1.6, 2.4);
    }

    [Fact]
    public void The_rebaseline_button_reaches_the_pipeline_as_a_manual_rebaseline()
    {
        var source = new QueueEdgeSource();
        var display = new Mock<IDisplayPort>();
        var buttons = new Mock<IButtonPort>();
        var loop = new DeviceLoop(Settings(), source, source, display.Object, buttons.Object);
        var rng = new Random(3);
        Run(loop, source);
        double t = Feed(source, 0, 8, _ => 10_000.0, 32, rng);
        Run(loop, source);
        Assert.True(loop.Pipeline.HasBaseline);

        buttons.SetupSequence(b => b.TryTakeRebaselinePress()).Returns(true).Returns(false);
        Feed(source, t, t + 8, _ => 10_000.0, 32, rng); // the notice comes once the new baseline is taken (settling + baseline time)
        Run(loop, source);

        bool manual = false;
        var n = new RebaselineNotice();
        while (loop.Pipeline.TryTakeRebaseline(n))
        {
            manual |= n.Reason == RebaselineReason.Manual;
        }

        Assert.True(manual, "no manual re-baseline notice");
        buttons.Verify(b => b.TryTakeRebaselinePress(), Times.AtLeastOnce());
    }

    [Fact]
    public void Silence_gives_no_signal_on_the_display_not_a_stale_number()
    {
        var source = new QueueEdgeSource();
        var display = new Mock<IDisplayPort>();
        display.SetupGet(d => d.LineWidth).Returns(20);
        string? line1 = null;
        display.Setup(d => d.Show(It.IsAny<string>(), It.IsAny<string>(), It.IsAny<string>()))
            .Callback<string, string, string>((a, b, c) => line1 = a);
        var loop = new DeviceLoop(Settings(), source, source, display.Object, new Mock<IButtonPort>().Object);
        Feed(source, 0, 1, _ => 10_000.0, 32, new Random(4));
        Run(loop, source);
        Assert.StartsWith("F    10000", line1);

        source.NowRaw = (0xFFFF_F000UL + 3_000_000UL) & 0xFFFF_FFFFUL; // 2 s after the last edge
        loop.Step();

        Assert.Equal("F        --- Hz     ", line1);
        var r = new Reading();
        Assert.True(loop.TryGetLastReading(r));
        Assert.False(r.HasFrequency);
    }

    [Fact]
    public void Snapshot_loop_counts_a_pulse_counter()
    {
        // 130 kHz read every 1 ms on a 1 MHz timer, 16-bit counter that wraps every half second.
        var counter = new Mock<IPulseCounterPort>();
        long reads = 0;
        counter.Setup(c => c.TryReadSnapshot(out It.Ref<ulong>.IsAny, out It.Ref<ulong>.IsAny))
            .Returns(new TryRead((out ulong count, out ulong time) =>
            {
                double t = reads++ * 0.001;
                count = (ulong)Math.Floor(t * 130_000.0) & 0xFFFF;
                time = (ulong)Math.Round(t * ClockHz) & 0xFFFF_FFFF;
                return true;
            }));
        var display = new Mock<IDisplayPort>();
        DeviceSettings s = Settings(InputKind.Snapshots);
        s.CountBits = 16;
        var loop = new DeviceLoop(s, counter.Object, display.Object, new Mock<IButtonPort>().Object);
        for (int i = 0; i < 2001; i++)
        {
            loop.Step();
        }

        var r = new Reading();
        Assert.True(loop.TryGetLastReading(r));
        Assert.True(r.HasFrequency);
        Assert.InRange(r.FrequencyHz, 129_998.0, 130_002.0); // whole-count quantisation, 100 reads per gate
        Assert.Equal(0, loop.RejectedTicks);
    }

    private delegate bool TryRead(out ulong count, out ulong time);

    [Fact]
    public void Gates_between_display_refreshes_allocate_nothing()
    {
        var source = new QueueEdgeSource();
        var display = new Mock<IDisplayPort>();
        DeviceSettings s = Settings();
        s.DisplayIntervalSeconds = 60; // only state changes refresh the display in this run
        var loop = new DeviceLoop(s, source, source, display.Object, new IdleButtons());
        var rng = new Random(5);
        double t = Feed(source, 0, 30, _ => 10_000.0, 32, rng); // warm-up: settling, baseline, tracking
        Run(loop, source);
        Feed(source, t, t + 30, _ => 10_000.0, 32, rng);       // continues the same edge train
        long updates = loop.DisplayUpdates;
        long gates = loop.Gates;

        long before = GC.GetAllocatedBytesForCurrentThread();
        Run(loop, source);
        long allocated = GC.GetAllocatedBytesForCurrentThread() - before;

        Assert.True(loop.Gates - gates >= 290, "gates " + (loop.Gates - gates));
        Assert.True(updates == loop.DisplayUpdates, "refreshed in the measured stretch: " + string.Join(" / ", display.Invocations.Select(i => string.Join(",", i.Arguments))));
        Assert.Equal(0, allocated);                 // 300 gates of counting and readout, nothing allocated
    }

    [Fact]
    public void Bad_settings_are_refused_with_the_setting_named()
    {
        DeviceSettings s = Settings();
        s.TimerBits = 20;
        var source = new QueueEdgeSource();
        var ex = Assert.Throws<ArgumentException>(() => new DeviceLoop(s, source, source, new Mock<IDisplayPort>().Object, new Mock<IButtonPort>().Object));
        Assert.Contains("timer bits", ex.Message);

        s = Settings();
        s.Counter.ClockHz = 0;
        ex = Assert.Throws<ArgumentException>(() => new DeviceLoop(s, source, source, new Mock<IDisplayPort>().Object, new Mock<IButtonPort>().Object));
        Assert.Contains("clock_hz", ex.Message);
    }
}

public class EdgeRingTests
{
    [Fact]
    public void Ring_keeps_order_across_its_end_and_counts_what_it_drops_when_full()
    {
        var ring = new FreqReadout.Firmware.Device.EdgeRing(4);
        for (ulong i = 0; i < 3; i++) ring.Add(i);
        Assert.True(ring.TryReadEdge(out ulong a));
        Assert.Equal(0UL, a);
        for (ulong i = 3; i < 7; i++) ring.Add(i); // 1,2,3,4 fit; 5 and 6 are dropped
        Assert.Equal(2, ring.Dropped);
        var got = new List<ulong>();
        while (ring.TryReadEdge(out ulong v)) got.Add(v);
        Assert.Equal(new ulong[] { 1, 2, 3, 4 }, got);
        Assert.Throws<ArgumentOutOfRangeException>(() => new FreqReadout.Firmware.Device.EdgeRing(1));
    }
}
