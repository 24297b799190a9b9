using System.ComponentModel;
using System.Globalization;
using FreqReadout.Host.Output;
using FreqReadout.Host.Recording;
using FreqReadout.Link;
using FreqReadout.Settings;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout record --port DEV [--baud N] --out CAPTURE [--live] [--seconds S] [--send-settings FILE]</c> and
/// <c>freqreadout record --list</c>: records what the device streams over its serial link (docs/link-protocol.md)
/// into a capture written in place (docs/output-files.md, rule 6), until Ctrl+C, <c>--seconds</c>, or a lost link;
/// a device reset closes one capture and starts the next. The trailer counts what the link and the device lost.
/// </summary>
public sealed class RecordCommand : Command<RecordCommand.Settings>
{
    /// <summary>How long <c>--send-settings</c> waits for the status frame that confirms them.</summary>
    public static readonly TimeSpan ConfirmTimeout = TimeSpan.FromSeconds(5);

    public sealed class Settings : CommandSettings
    {
        [CommandOption("--port <DEV>")]
        [Description("Serial port of the device: /dev/ttyUSB0, /dev/ttyACM0 (Linux), COM3 (Windows)... `--list` lists them. Required (but for --list).")]
        public string? Port { get; set; }

        [CommandOption("--baud <N>")]
        [Description("Bits a second on the serial line, as the firmware sets it: an integer in [[1200, 4000000]]. Default 921600.")]
        public int? Baud { get; set; }

        [CommandOption("--out <CAPTURE>")]
        [Description("Capture to write (text format). Written in place as rows arrive; an existing file is refused. After a device reset the next capture is CAPTURE-2, -3... beside it. Required unless --send-settings only sends settings.")]
        [FilePath]
        public string? Out { get; set; }

        [CommandOption("--live")]
        [Description("Show frequency, shift, state and class on standard output while recording (two lines a second, plus every change and every event).")]
        public bool Live { get; set; }

        [CommandOption("--seconds <S>")]
        [Description("Stop after this many seconds, (0, 1e7]]. Default: until Ctrl+C or the link is lost.")]
        public double? Seconds { get; set; }

        [CommandOption("--send-settings <FILE>")]
        [Description("Send this settings file (docs/settings-format.md) to the device first and show the status frame that confirms it; without --out, only that. Default: none, the device keeps its settings.")]
        [FilePath]
        public string? SendSettings { get; set; }

        [CommandOption("--list")]
        [Description("List the serial ports of this machine and exit.")]
        public bool List { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        if (settings.List)
        {
            IReadOnlyList<string> names = SerialLinkChannel.PortNames();
            if (names.Count == 0)
            {
                Console.Error.WriteLine("record: no serial ports found (a USB-UART adapter shows up as /dev/ttyUSB* or /dev/ttyACM* on Linux, COMn on Windows)");
            }

            foreach (string name in names)
            {
                Console.Out.WriteLine(name);
            }

            return ExitCodes.Ok;
        }

        if (settings.Port == null)
        {
            return CommandOutput.Fail("--port is required (or --list to see the serial ports)", CommandOutput.BadOption);
        }

        if (settings.Out == null && settings.SendSettings == null)
        {
            return CommandOutput.Fail("--out is required (the capture to write), or --send-settings to only send settings", CommandOutput.BadOption);
        }

        int baud = settings.Baud ?? 921600;
        if (baud < 1200 || baud > 4_000_000)
        {
            return CommandOutput.Fail($"--baud must be an integer in [1200, 4000000], got {baud.ToString(CultureInfo.InvariantCulture)}", CommandOutput.BadOption);
        }

        if (settings.Seconds is double s && !(s > 0 && s <= 1e7))
        {
            return CommandOutput.Fail($"--seconds must be in (0, 1e7], got {s.ToString("R", CultureInfo.InvariantCulture)}", CommandOutput.BadOption);
        }

        string? settingsText = null;
        if (settings.SendSettings != null && !TryReadSettings(settings.SendSettings, out settingsText, out int code))
        {
            return code;
        }

        if (settings.Out != null && !CheckNewFile(settings.Out, out int outCode))
        {
            return outCode;
        }

        SerialLinkChannel channel;
        try
        {
            channel = new SerialLinkChannel(settings.Port, baud);
        }
        catch (LinkChannelException e)
        {
            return CommandOutput.Fail(e.Message, CommandOutput.BadInput);
        }

        using (channel)
        {
            if (settings.Out != null)
            {
                Console.Error.WriteLine("record: caution: a readout that shows nothing is not proof that no live wiring, pipe or utility is there; verify before drilling or digging and follow local codes (hardware-notes/safety.md)");
            }

            var view = new RecordingConsoleView(Console.Out, Console.Error, settings.Live);
            using var recorder = settings.Out != null ? new LinkCaptureRecorder(settings.Out, settings.Port, view) : null;
            return Run(channel, recorder, view, settings, settingsText, cancellationToken);
        }
    }

