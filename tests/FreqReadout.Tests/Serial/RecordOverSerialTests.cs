using FreqReadout.Host.Captures;
using FreqReadout.Host.Commands;
using FreqReadout.Host.Recording;
using FreqReadout.Settings;
using FreqReadout.Tests.Commands;
using FreqReadout.Tests.Link;

namespace FreqReadout.Tests.Serial;

/// <summary>
/// End to end through a real serial pair: the device loop (the net10.0 build of the firmware's portable sources) streams
/// a simulated pulse-counter capture into the master side of a pseudo-terminal, and <c>record</c> reads the slave side
/// with System.IO.Ports. A pty ignores the baud rate; the link's bandwidth is checked by computation in
/// <see cref="DeviceToRecordingTests"/>.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class RecordOverSerialTests : IDisposable
{
    private static readonly TimeSpan Deadline = TimeSpan.FromSeconds(90);    // a hang guard, not a timing

    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-serial-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [PseudoTerminalFact]
    public void Record_over_a_serial_line_equals_what_the_device_sent_and_replays_to_the_same_events()
    {
        using var pty = new PseudoTerminalPair();
        var device = new DeviceLinkHarness(port: new PseudoTerminalLinkPort(pty));
        string recording = Path.Combine(_dir, "serial.csv");
        using var stop = new CancellationTokenSource();
        var view = new RecordingConsoleView(TextWriter.Null, TextWriter.Null, live: false);
        using var recorder = new LinkCaptureRecorder(recording, pty.SlavePath, view);
        using var channel = new SerialLinkChannel(pty.SlavePath, 921600);
        Task<int> record = Task.Run(() => RecordCommand.Run(channel, recorder, view, new RecordCommand.Settings(), null, stop.Token));
        Task deviceRun = Task.Run(() => device.RunAll(stepsPerDrain: 16));

        Assert.True(deviceRun.Wait(Deadline), "the device loop did not finish");
        var clock = System.Diagnostics.Stopwatch.StartNew();
        while (recorder.RowsWritten < device.Rows.Count && clock.Elapsed < Deadline && !record.IsCompleted)
        {
            Thread.Sleep(20);
        }

        stop.Cancel();
        Assert.True(record.Wait(Deadline), "record did not stop");
        Assert.Equal(ExitCodes.Ok, record.Result);
        Assert.Equal(0, device.Queue.FramesLost);

        using (ICaptureReader reader = CaptureFile.Open(recording))
        {
            Assert.Equal(device.UnwrappedRows(), reader.ReadRows().Select(r => (r.Tick, r.Count)).ToList());
            var trailer = reader.Trailer.ToDictionary(p => p.Key, p => p.Value);
            Assert.Equal("0", trailer[RecordingTrailerKeys.LinkCrcErrors]);
            Assert.Equal("0", trailer[RecordingTrailerKeys.LinkSequenceGaps]);
            Assert.Equal(device.Worker.FramesSent.ToString(), trailer[RecordingTrailerKeys.LinkFrames]);
        }

        string source = Path.Combine(_dir, "source.csv");
        device.WriteSource(source);
        Assert.Equal(DeviceToRecordingTests.ReplayEvents(source), DeviceToRecordingTests.ReplayEvents(recording));
    }

    [PseudoTerminalFact]
    public void Settings_sent_by_record_reach_the_device_loop_and_come_back_in_its_status()
    {
        using var pty = new PseudoTerminalPair();
        var device = new DeviceLinkHarness(port: new PseudoTerminalLinkPort(pty));
        string file = Path.Combine(_dir, "field.settings");
        File.WriteAllText(file, "# freqreadout settings 1\n# invented example\ngate_s = 0.2\nthreshold_sigma = 6.5\npolarity = inverted\nread_rate_hz = 500\nstall_ms = 40\n");
        using var stop = new CancellationTokenSource();
        Task deviceRun = Task.Run(() =>
        {
            try
            {
                while (!stop.IsCancellationRequested && device.RunSome(steps: 16))
                {
                }
            }
            catch (ObjectDisposedException)
            {
                // The pty was closed under a write the PC no longer reads: the device's writer was waiting on a full line.
            }
        });

        var settings = new RecordCommand.Settings { Port = pty.SlavePath, SendSettings = file };
        var (exit, _, error) = ConsoleCapture.Capture(() => new RecordCommand().Execute(null!, settings, CancellationToken.None));
        stop.Cancel();
        pty.Dispose();    // nobody reads the line any more: release a device write that waits for room
        Assert.True(deviceRun.Wait(Deadline), "the device loop did not stop");
        Assert.True(exit == ExitCodes.Ok, error);
        Assert.Contains("the device took the settings", error);

        Assert.Equal(0.2, device.Settings.Counter.GateSeconds);
        Assert.Equal(6.5, device.Settings.Readout.ThresholdSigma);
        Assert.Equal(FreqReadout.Detection.Polarity.Inverted, device.Settings.Readout.Polarity);
        Assert.Equal(500, device.Settings.ReadRateHz);
        Assert.Equal(40, device.Settings.StallLimitMilliseconds);
        Assert.Equal(0, device.Settings.SettingsProblems);
        var back = new DeviceSettingsValues();
        Assert.True(DeviceSettingsParser.TryParse(device.Settings.SettingsText, back, null));
        Assert.Equal(0.2, back.GateSeconds);
        Assert.True(device.Loop.TryTakeSettingsToStore(out string stored));
        Assert.Equal(device.Settings.SettingsText, stored);
    }

    [PseudoTerminalFact]
    public void A_device_whose_link_is_off_is_asked_why_it_is_silent_and_record_says_what_to_change()
    {
        using var pty = new PseudoTerminalPair();
        var device = new DeviceLinkHarness(port: new PseudoTerminalLinkPort(pty), link: LinkMode.Off);
        using var stop = new CancellationTokenSource();
        Task deviceRun = Task.Run(() =>
        {
            try
            {
                while (!stop.IsCancellationRequested && device.RunSome(steps: 16))
                {
                    Thread.Sleep(1);    // about 16 reads a millisecond: the rows last the few seconds record listens
                }
            }
            catch (ObjectDisposedException)
            {
            }
        });

        string output = Path.Combine(_dir, "silent.csv");
        var (exit, _, error) = ConsoleCapture.RunMain("record", "--port", pty.SlavePath, "--out", output, "--seconds", "4");
        stop.Cancel();
        pty.Dispose();
        Assert.True(deviceRun.Wait(Deadline), "the device loop did not stop");
        Assert.True(exit == ExitCodes.Ok, error);
        Assert.True(error.Contains("the device's link setting is off, so it streams nothing: send settings with link = capture"), error);
        Assert.False(File.Exists(output));
    }
}
