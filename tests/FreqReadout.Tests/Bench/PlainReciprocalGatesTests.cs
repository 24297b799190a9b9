using FreqReadout.Host.Bench;
using FreqReadout.Host.Captures;

namespace FreqReadout.Tests.Bench;

/// <summary>The plain ways' 0.1 s reciprocal gates, worked out by hand on tiny captures (with timer and counter wraps).</summary>
public class PlainReciprocalGatesTests
{
    private static MemoryCapture Capture(CaptureMetadata md, params (ulong Tick, ulong Count)[] rows)
    {
        var c = new MemoryCapture(md, "hand-made");
        long n = 0;
        foreach (var (tick, count) in rows)
        {
            c.WriteRow(new CaptureRow(++n, tick, count, null, null));
        }

        c.Complete(Array.Empty<KeyValuePair<string, string>>());
        return c;
    }

    [Fact]
    public void Edges_GateClosesOnTheFirstEdgeAtLeastATenthOfASecondOn_AndOpensTheNext()
    {
        // 1 kHz timer (1 ms ticks), prescale 2, a 16-bit timer that starts 30 ticks before its wrap.
        // Ticks 0 40 80 110 | 150 190 215 | 260 330: gate 1 = 0..110 (3 intervals): 3 x 2 x 1000 / 110 = 54.545 Hz, ends 0.110 s;
        // gate 2 = 110..215 (105 ticks, 3 intervals): 57.143 Hz, ends 0.215 s; gate 3 = 215..330 (115 ticks, 2 intervals): 34.783 Hz.
        var md = new CaptureMetadata { ClockHz = 1000, Prescale = 2, TimerBits = 16 };
        ulong start = 65536 - 30;
        var ticks = new ulong[] { 0, 40, 80, 110, 150, 190, 215, 260, 330 };
        MemoryCapture c = Capture(md, ticks.Select(t => ((start + t) % 65536, 0UL)).ToArray());
        List<PlainGate> g = PlainReciprocalGates.Compute(c);
        Assert.Equal(3, g.Count);
        Assert.Equal(0.110, g[0].EndSeconds, 12);
        Assert.Equal(6000.0 / 110, g[0].FrequencyHz, 9);
        Assert.Equal(0.215, g[1].EndSeconds, 12);
        Assert.Equal(6000.0 / 105, g[1].FrequencyHz, 9);
        Assert.Equal(0.330, g[2].EndSeconds, 12);
        Assert.Equal(4000.0 / 115, g[2].FrequencyHz, 9);
    }

    [Fact]
    public void Snapshots_CountDifferenceOverTickDifference_WithAWrappingCounter()
    {
        // 1 MHz timer; counts on a 16-bit counter from 65000. Gate 1 = reads 0..100000 us: (2003 - 1000) / 0.1 s = 10030 Hz;
        // gate 2 = 100000..210000 us (the first read at least 0.1 s on): (3100 - 2003) / 0.11 s = 9972.73 Hz.
        var md = new CaptureMetadata { ClockHz = 1e6, Kind = CaptureKind.Snapshots, TimerBits = 64, CountBits = 16 };
        ulong c0 = 65000 - 1000;
        MemoryCapture c = Capture(md,
            (0, (c0 + 1000) % 65536),
            (50_000, (c0 + 1500) % 65536),
            (100_000, (c0 + 2003) % 65536),
            (150_000, (c0 + 2490) % 65536),
            (210_000, (c0 + 3100) % 65536));
        List<PlainGate> g = PlainReciprocalGates.Compute(c);
        Assert.Equal(2, g.Count);
        Assert.Equal(0.1, g[0].EndSeconds, 12);
        Assert.Equal(10030.0, g[0].FrequencyHz, 9);
        Assert.Equal(0.21, g[1].EndSeconds, 12);
        Assert.Equal(1097 / 0.11, g[1].FrequencyHz, 9);
    }

    [Fact]
    public void ShorterThanOneGate_NoGate()
    {
        var md = new CaptureMetadata { ClockHz = 1000, TimerBits = 64 };
        Assert.Empty(PlainReciprocalGates.Compute(Capture(md, (0, 0), (50, 0), (99, 0))));
    }
}