    /// <summary>The recording itself, over any channel (the command's serial port; tests give others).</summary>
    internal static int Run(ILinkChannel channel, LinkCaptureRecorder? recorder, RecordingConsoleView view, Settings settings, string? settingsText, CancellationToken cancellationToken)
    {
        var session = new RecordSession(channel, recorder);
        try
        {
            if (settingsText != null)
            {
                if (!session.TrySendSettings(settingsText, ConfirmTimeout, cancellationToken))
                {
                    Console.Error.WriteLine(session.HasStatus
                        ? $"error: the device did not confirm the settings within {ConfirmTimeout.TotalSeconds:0} s: its status reports settings check 0x{session.LastStatus.SettingsCheck:X8}, the file's is 0x{session.SentSettingsCheck:X8} (it may have refused them; its settings frame shows what is in force)"
                        : $"error: no status frame from the device within {ConfirmTimeout.TotalSeconds:0} s ({session.BytesReceived.ToString(CultureInfo.InvariantCulture)} bytes received): check the port, the baud rate and that the firmware streams");
                    recorder?.Close("settings not confirmed", session.Decoder);
                    return ExitCodes.DataError;
                }

                Console.Error.WriteLine($"record: the device took the settings (status: settings check 0x{session.LastStatus.SettingsCheck:X8}, {session.LastStatus.SettingsProblems} problems, boot id {session.LastStatus.BootId})");
                if (recorder == null)
                {
                    return ExitCodes.Ok;
                }
            }

            TimeSpan? limit = settings.Seconds is double seconds ? TimeSpan.FromSeconds(seconds) : null;
            string why = session.Run(limit, cancellationToken);
            recorder!.Close(why, session.Decoder);
            Summary(session, recorder);
            return ExitCodes.Ok;
        }
        catch (OutputFileException e)
        {
            return CommandOutput.Fail(e.Message, e.ExitCode);
        }
        catch (IOException e)
        {
            recorder?.Close("link lost", session.Decoder);
            Console.Error.WriteLine($"error: the link was lost ({e.Message.TrimEnd('.')}); everything received is kept" + (recorder != null ? $" in {string.Join(", ", recorder.Captures)}" : string.Empty));
            return ExitCodes.DataError;
        }
    }

    private static void Summary(RecordSession session, LinkCaptureRecorder recorder)
    {
        LinkFrameDecoder d = session.Decoder;
        Console.Error.WriteLine(
            $"record: {recorder.RowsWritten.ToString(CultureInfo.InvariantCulture)} rows in {recorder.Captures.Count} capture(s); " +
            $"link: {d.Frames} frames, {d.CrcErrors} CRC errors, {d.Malformed} malformed, {d.SequenceGaps} missing" +
            (recorder.RowsBeforeHeader > 0 ? $"; {recorder.RowsBeforeHeader} rows came before any capture header and are not recorded" : string.Empty));
        // The device's link setting, read from the settings text it sent with the same parser it uses.
        var inForce = new DeviceSettingsValues();
        LinkMode? link = recorder.LastSettingsText is string sent && DeviceSettingsParser.TryParse(sent, inForce, null) ? inForce.LinkMode : null;
        if (recorder.Captures.Count == 0)
        {
            Console.Error.WriteLine(link == LinkMode.Off
                ? "record: the device's link setting is off, so it streams nothing: send settings with link = capture (record --port DEV --send-settings FILE)"
                : $"record: no capture header arrived ({session.BytesReceived.ToString(CultureInfo.InvariantCulture)} bytes received), so nothing was written: check the port, the baud rate and that the firmware streams");
        }
        else if (recorder.RowsWritten == 0 && link == LinkMode.Readings)
        {
            Console.Error.WriteLine("record: the device's link setting is readings: it sends readings and events but not the reads a capture holds; send settings with link = capture");
        }
    }

    private static bool TryReadSettings(string path, out string? text, out int code)
    {
        text = null;
        code = ExitCodes.Ok;
        try
        {
            text = File.ReadAllText(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            code = CommandOutput.Fail($"--send-settings {path}: {FileErrorText.Reason(path, e)}", CommandOutput.BadInput);
            return false;
        }

        // Checked with the same shared code the device uses; a file with any problem is not sent (the device would
        // put defaults in place of the bad values, which is not what the file asks for).
        var values = new DeviceSettingsValues();
        var problems = new SettingsProblemList();
        bool recognised = DeviceSettingsParser.TryParse(text, values, problems);
        if (!recognised || problems.TotalCount > 0)
        {
            for (int i = 0; i < problems.Count; i++)
            {
                SettingsProblem p = problems.Get(i);
                Console.Error.WriteLine($"error: {path}" + (p.LineNumber > 0 ? $":{p.LineNumber}" : string.Empty) + ": " + (string.IsNullOrEmpty(p.Key) ? string.Empty : p.Key + ": ") + p.Message);
            }

            code = CommandOutput.Fail($"--send-settings {path}: {problems.TotalCount} problem(s); nothing was sent (docs/settings-format.md)", CommandOutput.BadInput);
            return false;
        }

        if (!DeviceSettingsFormatter.TryFormat(values, out string canonical, out string error))
        {
            code = CommandOutput.Fail($"--send-settings {path}: {error}", CommandOutput.BadInput);
            return false;
        }

        text = canonical;    // the device answers with the check of this canonical text
        return true;
    }

    private static bool CheckNewFile(string path, out int code)
    {
        code = ExitCodes.Ok;
        string full = Path.GetFullPath(path);
        string? folder = Path.GetDirectoryName(full);
        if (folder != null && !Directory.Exists(folder))
        {
            code = CommandOutput.Fail($"--out {path}: the folder {folder} does not exist", CommandOutput.BadInput);
            return false;
        }

        if (File.Exists(full) || Directory.Exists(full))
        {
            code = CommandOutput.Fail($"--out {path}: it exists; a recording never overwrites a file (choose a new name)", CommandOutput.BadInput);
            return false;
        }

        return true;
    }
}
