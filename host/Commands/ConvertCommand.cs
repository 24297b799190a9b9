using System.ComponentModel;
using System.Globalization;
using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Output;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout convert &lt;in&gt; &lt;out&gt; [--to text|binary] [--from-s X] [--to-s Y] [--salvage]</c>: rewrites a
/// capture in the other format (or the one given), losslessly: metadata, comments, columns, rows
/// and trailer as they were. With a time range, keeps only the rows whose time from the first row
/// lies in [from, to] (raw values unchanged) and notes the range in a header comment. With
/// --salvage, a damaged capture (cut by a power loss, a truncated or corrupt binary block, a line
/// that does not parse) gives the rows before the damage, and stderr says where the damage starts
/// and what was lost. The output is written through <see cref="OutputFileSet"/>: an existing
/// &lt;out&gt; is replaced only when the whole conversion succeeded.
/// </summary>
public sealed class ConvertCommand : Command<ConvertCommand.Settings>
{
    /// <summary>The trailer key a salvage adds when it found damage.</summary>
    public const string SalvageTrailerKey = "salvage_damage";

    public sealed class Settings : CommandSettings
    {
        [CommandArgument(0, "<in>")]
        [Description("Capture to read, text or binary (picked by content); - reads it from standard input.")]
        [FilePath(StandardInput = true)]
        public string Input { get; set; } = string.Empty;

        [CommandArgument(1, "<out>")]
        [Description("Capture to write. An existing file is replaced only when the conversion succeeds (never when it fails), and never when it is <in> itself, a link to it, or a hard link to it.")]
        [FilePath]
        public string Output { get; set; } = string.Empty;

        [CommandOption("--to <FORMAT>")]
        [Description("text or binary. Default: the other format than the input's.")]
        public string? To { get; set; }

        [CommandOption("--from-s <SECONDS>")]
        [Description("Keep rows from this time on, seconds from the first row, [[0, 1e9]]. Default: from the first row.")]
        public string? FromSeconds { get; set; }

        [CommandOption("--to-s <SECONDS>")]
        [Description("Keep rows up to this time, seconds from the first row, (--from-s, 1e9]]. Default: to the last row.")]
        public string? ToSeconds { get; set; }

        [CommandOption("--salvage")]
        [Description("Rescue a damaged capture (a recording cut by a power loss, a truncated or corrupt binary block, a line that does not parse): write the rows before the damage; a text capture whose last line has no line end loses that line, which may be cut. A warning on stderr says where the damage starts and what was lost. Exit 0 when rows were rescued (or no damage was found), 1 when no row comes before the damage (nothing is written).")]
        public bool Salvage { get; set; }
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

        using var outputs = new OutputFileSet();
        if (!StandardStreams.IsInput(settings.Input))
        {
            outputs.AddInput("the input capture <in>", settings.Input);
        }

        OutputFile output = outputs.AddOutput("<out>", settings.Output, "the capture");
        if (!outputs.TryPrepare(out OutputFileException? problem))
        {
            return CommandOutput.Fail(problem!.Message, problem.ExitCode);
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
            if (outputFormat == CaptureFileFormat.Binary && output.TargetKind == OutputTargetKind.StandardOutput && !Console.IsOutputRedirected)
            {
                return CommandOutput.Fail("<out> -: a binary capture would go to the terminal; redirect standard output to a file or a pipe, or give --to text", CommandOutput.BadOption);
            }

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

            if (settings.Salvage)
            {
                reader.Metadata.HeaderLines.Add(CaptureHeaderLine.ForComment(
                    $" written by freqreadout convert --salvage from {Path.GetFileName(settings.Input)}: the rows before any damage (trailer key {SalvageTrailerKey} says where it starts)"));
            }

            long kept = 0;
            long read = 0;
            CaptureFormatException? damage = null;
            long cutLine = 0; // a text capture's last line without a line end (0: none)
            string? cutTrailerKey = null; // ... when that line is a trailer line: its key, dropped
            var trailer = new List<KeyValuePair<string, string>>();
            try
            {
                using (var writer = CaptureFile.Create(output.Stream, reader.Metadata, outputFormat))
                {
                    var unwrapper = new TimerUnwrapper(reader.Metadata.TimerBits);
                    double clockHz = reader.Metadata.ClockHz;
                    bool holdBack = settings.Salvage && inputFormat == CaptureFileFormat.Text;
                    CaptureRow? held = null;
                    double? carriedTemperature = null;
                    using (IEnumerator<CaptureRow> rows = reader.ReadRows().GetEnumerator())
                    {
                        while (true)
                        {
                            cancellationToken.ThrowIfCancellationRequested();
                            try
                            {
                                if (!rows.MoveNext())
                                {
                                    break;
                                }
                            }
                            catch (CaptureFormatException e) when (settings.Salvage)
                            {
                                damage = e;
                                break;
                            }

                            CaptureRow row = rows.Current;
                            read++;
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

                                if (kept == 0 && held == null && row.TemperatureC == null && carriedTemperature != null)
                                {
                                    // The sample in force at the cut, so the first kept row knows the temperature.
                                    row = row with { TemperatureC = carriedTemperature };
                                }
                            }

                            if (holdBack)
                            {
                                // A text row is written once the next one is read: the last may turn out to be cut.
                                if (held is CaptureRow previous)
                                {
                                    writer.WriteRow(previous);
                                    kept++;
                                }

                                held = row;
                                continue;
                            }

                            writer.WriteRow(row);
                            kept++;
                        }
                    }

                    trailer.AddRange(reader.Trailer);
                    if (holdBack && damage == null)
                    {
                        // A last line without a line end may be cut mid-row (or mid-value, for a trailer line).
                        CaptureDamageSurvey.ScanText(settings.Input, long.MaxValue, out long lastLine, out bool terminated, out _);
                        if (!terminated && held is CaptureRow cut && cut.LineNumber == lastLine)
                        {
                            cutLine = lastLine;
                            held = null;
                        }
                        else if (!terminated && trailer.Count > 0)
                        {
                            cutLine = lastLine;
                            cutTrailerKey = trailer[^1].Key;
                            trailer.RemoveAt(trailer.Count - 1);
                        }
                    }

                    if (held is CaptureRow last)
                    {
                        writer.WriteRow(last);
                        kept++;
                    }

                    if (settings.Salvage && (damage != null || cutLine > 0))
                    {
                        if (kept == 0 && !trim)
                        {
                            string where = damage?.Message ?? $"{settings.Input}:{cutLine}: the only row has no line end (cut)";
                            return CommandOutput.Fail($"{where}; nothing to salvage: no row comes before the damage ({NothingWritten(output)})", CommandOutput.BadInput);
                        }

                        trailer.Add(new KeyValuePair<string, string>(SalvageTrailerKey, damage != null
                            ? $"{(inputFormat == CaptureFileFormat.Binary ? "block" : "line")} {damage.LineNumber} of {Path.GetFileName(settings.Input)}"
                            : $"line {cutLine} of {Path.GetFileName(settings.Input)} (no line end)"));
                    }

                    writer.Complete(trailer);
                }

                outputs.Commit();
            }
            catch (CaptureFormatException e)
            {
                return CommandOutput.Fail($"{e.Message} ({NothingWritten(output)}; convert --salvage keeps the rows before the damage)", CommandOutput.BadInput);
            }
            catch (OutputFileException e)
            {
                return CommandOutput.Fail(e.Message, e.ExitCode);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                return CommandOutput.Fail($"{settings.Input}: cannot read the capture: {FileErrorText.Reason(settings.Input, e)} ({NothingWritten(output)})", CommandOutput.BadInput);
            }

