using System.ComponentModel;
using System.Globalization;
using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout convert &lt;in&gt; &lt;out&gt; [--to text|binary] [--from-s X] [--to-s Y]</c>: rewrites a
/// capture in the other format (or the one given), losslessly: metadata, comments, columns, rows
/// and trailer as they were. With a time range, keeps only the rows whose time from the first row
/// lies in [from, to] (raw values unchanged) and notes the range in a header comment; <c>started_utc</c> moves
/// with the start of the range (to the nearest second, the key's resolution), and the last temperature sample
/// before the range is carried into the first kept row, so the trimmed capture reads as the original did there.
/// </summary>
public sealed class ConvertCommand : Command<ConvertCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
        [CommandArgument(0, "<in>")]
        [Description("Capture to read, text or binary (picked by content); - reads it from standard input.")]
        [FilePath(StandardInput = true)]
        public string Input { get; set; } = string.Empty;

        [CommandArgument(1, "<out>")]
        [Description("Capture to write (overwritten).")]
        [FilePath]
        public string Output { get; set; } = string.Empty;

        [CommandOption("--to <FORMAT>")]
        [Description("text or binary. Default: the other format than the input's.")]
        public string? To { get; set; }

        [CommandOption("--from-s <SECONDS>")]
        [Description("Keep rows from this time on, seconds from the first row, [[0, 1e9]].")]
        public string? FromSeconds { get; set; }

        [CommandOption("--to-s <SECONDS>")]
        [Description("Keep rows up to this time, seconds from the first row, (--from-s, 1e9]].")]
        public string? ToSeconds { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        CaptureFileFormat? to = null;
        if (settings.To == "text")
        {
            to = CaptureFileFormat.Text;
        }
        else if (settings.To == "binary")
        {
            to = CaptureFileFormat.Binary;
        }
        else if (settings.To != null)
        {
            return CommandOutput.Fail($"--to must be text or binary, got {OptionValues.Quote(settings.To)}", CommandOutput.BadOption);
        }

        double from = 0;
        double until = double.PositiveInfinity;
        if (settings.FromSeconds != null && (!OptionValues.TryNumber(settings.FromSeconds, out from) || !(from >= 0 && from <= MaxSeconds)))
        {
            return CommandOutput.Fail($"--from-s must be a number of seconds from the first row in [0, 1e9], got {OptionValues.Quote(settings.FromSeconds)}", CommandOutput.BadOption);
        }

        if (settings.ToSeconds != null && (!OptionValues.TryNumber(settings.ToSeconds, out until) || !(until > from && until <= MaxSeconds)))
        {
            return CommandOutput.Fail($"--to-s must be a number of seconds from the first row greater than --from-s ({Num(from)} s) and at most 1e9, got {OptionValues.Quote(settings.ToSeconds)}", CommandOutput.BadOption);
        }

        if (!StandardStreams.IsInput(settings.Input) && Path.GetFullPath(settings.Input) == Path.GetFullPath(settings.Output))
        {
            return CommandOutput.Fail("<out> must be another file than <in>", CommandOutput.BadOption);
        }

        int openExit = CommandOutput.TryOpenCapture(settings.Input, out ICaptureReader? opened);
        if (opened == null)
        {
            return openExit;
        }

        ICaptureReader reader = opened;
        using (reader)
        {
            var inputFormat = CommandOutput.FormatOf(reader);
            var outputFormat = to ?? (inputFormat == CaptureFileFormat.Text ? CaptureFileFormat.Binary : CaptureFileFormat.Text);
            bool trim = settings.FromSeconds != null || settings.ToSeconds != null;
            if (trim)
            {
                string shifted = string.Empty;
                if (from > 0 && reader.Metadata.StartedUtc is DateTimeOffset started)
                {
                    // Time 0 of the trimmed capture is its first row, about --from-s into the original.
                    long seconds = (long)Math.Round(from, MidpointRounding.AwayFromZero);
                    reader.Metadata.StartedUtc = started.AddSeconds(seconds);
                    shifted = string.Format(CultureInfo.InvariantCulture, "; started_utc moved {0} s later (was {1})", seconds, started.ToUniversalTime().ToString(CaptureMetadataParser.StartedUtcFormat, CultureInfo.InvariantCulture));
                }

                reader.Metadata.HeaderLines.Add(CaptureHeaderLine.ForComment(string.Format(
                    CultureInfo.InvariantCulture,
                    " trimmed by freqreadout convert to rows from {0} s to {1} s after the first row of {2}{3}",
                    Num(from),
                    settings.ToSeconds != null ? Num(until) : "the end",
                    StandardStreams.IsInput(settings.Input) ? "standard input" : Path.GetFileName(settings.Input),
                    shifted)));
            }

            long kept = 0;
            long read = 0;
            try
            {
                using (var writer = CaptureFile.Create(settings.Output, reader.Metadata, outputFormat))
                {
                    var unwrapper = new TimerUnwrapper(reader.Metadata.TimerBits);
                    double clockHz = reader.Metadata.ClockHz;
                    double? carriedTemperature = null;
                    foreach (var row in reader.ReadRows())
                    {
                        cancellationToken.ThrowIfCancellationRequested();
                        read++;
                        CaptureRow kept1 = row;
                        if (trim)
                        {
                            // A rejected step keeps the last good time (the row stays with its neighbours).
                            unwrapper.TryUnwrap(row.Tick, out long tick);
                            double seconds = tick / clockHz;
                            if (seconds < from)
                            {
                                carriedTemperature = row.TemperatureC ?? carriedTemperature;
                                continue;
                            }

                            if (seconds > until)
                            {
                                continue;
                            }

                            if (kept == 0 && row.TemperatureC == null && carriedTemperature != null)
                            {
                                // The sample in force at the cut, so the first kept row knows the temperature.
                                kept1 = row with { TemperatureC = carriedTemperature };
                            }
                        }

                        writer.WriteRow(kept1);
                        kept++;
                    }

                    writer.Complete(reader.Trailer);
                }
            }
            catch (CaptureFormatException e)
            {
                TryDelete(settings.Output);
                return CommandOutput.Fail($"{e.Message} (nothing written: {settings.Output} removed)", CommandOutput.BadInput);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                TryDelete(settings.Output);
                return CommandOutput.Fail($"{settings.Output}: cannot write the capture: {FileErrorText.Reason(settings.Output, e)}", CommandOutput.BadInput);
            }

            foreach (string warning in reader.Warnings)
            {
                CommandOutput.Diagnostic("warning: " + warning);
            }

            if (trim && kept == 0 && read > 0)
            {
                CommandOutput.Diagnostic($"warning: no row lies in the range from {Num(from)} s to {(settings.ToSeconds != null ? Num(until) + " s" : "the end")} (--from-s, --to-s): {settings.Output} holds the header only");
            }

            CommandOutput.Diagnostic($"{settings.Output}: {(outputFormat == CaptureFileFormat.Binary ? "binary" : "text")} capture, {kept} of {read} rows");
            return 0;
        }
    }

    private static void TryDelete(string path)
    {
        try
        {
            File.Delete(path);
        }
        catch (IOException)
        {
        }
        catch (UnauthorizedAccessException)
        {
        }
    }

    /// <summary>Largest --from-s / --to-s, seconds (about 32 years).</summary>
    private const double MaxSeconds = 1e9;

    private static string Num(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
