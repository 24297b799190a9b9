using System.Text.Json;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Commands;
using FreqReadout.Host.Recording;
using FreqReadout.Link;
using FreqReadout.Tests.Commands;

namespace FreqReadout.Tests.Link;

/// <summary>
/// The device loop streams a simulated pulse-counter capture over the link and <c>record</c> writes it: the recording
/// holds exactly the reads the device took, its trailer counts what was lost, and replaying it gives the same events as
/// replaying the source capture directly.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class DeviceToRecordingTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-link-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void Recording_holds_every_read_and_replays_to_the_same_events_as_the_source()
    {
        var device = new DeviceLinkHarness();
        device.RunAll(stepsPerDrain: 16);
        Assert.Equal(0, device.Queue.FramesLost);
        Assert.Equal(0, device.Worker.WriteFailures);

        string recording = Path.Combine(_dir, "field.csv");
        var view = new RecordingConsoleView(TextWriter.Null, TextWriter.Null, live: false);
        using var stop = new CancellationTokenSource();
        using var recorder = new LinkCaptureRecorder(recording, "test port", view);
        int exit = RecordCommand.Run(new BytesChannel(device.Port.Written(), 1000, stop), recorder, view, new RecordCommand.Settings(), null, stop.Token);
        Assert.Equal(ExitCodes.Ok, exit);
        Assert.Equal(new[] { recording }, recorder.Captures);

        using (ICaptureReader reader = CaptureFile.Open(recording))
        {
            Assert.Equal(CaptureKind.Snapshots, reader.Metadata.Kind);
            Assert.Equal(device.Metadata.ClockHz, reader.Metadata.ClockHz);
            Assert.Equal(64, reader.Metadata.TimerBits);
            var rows = reader.ReadRows().Select(r => (r.Tick, r.Count)).ToList();
            Assert.Equal(device.UnwrappedRows(), rows);
            var trailer = reader.Trailer.ToDictionary(p => p.Key, p => p.Value);
            Assert.Equal("stopped", trailer[RecordingTrailerKeys.ClosedBy]);
            Assert.Equal("0", trailer[RecordingTrailerKeys.LinkCrcErrors]);
            Assert.Equal("0", trailer[RecordingTrailerKeys.LinkMalformed]);
            Assert.Equal("0", trailer[RecordingTrailerKeys.LinkSequenceGaps]);
            Assert.Equal("0", trailer[RecordingTrailerKeys.LinkBadPayloads]);
            Assert.Equal(device.Queue.FramesQueued.ToString(), trailer[RecordingTrailerKeys.LinkFrames]);
            Assert.Equal(device.Settings.BootId.ToString(), trailer[RecordingTrailerKeys.DeviceBootId]);
            // The last status frame went out up to a second before the end: at most 1 s of reads after it.
            long reads = long.Parse(trailer[RecordingTrailerKeys.DeviceReads]);
            Assert.InRange(reads, device.Rows.Count - 1000, device.Rows.Count);
        }

        string source = Path.Combine(_dir, "source.csv");
        device.WriteSource(source);
        var fromSource = ReplayEvents(source);
        var fromRecording = ReplayEvents(recording);
        Assert.NotEmpty(fromSource);
        Assert.Equal(fromSource, fromRecording);
    }

    [Fact]
    public void The_stream_fits_the_serial_line_with_room_to_spare()
    {
        // A pty ignores the baud rate, so the link's bandwidth is a computed check: bytes the device sent per second of
        // capture (every read, reading, event, status and header, framed) against what 921600 baud carries with 8N1
        // framing (10 bits a byte on the wire: 92160 bytes/s).
        var device = new DeviceLinkHarness();
        device.RunAll(stepsPerDrain: 16);
        double seconds = device.UnwrappedRows()[^1].Tick / device.Metadata.ClockHz;
        double bytesPerSecond = device.Port.Written().Length / seconds;
        double readsPerSecond = device.Rows.Count / seconds;
        Assert.InRange(readsPerSecond, 990, 1010);           // the scene reads every 1 ms
        Assert.InRange(bytesPerSecond, 1000, 92160 * 0.25);   // under a quarter of the line: a slower baud or a busier scene still fits
    }

    [Fact]
    public void Damaged_bytes_lose_only_the_frames_they_hit_and_are_counted()
    {
        var device = new DeviceLinkHarness();
        device.RunAll(stepsPerDrain: 16);
        byte[] clean = device.Port.Written();
        var rng = new Random(20261203);
        var damaged = new List<byte>(clean.Length + 4096);
        int start = 0;
        int intact = 0;
        int hit = 0;
        for (int i = 0; i < clean.Length; i++)
        {
            if (clean[i] != 0)
            {
                continue;
            }

            var frame = clean.AsSpan(start, i - start + 1).ToArray();    // the frame and its delimiter
            bool first = start == 0;
            start = i + 1;
            double u = first ? 1 : rng.NextDouble();    // the first capture header stays whole (losing it is another test)
            if (u < 0.03)
            {
                int at = rng.Next(frame.Length - 1);
                frame[at] ^= (byte)(1 << rng.Next(8));    // a flipped bit (may even make a zero byte: the frame splits)
                hit++;
            }
            else if (u < 0.05)
            {
                int at = rng.Next(frame.Length - 1);
                frame = frame.Where((_, k) => k != at).ToArray();    // a dropped byte
                hit++;
            }
            else if (u < 0.07)
            {
                int at = rng.Next(frame.Length - 1);
                frame = frame.Take(at + 1).Concat(frame.Skip(at)).ToArray();    // a doubled byte
                hit++;
            }
            else
            {
                intact++;
            }

            damaged.AddRange(frame);
            if (rng.NextDouble() < 0.02)
            {
                var garbage = new byte[rng.Next(1, 300)];
                rng.NextBytes(garbage);
                damaged.AddRange(garbage);
                damaged.Add(0);
            }
        }

        string recording = Path.Combine(_dir, "damaged.csv");
        var view = new RecordingConsoleView(TextWriter.Null, TextWriter.Null, live: false);
        using var stop = new CancellationTokenSource();
        using var recorder = new LinkCaptureRecorder(recording, "test port", view);
        Assert.Equal(ExitCodes.Ok, RecordCommand.Run(new BytesChannel(damaged.ToArray(), 777, stop), recorder, view, new RecordCommand.Settings(), null, stop.Token));

        using ICaptureReader reader = CaptureFile.Open(recording);
        var source = device.UnwrappedRows().ToHashSet();
        var rows = reader.ReadRows().Select(r => (r.Tick, r.Count)).ToList();
        Assert.All(rows, r => Assert.Contains(r, source));
        Assert.True(rows.Count > source.Count * 0.85, $"{rows.Count} of {source.Count} rows kept");
        var trailer = reader.Trailer.ToDictionary(p => p.Key, p => long.Parse(p.Value == "stopped" ? "0" : p.Value));
        Assert.True(hit > 20, "frames hit: " + hit);
        // Every intact frame is delivered (the header that opened the capture is counted too) ...
        Assert.Equal(intact, trailer[RecordingTrailerKeys.LinkFrames]);
        // ... and every damaged one is missing by its sequence number and seen as a CRC failure or a malformed stretch.
        Assert.Equal(hit, trailer[RecordingTrailerKeys.LinkSequenceGaps]);
        Assert.True(trailer[RecordingTrailerKeys.LinkCrcErrors] + trailer[RecordingTrailerKeys.LinkMalformed] >= hit);
        Assert.Equal(0, trailer[RecordingTrailerKeys.LinkBadPayloads]);
    }

    [Fact]
    public void A_device_reset_closes_the_capture_and_the_next_boot_starts_a_new_one()
    {
        var first = new DeviceLinkHarness(bootId: 1);
        first.RunAll(stepsPerDrain: 16);
        var second = new DeviceLinkHarness(bootId: 2);
        second.RunAll(stepsPerDrain: 16);
        byte[] both = first.Port.Written().Concat(second.Port.Written()).ToArray();

        string recording = Path.Combine(_dir, "field.csv");
        var view = new RecordingConsoleView(TextWriter.Null, TextWriter.Null, live: false);
        using var stop = new CancellationTokenSource();
        using var recorder = new LinkCaptureRecorder(recording, "test port", view);
        Assert.Equal(ExitCodes.Ok, RecordCommand.Run(new BytesChannel(both, 4096, stop), recorder, view, new RecordCommand.Settings(), null, stop.Token));
        Assert.Equal(new[] { recording, Path.Combine(_dir, "field-2.csv") }, recorder.Captures);

        foreach ((string path, string closedBy, string boot) in new[] { (recording, LinkCaptureRecorder.DeviceReset, "1"), (Path.Combine(_dir, "field-2.csv"), "stopped", "2") })
        {
            using ICaptureReader reader = CaptureFile.Open(path);
            Assert.Equal(first.Rows.Count, reader.ReadRows().Count());
            var trailer = reader.Trailer.ToDictionary(p => p.Key, p => p.Value);
            Assert.Equal(closedBy, trailer[RecordingTrailerKeys.ClosedBy]);
            Assert.Equal(boot, trailer[RecordingTrailerKeys.DeviceBootId]);
            Assert.Equal("0", trailer[RecordingTrailerKeys.LinkSequenceGaps]);    // the restart's jump in numbers is not a loss
        }
    }

    [Fact]
    public void A_pulled_cable_keeps_every_row_received_and_says_so()
    {
        var device = new DeviceLinkHarness();
        device.RunAll(stepsPerDrain: 16);
        byte[] bytes = device.Port.Written();
        byte[] half = bytes.Take(bytes.Length / 2).ToArray();

        string recording = Path.Combine(_dir, "cut.csv");
        var view = new RecordingConsoleView(TextWriter.Null, TextWriter.Null, live: false);
        using var recorder = new LinkCaptureRecorder(recording, "test port", view);
        var (exit, _, error) = ConsoleCapture.Capture(() => RecordCommand.Run(new BytesChannel(half, 1000, stopAtEnd: null), recorder, view, new RecordCommand.Settings(), null, CancellationToken.None));
        Assert.Equal(ExitCodes.DataError, exit);
        Assert.Contains("the link was lost", error);
        Assert.Contains(recording, error);

        using ICaptureReader reader = CaptureFile.Open(recording);
        var rows = reader.ReadRows().Select(r => (r.Tick, r.Count)).ToList();
        Assert.Equal(device.UnwrappedRows().Take(rows.Count), rows);
        Assert.True(rows.Count > device.Rows.Count * 0.4, "rows kept: " + rows.Count);
        Assert.Equal("link lost", reader.Trailer.Single(p => p.Key == RecordingTrailerKeys.ClosedBy).Value);
    }

    [Fact]
    public void A_link_that_cannot_keep_up_drops_frames_without_stopping_the_loop_and_every_loss_is_counted()
    {
        // The writer thread runs only every 700 reads, so the 8-slot queue overflows: frames are dropped, never waited for.
        var device = new DeviceLinkHarness(queueSlots: 8);
        device.RunAll(stepsPerDrain: 700);
        Assert.True(device.Queue.FramesLost > 100, "lost: " + device.Queue.FramesLost);
        Assert.Equal(device.Rows.Count, device.Loop.Reads);    // the loop read everything regardless

        string recording = Path.Combine(_dir, "lossy.csv");
        var view = new RecordingConsoleView(TextWriter.Null, TextWriter.Null, live: false);
        using var stop = new CancellationTokenSource();
        using var recorder = new LinkCaptureRecorder(recording, "test port", view);
        Assert.Equal(ExitCodes.Ok, RecordCommand.Run(new BytesChannel(device.Port.Written(), 1000, stop), recorder, view, new RecordCommand.Settings(), null, stop.Token));

        using ICaptureReader reader = CaptureFile.Open(recording);
        var source = device.UnwrappedRows().ToHashSet();
        Assert.All(reader.ReadRows(), r => Assert.Contains((r.Tick, r.Count), source));
        var trailer = reader.Trailer.ToDictionary(p => p.Key, p => p.Value);
        // The PC sees each dropped frame as a sequence gap where it happened (after the header that opened the capture) ...
        Assert.Equal(device.Queue.FramesLost.ToString(), trailer[RecordingTrailerKeys.LinkSequenceGaps]);
        // ... and the device's last status that got through counts its own drops up to then.
        long deviceLost = long.Parse(trailer[RecordingTrailerKeys.DeviceFramesLost]);
        Assert.InRange(deviceLost, 1, device.Queue.FramesLost);
    }

    /// <summary>The events of <c>replay --json</c> on a capture: start, end, peak shift and class, as text to compare.</summary>
    internal static List<string> ReplayEvents(string capture)
    {
        var (exit, output, error) = ConsoleCapture.RunMain("replay", capture, "--json");
        Assert.True(exit == 0, error);
        using var json = JsonDocument.Parse(output);
        return json.RootElement.GetProperty("events").EnumerateArray()
            .Select(e => $"{e.GetProperty("start_s").GetDouble():R} {e.GetProperty("end_s").GetDouble():R} {e.GetProperty("peak_shift_hz").GetDouble():R} {e.GetProperty("class").GetString()}")
            .ToList();
    }
}
