using System.ComponentModel;
using System.Globalization;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Import;
using FreqReadout.Host.Output;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout import vcd &lt;file&gt; --signal NAME --out CAPTURE</c>: the rising edges of one signal of a logic
/// analyser's value change dump become an edge capture whose clock is the analyser's real sample period (the greatest
/// common divisor of the dump's time stamps, <see cref="VcdEdgeReader"/>), so that the counters' predicted error is
/// honest. The file is read twice, streaming; the capture is written through <see cref="OutputFileSet"/>.
/// </summary>
public sealed class ImportVcdCommand : Command<ImportVcdCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
        [CommandArgument(0, "<file>")]
        [Description("The value change dump (.vcd) to read (IEEE 1364 clause 18).")]
        [FilePath]
        public string Input { get; set; } = string.Empty;

        [CommandOption("--signal <NAME>")]
        [Description("The signal whose rising edges become the capture: its full name (top.probe.clk) or a short name that is unique (clk); a bit of a vector as data[[3]]. Required.")]
        public string? Signal { get; set; }

        [CommandOption("--out <CAPTURE>")]
        [Description("The capture to write (text; an existing file is replaced only when the import succeeds). Required.")]
        [FilePath]
        public string? Out { get; set; }

        [CommandOption("--json")]
        [Description("Also print what was imported as one JSON object on standard output (keys in docs/json-output.md).")]
        public bool Json { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        if (settings.Signal == null || settings.Out == null)
        {
            return CommandOutput.Fail("import vcd needs --signal NAME and --out CAPTURE", CommandOutput.BadOption);
        }

        using var outputs = new OutputFileSet();
        outputs.AddInput("the dump", settings.Input);
        OutputFile output = outputs.AddOutput("--out", settings.Out, "the capture");
        if (!outputs.TryPrepare(out OutputFileException? problem))
        {
            return CommandOutput.Fail(problem!.Message, problem.ExitCode);
        }

        try
        {
            VcdEdgeReader reader = VcdEdgeReader.Open(settings.Input, settings.Signal);
            double periodSeconds = 1 / reader.ClockHz;
            var metadata = new CaptureMetadata
            {
                ClockHz = reader.ClockHz,
                Kind = CaptureKind.Edges,
                TimerBits = 64,
                Note = $"imported from {Path.GetFileName(settings.Input)}, signal {reader.Variable.FullName}" + (reader.Variable.Width > 1 ? $"[{reader.Bit}]" : string.Empty)
                    + $", analyser sample period {periodSeconds.ToString("G6", CultureInfo.InvariantCulture)} s",
            };
            long edges = 0;
            long sameStamp = 0;
            long last = -1;
            using (ICaptureWriter writer = CaptureFile.Create(output.Stream, metadata, CaptureFileFormat.Text))
            {
                foreach (long tick in reader.RisingEdgeTicks())
                {
                    cancellationToken.ThrowIfCancellationRequested();
                    if (tick <= last)
                    {
                        sameStamp++;    // a rise, fall and rise within one sample: one edge is all the dump can show
                        continue;
                    }

                    writer.WriteRow(new CaptureRow(0, (ulong)tick, 0, null, null));
                    last = tick;
                    edges++;
                }

                writer.Complete(Array.Empty<KeyValuePair<string, string>>());
            }

            if (edges < 2)
            {
                return CommandOutput.Fail($"{settings.Input}: {reader.Variable.FullName} has {edges} rising edge(s); a capture needs at least 2", CommandOutput.BadInput);
            }

            outputs.Commit();
            if (settings.Json)
            {
                Console.Out.WriteLine(ToJson(settings, reader, edges, sameStamp));
            }

            CommandOutput.Diagnostic($"import: wrote {settings.Out}: {edges} rising edges of {reader.Variable.FullName}, clock {reader.ClockHz.ToString("G9", CultureInfo.InvariantCulture)} Hz (the analyser's sample period: frequencies are only as good as its clock)"
                + (sameStamp > 0 ? $"; {sameStamp} edges fell on the time stamp of the one before and were dropped" : string.Empty));
            return ExitCodes.Ok;
        }
        catch (VcdFormatException e)
        {
            return CommandOutput.Fail(e.Message, CommandOutput.BadInput);
        }
        catch (OutputFileException e)
        {
            return CommandOutput.Fail(e.Message, e.ExitCode);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            return CommandOutput.Fail($"{settings.Input}: {FileErrorText.Reason(settings.Input, e)}", CommandOutput.BadInput);
        }
    }

    /// <summary>The summary of <c>--json</c> (docs/json-output.md, keys: import vcd).</summary>
    private static string ToJson(Settings settings, VcdEdgeReader reader, long edges, long sameStamp)
    {
        return JsonValues.Document(w =>
        {
            w.WriteStartObject();
            w.WriteString("input", settings.Input);
            w.WriteString("out", settings.Out);
            w.WriteString("signal", reader.Variable.FullName);
            w.WriteNumber("width", reader.Variable.Width);
            if (reader.Variable.Width > 1)
            {
                w.WriteNumber("bit", reader.Bit);
            }
            else
            {
                w.WriteNull("bit");
            }

            w.WriteNumber("clock_hz", reader.ClockHz);
            w.WriteNumber("edges", edges);
            w.WriteNumber("same_stamp_dropped", sameStamp);
            w.WriteEndObject();
        });
    }
}
