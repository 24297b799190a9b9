using FreqReadout.Counting;
using FreqReadout.Firmware.Device;
using FreqReadout.Firmware.Link;
using FreqReadout.Firmware.Ports;
using FreqReadout.Link;
using FreqReadout.Readout;
using Moq;

namespace FreqReadout.Firmware.Tests;

/// <summary>
/// The paced device loop under the board's real troubles (invented timings, a steady invented signal): a loop that can
/// only wake every 10 ms, a pause longer than the stall limit, counter reads that straddle a wrap either way or jump
/// for no reason, and a link that blocks. Each is handled and shows in the counts and in the status frame.
/// </summary>
public class DeviceLoopHealthTests
{
    private const double SignalHz = 100_000;

    private sealed class Rig
    {
        public Rig(long wrapSpan = 0, int queueSlots = 64, ILinkPort? port = null)
        {
            Board = new SimulatedCounterBoard(SignalHz);
            var counter = new CounterSettings { ClockHz = 1e6, GateSeconds = 0.1 };
            Settings = new DeviceSettings(counter, new ReadoutSettings()) { Input = InputKind.Snapshots, TimerBits = 64, CountBits = 64, CountWrapSpan = wrapSpan, BootId = 42 };
            Queue = new LinkSendQueue(queueSlots);
            Port = port ?? new CollectingPort();
            Worker = new LinkPortWorker(Port, Queue, new LinkInbox());
            var header = new CaptureHeaderPayload { BootId = 42, Snapshots = true, ClockHz = 1e6 };
            Loop = new DeviceLoop(Settings, Board, Board, new Mock<IDisplayPort>().Object, new Mock<IButtonPort>().Object, new DeviceLinkStreamer(Queue, header), null);
        }

        public SimulatedCounterBoard Board { get; }

        public DeviceSettings Settings { get; }

        public LinkSendQueue Queue { get; }

        public ILinkPort Port { get; }

        public LinkPortWorker Worker { get; }

        public DeviceLoop Loop { get; }

        /// <summary>Steps the loop every <paramref name="stepMicroseconds"/> until <paramref name="untilMicroseconds"/>, draining the link now and then.</summary>
        public void Run(long untilMicroseconds, long stepMicroseconds)
        {
            int steps = 0;
            while (Board.NowMicroseconds < untilMicroseconds)
            {
                Loop.Step();
                Board.NowMicroseconds += stepMicroseconds;
                if (++steps % 16 == 0 && Port is CollectingPort)
                {
                    Worker.RunOnce();
                }
            }

            Loop.FlushLink();
            if (Port is CollectingPort)
            {
                Worker.RunOnce();
            }
        }

        public double LastFrequencyHz()
        {
            var r = new Reading();
            Assert.True(Loop.TryGetLastReading(r));
            Assert.True(r.HasFrequency);
            return r.FrequencyHz;
        }

        public StatusPayload LastStatus()
        {
            var decoder = new LinkFrameDecoder();
            var frame = new LinkFrame();
            var reader = new LinkPayloadReader();
            var status = new StatusPayload();
            bool any = false;
            foreach (byte b in ((CollectingPort)Port).Bytes.ToArray())
            {
                if (decoder.Push(b, frame) && frame.FrameType == LinkFrameType.Status)
                {
                    reader.Reset(frame.Payload, frame.PayloadLength);
                    Assert.True(status.TryRead(reader));
                    any = true;
                }
            }

            Assert.True(any, "no status frame");
            return status;
        }
    }

    private sealed class CollectingPort : ILinkPort
    {
        public MemoryStream Bytes { get; } = new();

        public bool TryWrite(byte[] buffer, int offset, int count)
        {
            Bytes.Write(buffer, offset, count);
            return true;
        }

        public bool TryRead(byte[] buffer, int offset, int count, out int read)
        {
            read = 0;
            return false;
        }
    }

    [Fact]
    public void A_loop_that_wakes_only_every_10_ms_reads_at_100_hz_counts_the_missed_deadlines_and_still_counts_right()
    {
        var rig = new Rig();
        rig.Run(untilMicroseconds: 5_000_000, stepMicroseconds: 10_000);
        Assert.Equal(500, rig.Loop.Reads);
        // 1 kHz was asked for: each 10 ms wake finds 9 deadlines passed besides the one it takes.
        Assert.InRange(rig.Loop.Pacer!.MissedDeadlines, 499 * 9 - 9, 499 * 9);
        Assert.Equal(0, rig.Loop.Pacer.Stalls);    // 10 ms is under the 50 ms stall limit
        Assert.InRange(rig.LastFrequencyHz(), SignalHz - 0.5, SignalHz + 0.5);
        StatusPayload status = rig.LastStatus();
        Assert.True(status.MissedDeadlines > 0);
        Assert.Equal(10_000, status.LongestGapMicroseconds);
    }

    [Fact]
    public void A_pause_longer_than_the_stall_limit_is_a_stall_not_a_dropout_of_the_signal()
    {
        var rig = new Rig();
        rig.Run(untilMicroseconds: 3_000_000, stepMicroseconds: 100);
        rig.Board.NowMicroseconds += 200_000;    // a garbage collection, say
        rig.Run(untilMicroseconds: 6_000_000, stepMicroseconds: 100);
        Assert.Equal(1, rig.Loop.Pacer!.Stalls);
        Assert.InRange(rig.Loop.Pacer.LongestGapMicroseconds, 200_000, 201_000);    // the pause plus up to one read period
        var r = new Reading();
        rig.Loop.TryGetLastReading(r);
        Assert.NotEqual(ReadoutState.NoSignal, r.State);
        Assert.InRange(rig.LastFrequencyHz(), SignalHz - 0.5, SignalHz + 0.5);
        StatusPayload status = rig.LastStatus();
        Assert.Equal(1, status.Stalls);
        Assert.Equal(rig.Loop.Pacer.LongestGapMicroseconds, status.LongestGapMicroseconds);
    }

