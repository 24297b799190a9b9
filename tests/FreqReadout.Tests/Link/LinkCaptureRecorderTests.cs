using FreqReadout.Host.Captures;
using FreqReadout.Host.Commands;
using FreqReadout.Host.Recording;
using FreqReadout.Link;

namespace FreqReadout.Tests.Link;

/// <summary>
/// The recorder's rules on hand-made frame streams (invented values): a capture file is created with its first row,
/// never for a header alone; rows before any header are counted and a header is asked for; a status of another boot
/// closes the capture.
/// </summary>
public sealed class LinkCaptureRecorderTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-recorder-").FullName;
    private readonly LinkFrameEncoder _encoder = new();
    private readonly List<byte> _stream = new();

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private void Frame(int type, Action<LinkPayloadWriter> write)
    {
        var payload = new LinkPayloadWriter();
        write(payload);
        var wire = new byte[LinkFrameEncoder.MaxWireBytes];
        Assert.True(_encoder.TryEncode(type, payload.Buffer, 0, payload.Length, wire, 0, out int n));
        _stream.AddRange(wire.Take(n));
    }

    private void Header(uint boot) => Frame(LinkFrameType.CaptureHeader, new CaptureHeaderPayload { BootId = boot, Snapshots = true, ClockHz = 1e6 }.Write);

    private void Rows(long firstTick, int rows)
    {
        var batch = new SnapshotBatchPayload();
        for (int i = 0; i < rows; i++)
        {
            Assert.True(batch.TryAdd(firstTick + (i * 1000), (firstTick / 10) + (i * 100)));
        }

        Frame(LinkFrameType.SnapshotBatch, batch.Write);
    }

    private LinkCaptureRecorder Record(string name)
    {
        var view = new RecordingConsoleView(TextWriter.Null, TextWriter.Null, live: false);
        using var stop = new CancellationTokenSource();
        var recorder = new LinkCaptureRecorder(Path.Combine(_dir, name), "test", view);
        Assert.Equal(ExitCodes.Ok, RecordCommand.Run(new BytesChannel(_stream.ToArray(), 100, stop), recorder, view, new RecordCommand.Settings(), null, stop.Token));
        return recorder;
    }

    [Fact]
    public void A_header_without_rows_leaves_no_file()
    {
        Header(1);
        Frame(LinkFrameType.Status, new StatusPayload { BootId = 1 }.Write);
        using LinkCaptureRecorder recorder = Record("empty.csv");
        Assert.Empty(recorder.Captures);
        Assert.False(File.Exists(Path.Combine(_dir, "empty.csv")));
    }

    [Fact]
    public void Rows_before_the_first_header_are_counted_and_the_capture_starts_with_the_rows_after_it()
    {
        Rows(0, 10);    // the PC started listening mid-stream
        Header(1);
        Rows(10_000, 20);
        using LinkCaptureRecorder recorder = Record("late.csv");
        Assert.Equal(10, recorder.RowsBeforeHeader);
        using ICaptureReader reader = CaptureFile.Open(Path.Combine(_dir, "late.csv"));
        Assert.Equal(20, reader.ReadRows().Count());
        var trailer = reader.Trailer.ToDictionary(p => p.Key, p => p.Value);
        Assert.Equal("10", trailer[RecordingTrailerKeys.RowsBeforeHeader]);
        Assert.Equal("2", trailer[RecordingTrailerKeys.LinkFrames]);    // the header and the batch after it
    }

    [Fact]
    public void A_status_of_another_boot_closes_the_capture_as_a_device_reset()
    {
        Header(1);
        Rows(0, 5);
        Frame(LinkFrameType.Status, new StatusPayload { BootId = 2 }.Write);
        using LinkCaptureRecorder recorder = Record("reset.csv");
        Assert.Single(recorder.Captures);
        using ICaptureReader reader = CaptureFile.Open(Path.Combine(_dir, "reset.csv"));
        Assert.Equal(5, reader.ReadRows().Count());
        Assert.Equal(LinkCaptureRecorder.DeviceReset, reader.Trailer.Single(p => p.Key == RecordingTrailerKeys.ClosedBy).Value);
        Assert.True(recorder.HeaderWanted);    // the restarted device's header is asked for
    }
}