            foreach (string warning in reader.Warnings)
            {
                CommandOutput.Diagnostic("warning: " + warning);
            }

            if (damage != null || cutLine > 0)
            {
                CommandOutput.Diagnostic("warning: " + SalvageMessage(settings, inputFormat, damage, cutLine, cutTrailerKey, kept, read));
            }
            else if (settings.Salvage)
            {
                CommandOutput.Diagnostic($"{settings.Input}: no damage found: every row was read");
            }

            if (trim && kept == 0 && read > 0)
            {
                CommandOutput.Diagnostic($"warning: no row lies in the range from {Num(from)} s to {(settings.ToSeconds != null ? Num(until) + " s" : "the end")} (--from-s, --to-s): {settings.Output} holds the header only");
            }

            string shown = output.TargetKind == OutputTargetKind.StandardOutput ? "standard output" : settings.Output;
            CommandOutput.Diagnostic($"{shown}: {(outputFormat == CaptureFileFormat.Binary ? "binary" : "text")} capture, {kept} of {read} rows{(damage != null || cutLine > 0 ? " (salvaged)" : string.Empty)}");
            return 0;
        }
    }

    /// <summary>The warning of a salvage: where the damage starts, what was kept, what was lost.</summary>
    private static string SalvageMessage(Settings settings, CaptureFileFormat inputFormat, CaptureFormatException? damage, long cutLine, string? cutTrailerKey, long kept, long read)
    {
        string outputName = settings.Output == OutputFile.StandardOutputPath ? "standard output" : settings.Output;
        string keptText = $"kept the {CaptureDamageSurvey.Count(kept, "row")} before it in {outputName}";
        if (damage == null && cutTrailerKey != null)
        {
            return $"{settings.Input}: damaged at line {cutLine}: the last line, a trailer line, has no line end, so its value may be cut (as a power loss leaves a recording); kept every row ({kept}) in {outputName}; lost: the trailer key {cutTrailerKey}";
        }

        if (damage == null)
        {
            return $"{settings.Input}: damaged at line {cutLine}: the last line has no line end, so it may be cut mid-row (as a power loss leaves a recording); {keptText}; lost: 1 data line (line {cutLine})";
        }

        CaptureDamageReport report;
        if (inputFormat == CaptureFileFormat.Binary)
        {
            report = CaptureDamageSurvey.Binary(settings.Input, damage.LineNumber, read);
        }
        else
        {
            CaptureDamageSurvey.ScanText(settings.Input, damage.LineNumber, out long lastLine, out bool terminated, out long dataLines);
            string end = terminated ? string.Empty : "; the last line has no line end (cut, as by a power loss)";
            report = new CaptureDamageReport(
                $"line {damage.LineNumber}",
                $"{CaptureDamageSurvey.Count(dataLines, "data line")}, from line {damage.LineNumber} to line {lastLine}{end}",
                dataLines);
        }

        return $"{settings.Input}: damaged at {report.Where} ({damage.Problem}); {keptText}; lost: {report.Lost}";
    }

    /// <summary>What became of &lt;out&gt; after a failure: "nothing written: x.frb is unchanged", or for a device or pipe that the output stops there.</summary>
    private static string NothingWritten(OutputFile output) =>
        output.UnchangedNote is { Length: > 0 } note ? "nothing written: " + note : $"the output to {(output.TargetKind == OutputTargetKind.StandardOutput ? "standard output" : output.Path)} stops here";

    /// <summary>Largest --from-s / --to-s, seconds (about 32 years).</summary>
    private const double MaxSeconds = 1e9;

    private static string Num(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