    [Fact]
    public void Reads_that_straddle_a_wrap_either_way_are_mended_and_an_unexplained_jump_is_dropped()
    {
        const long span = 32767;    // the ESP32 driver's counter span
        var rig = new Rig(wrapSpan: span);
        rig.Board.MisreadAt(1000, +span);
        rig.Board.MisreadAt(2000, -span);
        rig.Board.MisreadAt(3000, +20000);    // over half the span, and the span does not bring it back: no wrap explains it
        rig.Run(untilMicroseconds: 5_000_000, stepMicroseconds: 1000);
        Assert.Equal(2, rig.Loop.Straddle!.Mended);
        Assert.Equal(1, rig.Loop.Straddle.Dropped);
        Assert.Equal(0, rig.Loop.RejectedTicks);
        Assert.InRange(rig.LastFrequencyHz(), SignalHz - 0.5, SignalHz + 0.5);
        StatusPayload status = rig.LastStatus();
        Assert.Equal(2, status.WrapsMended);
        Assert.Equal(1, status.ReadsDropped);
    }

    [Fact]
    public void Without_mending_a_straddled_read_is_refused_as_going_backwards()
    {
        // What the mending is for: the same -span read without it is refused by the count unwrapper (a count that went
        // back), and the +span one would be taken as 32767 extra pulses in one millisecond.
        var rig = new Rig(wrapSpan: 0);
        rig.Board.MisreadAt(2000, -32767);
        rig.Run(untilMicroseconds: 3_000_000, stepMicroseconds: 1000);
        Assert.Equal(1, rig.Loop.RejectedTicks);
    }

    [Fact]
    public void A_link_that_blocks_never_stops_the_readout_loop_and_the_frames_it_could_not_take_are_counted()
    {
        using var release = new ManualResetEventSlim(false);
        var port = new BlockingPort(release);
        var rig = new Rig(queueSlots: 8, port: port);
        using var stop = new CancellationTokenSource();
        var writer = new Thread(() =>
        {
            while (!stop.IsCancellationRequested)
            {
                if (!rig.Worker.RunOnce())
                {
                    Thread.Sleep(1);
                }
            }
        }) { IsBackground = true };
        writer.Start();

        rig.Run(untilMicroseconds: 3_000_000, stepMicroseconds: 1000);    // the writer thread is stuck in its first write meanwhile
        Assert.Equal(3000, rig.Loop.Reads);
        Assert.True(rig.Queue.FramesLost > 50, "lost: " + rig.Queue.FramesLost);
        Assert.True(rig.Loop.Gates >= 29);

        // Once the port lets go, the writer drains what is queued (wait for it: under load the thread may only just start).
        release.Set();
        var deadline = DateTime.UtcNow + TimeSpan.FromSeconds(30);
        while (rig.Queue.Queued > 0 && DateTime.UtcNow < deadline)
        {
            Thread.Sleep(5);
        }

        stop.Cancel();
        Assert.True(writer.Join(TimeSpan.FromSeconds(30)), "the writer thread did not finish");
        Assert.Equal(0, rig.Queue.Queued);
        Assert.True(port.Writes >= 1);
    }

    [Fact]
    public void New_signal_settings_from_the_pc_send_a_new_capture_header_the_settings_and_a_status()
    {
        var rig = new Rig();
        rig.Run(untilMicroseconds: 1_000_000, stepMicroseconds: 1000);
        Assert.True(rig.Loop.ApplySettingsText("# freqreadout settings 1\nsignal = beat\nbeat_side = below\nsearch_hz = 98000\n"));
        rig.Run(untilMicroseconds: 1_100_000, stepMicroseconds: 1000);

        var decoder = new LinkFrameDecoder();
        var frame = new LinkFrame();
        var reader = new LinkPayloadReader();
        var header = new CaptureHeaderPayload();
        var types = new List<int>();
        foreach (byte b in ((CollectingPort)rig.Port).Bytes.ToArray())
        {
            if (decoder.Push(b, frame))
            {
                types.Add(frame.FrameType);
                if (frame.FrameType == LinkFrameType.CaptureHeader)
                {
                    reader.Reset(frame.Payload, frame.PayloadLength);
                    Assert.True(header.TryRead(reader));
                }
            }
        }

        Assert.Equal(FreqReadout.Counting.SignalKind.Beat, header.Signal);    // the last header sent
        Assert.Equal(FreqReadout.Counting.BeatSide.Below, header.BeatSide);
        Assert.Equal(98000, header.SearchHz);
        int last = types.LastIndexOf(LinkFrameType.CaptureHeader);
        Assert.Equal(new[] { LinkFrameType.CaptureHeader, LinkFrameType.Settings, LinkFrameType.Status }, types.Skip(last).Take(3));
    }

    private sealed class BlockingPort : ILinkPort
    {
        private readonly ManualResetEventSlim _release;

        public BlockingPort(ManualResetEventSlim release)
        {
            _release = release;
        }

        public int Writes { get; private set; }

        public bool TryWrite(byte[] buffer, int offset, int count)
        {
            _release.Wait(TimeSpan.FromSeconds(60));
            Writes++;
            return true;
        }

        public bool TryRead(byte[] buffer, int offset, int count, out int read)
        {
            read = 0;
            return false;
        }
    }
}
