using System.ComponentModel;
using System.Globalization;
using System.Text;
using System.Text.Json;
using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Counting;
using FreqReadout.Host.Output;
using FreqReadout.Host.Replay;
using FreqReadout.Host.Reports;
using FreqReadout.Readout;
using Spectre.Console;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout replay &lt;capture&gt; [--json] [--readings FILE] [--events FILE]</c>: streams a capture
/// through the counting core and the same readout pipeline the device runs, and prints a summary
/// (edges, duration, gates, baseline, noise in Hz and ppm, drift, re-baselines, events). With --json,
/// exactly one JSON object on stdout (keys and meanings in docs/json-output.md); diagnostics on stderr.
/// </summary>
public sealed class ReplayCommand : Command<ReplayCommand.Settings>
{
    /// <summary>The caution of README.md ("Cautions"), shown with every summary.</summary>
    public const string Caution =
        "Caution: a readout that shows nothing is not proof that a wall or floor holds no live wiring or pipe. " +
        "Isolate circuits and verify with an approved voltage tester before drilling or cutting; check utility records " +
        "and local locating services before digging; follow local electrical and building codes and licensed practice.";

    public sealed class Settings : ReadoutCommandSettings
    {
        [CommandOption("--readings <FILE>")]
        [Description("Also write the gate-by-gate readings as CSV, ending with error_hz (the gate's predicted error), scatter_hz (the measured scatter of consecutive gates) and inferred_edges; an existing file is replaced only when the replay succeeds, never the capture itself. Default: none.")]
        [FilePath]
        public string? ReadingsFile { get; set; }

        [CommandOption("--report <DIR>")]
        [Description("Also write a report into DIR (created when missing): plots as PNG and SVG (frequency with the tracked baseline; shift with the threshold band, events by class and re-baselines; a histogram of the target-free shifts with fitted normals) and report.html, one self-contained page with the plots, summary, events, settings used and cautions. Files of the same names there are replaced. Default: no report.")]
        [FilePath]
        public string? ReportDir { get; set; }

        [CommandOption("--events <FILE>")]
        [Description("Also write the events as CSV (replaced only when the replay succeeds; never the capture or the --readings file). Default: none.")]
        [FilePath]
        public string? EventsFile { get; set; }

        [CommandOption("--hold-span <FROM:TO>")]
        [Description("Replay FROM to TO seconds (from the capture's first edge; 0 <= FROM < TO) in hold mode, as a 'hold' mark on the first row at or after FROM and a 'release' mark on the first row at or after TO would: no automatic re-baseline in between. May be repeated for spans that do not overlap. Hold mode is for pinpointing over a still target: the tracker keeps following target-free readings, but a shift that stays is not re-baselined. A capture's mark column can do the same with 'hold' and 'release' marks, and 'rebaseline' asks for a manual re-baseline (marks act from the next gate). Default: none (only the capture's own hold/release marks).")]
        public string[]? HoldSpans { get; set; }

        [CommandOption("--unclear-band-sigma <SIGMA>")]
        [Description("Peaks below threshold + band are classed unclear, [[0, 1000]]. Default 0.5.")]
        public string? UnclearBandSigma { get; set; }

        [CommandOption("--polarity <NAME>")]
        [Description("normal (search frequency up = non-ferrous) or inverted. Default normal.")]
        public string? Polarity { get; set; }

        [CommandOption("--tempco-ppm-per-k <PPM>")]
        [Description("Search-oscillator tempco removed before tracking (from calibrate), [[-1000, 1000]]; 0 = off. Default 0.")]
        public string? TempcoPpmPerK { get; set; }

        /// <inheritdoc/>
        protected override bool ApplyCommandOptions(ReadoutSettings settings, out string? error)
        {
            error = null;
            if (Polarity != null)
            {
                switch (Polarity.Trim().ToLowerInvariant())
                {
                    case "normal":
                        settings.Polarity = FreqReadout.Detection.Polarity.Normal;
                        break;
                    case "inverted":
                        settings.Polarity = FreqReadout.Detection.Polarity.Inverted;
                        break;
                    default:
                        error = $"--polarity must be normal or inverted, got {OptionValues.Quote(Polarity)}";
                        return false;
                }
            }

            return TrySetNumber(settings, UnclearBandSigma, "--unclear-band-sigma", (r, v) => r.UnclearBandSigma = v, out error)
                && TrySetNumber(settings, TempcoPpmPerK, "--tempco-ppm-per-k", (r, v) => r.TempcoPpmPerK = v, out error);
        }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        CounterSettings? options = settings.BuildOptions(out string? optionError);
        if (options == null)
        {
            return CommandOutput.Fail(optionError!, CommandOutput.BadOption);
        }

        if (!HoldSpan.TryParseAll(settings.HoldSpans ?? Array.Empty<string>(), out IReadOnlyList<HoldSpan> holdSpans, out string? holdError))
        {
            return CommandOutput.Fail("--hold-span: " + holdError, CommandOutput.BadOption);
        }

        // Every output is checked (and opened as a temporary file) before any work; none may be the capture or the other.
        using var outputs = new OutputFileSet { StandardOutputInUse = true };
        outputs.AddInput("the capture", settings.Capture);
        OutputFile? readingsFile = settings.ReadingsFile != null ? outputs.AddOutput("--readings", settings.ReadingsFile, "the readings") : null;
        OutputFile? eventsFile = settings.EventsFile != null ? outputs.AddOutput("--events", settings.EventsFile, "the events") : null;
        if (!outputs.TryPrepare(out OutputFileException? problem))
        {
            return CommandOutput.Fail(problem!.Message, problem.ExitCode);
        }

        if (settings.ReportDir != null && !ReportFolder.TryCreate(settings.ReportDir, out string? folderError))
        {
            return CommandOutput.Fail(folderError!, CommandOutput.BadInput);
        }

        int openError = CommandOutput.TryOpenCapture(settings.Capture, out ICaptureReader? opened);
        if (opened == null)
        {
            return openError;
        }

        ICaptureReader reader = opened;
        using (reader)
        {
            ReadoutSettings? readout = settings.BuildReadoutSettings(reader.Metadata, out string? readoutError);
            if (readout == null)
            {
                return CommandOutput.Fail(readoutError!, CommandOutput.BadOption);
            }

            ReadoutCommandSettings.ApplyBeatFloor(options, readout);
            int sourceExit = CommandOutput.TryCreateGateSource(reader, options, settings, readout.SearchHz > 0 ? readout.SearchHz : null, out CaptureGateSource? created);
            if (created == null)
            {
                return sourceExit;
            }

            CaptureGateSource source = created;

            ReplayReport report;
            ReadingTrace? trace = settings.ReportDir != null ? new ReadingTrace() : null;
            StreamWriter? readingsCsv = null;
            ReplaySession? session = null;
            CaptureFormatException? damaged = null;
            try
            {
                readingsCsv = readingsFile != null ? OpenCsv(readingsFile.Stream, ReadingsHeader) : null;
                session = new ReplaySession(readout, reader.Metadata.StartedUtc) { HoldSpans = holdSpans };
                if (readingsCsv != null)
                {
                    session.ReadingSink = (r, g) => readingsCsv.WriteLine(ReadingRow(r, g));
                }

                if (trace != null)
                {
                    Action<Reading, CaptureGate>? csv = session.ReadingSink;
                    session.ReadingSink = (r, g) =>
                    {
                        csv?.Invoke(r, g);
                        trace.Add(r);
                    };
                }

                report = settings.WithIgnoredOptionWarnings(RunWithStatus(session, source, settings.Json, cancellationToken), reader.Metadata);
            }
            catch (CaptureFormatException e) when (session == null || session.Gates == 0)
            {
                return CommandOutput.Fail(e.Message, CommandOutput.BadInput);
            }
            catch (CaptureFormatException e)
            {
                // Nothing lost: the gates read before the damage are still summarised (and the exit code says it failed).
                damaged = e;
                string note = $"the capture is damaged ({e.Message}); this summary covers only the {session!.Gates} gates read before it";
                report = settings.WithIgnoredOptionWarnings(session!.Finish(source.RowsRead, reader.Metadata.Signal, source.Warnings.Append(note)), reader.Metadata);
            }
            catch (OutputFileException e)
            {
                return CommandOutput.Fail(e.Message, e.ExitCode);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                string note = outputs.UnchangedNote();
                return CommandOutput.Fail($"{settings.Capture}: cannot read the capture: {FileErrorText.Reason(settings.Capture, e)}{(note.Length > 0 ? $" ({note})" : string.Empty)}", CommandOutput.BadInput);
            }

            if (report.Gates == 0 && damaged == null)
            {
                // Nothing replayed is not a success: the warnings say why, then the error.
                foreach (string w in report.Warnings.Where(w => !w.StartsWith("no gate closed", StringComparison.Ordinal)))
                {
                    CommandOutput.Diagnostic("warning: " + w);
                }

                return CommandOutput.Fail($"{reader.SourceName}: {CountCommand.NoGateText(source)}", CommandOutput.BadInput);
            }

            try
            {
                readingsCsv?.Dispose(); // flushes into the readings file (a full disk shows here at the latest)
                if (eventsFile != null)
                {
                    using StreamWriter events = OpenCsv(eventsFile.Stream, EventsHeader);
                    foreach (ReplayEvent e in report.Events)
                    {
                        events.WriteLine(EventRow(e));
                    }
                }

                // Also after a capture damaged part-way: the files hold what the summary covers.
                outputs.Commit();
            }
            catch (OutputFileException e)
            {
                return CommandOutput.Fail(e.Message, e.ExitCode);
            }

            if (trace != null)
            {
                try
                {
                    IReadOnlyList<string> plots = ReplayPlots.Write(settings.ReportDir!, trace, report, readout.ThresholdSigma);
                    ReportPage page = ReplayReportPage.Start(
                        "FreqReadout replay report: " + Path.GetFileName(reader.SourceName),
                        new[]
                        {
                            $"A replay of the capture {reader.SourceName} through the same counting and readout pipeline the device runs. Times are seconds from the capture's first edge; frequencies and shifts in Hz.",
                            "The plots are also in this folder as PNG and SVG files; the summary and tables hold the numbers replay prints.",
                        },
                        ReplayTables.Summary(report, readout, reader.SourceName, source.Settings, holdSpans),
                        report,
                        plots);
                    ReplayReportPage.Finish(page, SettingsTable.Of(new SettingsSource("counter", source.Settings), new SettingsSource("readout", readout)), report.Warnings);
                    page.Write(Path.Combine(settings.ReportDir!, ReplayReportPage.FileName));
                    CommandOutput.Diagnostic($"replay: wrote {plots.Count} plot files and {ReplayReportPage.FileName} into {settings.ReportDir}");
                }
                catch (Exception e) when (e is IOException or UnauthorizedAccessException)
                {
                    return CommandOutput.Fail($"--report {settings.ReportDir}: {FileErrorText.Reason(settings.ReportDir!, e)}", CommandOutput.BadInput);
                }
            }

            if (settings.Json)
            {
                Console.Out.WriteLine(ToJson(report));
                Console.Out.Flush();
                foreach (string w in report.Warnings)
                {
                    CommandOutput.Diagnostic("warning: " + w);
                }

                CommandOutput.Diagnostic(Caution);
            }
            else
            {
                WriteSummary(report, readout, source, holdSpans);
            }

            return damaged == null ? 0 : CommandOutput.Fail(damaged.Message, CommandOutput.BadInput);
        }
    }

    /// <summary>
    /// Runs the session; on an interactive terminal (stderr not redirected, no --json) a status line on
    /// stderr shows how far into the capture the replay is, so a long capture is not silent.
    /// </summary>
    private static ReplayReport RunWithStatus(ReplaySession session, CaptureGateSource source, bool json, CancellationToken ct)
    {
        if (json || !CommandOutput.ErrorIsTerminal())
        {
            return session.Run(source, ct);
        }

        ReplayReport? report = null;
        var err = CommandOutput.Stderr();
        err.Status().Start("replaying...", ctx =>
        {
            Action<Reading, CaptureGate>? inner = session.ReadingSink;
            long n = 0;
            session.ReadingSink = (r, g) =>
            {
                inner?.Invoke(r, g);
                if (++n % 200 == 0)
                {
                    ctx.Status(string.Create(CultureInfo.InvariantCulture, $"replaying: {r.TimeSeconds:F0} s of capture, {n} gates, {source.RowsRead} rows"));
                }
            };
            report = session.Run(source, ct);
        });
        return report!;
    }

    /// <summary>JSON output options: plain UTF-8 text in strings (no escaping of '+' or quotes beyond JSON's own rules).</summary>
    public static readonly JsonWriterOptions JsonOptions = new() { Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping };

    /// <summary>The report as the one JSON object of the contract (plus start_utc on events when known, shift on re-baselines, noise_ppm).</summary>
    public static string ToJson(ReplayReport report)
    {
        var buffer = new System.Buffers.ArrayBufferWriter<byte>(4096);
        using (var json = new Utf8JsonWriter(buffer, JsonOptions))
        {
            json.WriteStartObject();
            json.WriteStartObject("capture");
            json.WriteNumber("edges", report.Edges);
            json.WriteNumber("duration_s", report.DurationSeconds);
            json.WriteString("signal", report.Signal == SignalKind.Beat ? "beat" : "search");
            json.WriteEndObject();
            JsonValues.NumberOrNull(json, "baseline_hz", report.BaselineHz);
            JsonValues.NumberOrNull(json, "noise_hz", report.NoiseHz);
            JsonValues.NumberOrNull(json, "noise_ppm", report.NoisePpm);
            JsonValues.NumberOrNull(json, "drift_hz_per_min", report.DriftHzPerMinute);
            json.WriteNumber("gates", report.Gates);
            json.WriteStartArray("rebaselines");
            foreach (ReplayRebaseline r in report.Rebaselines)
            {
                json.WriteStartObject();
                json.WriteNumber("time_s", r.TimeSeconds);
                json.WriteString("reason", r.ReasonName);
                JsonValues.NumberOrNull(json, "shift_hz", r.ShiftHz);
                JsonValues.NumberOrNull(json, "shift_ppm", r.ShiftPpm);
                JsonValues.NumberOrNull(json, "completed_s", r.CompletedSeconds);
                json.WriteEndObject();
            }

            json.WriteEndArray();
            json.WriteStartArray("events");
            foreach (ReplayEvent e in report.Events)
            {
                json.WriteStartObject();
                json.WriteNumber("start_s", e.Event.StartSeconds);
                json.WriteNumber("end_s", e.Event.EndSeconds);
                json.WriteNumber("peak_s", e.Event.PeakSeconds);
                json.WriteNumber("peak_shift_hz", e.Event.PeakShiftHz);
                JsonValues.NumberOrNull(json, "peak_shift_ppm", e.Event.HasPpm ? e.Event.PeakShiftPpm : null);
                json.WriteString("class", e.ClassName);
                json.WriteBoolean("absorbed", e.Event.End == EventEnd.AutoRebaseline);
                if (e.StartUtc is DateTimeOffset utc)
                {
                    json.WriteString("start_utc", utc.ToUniversalTime().ToString("yyyy-MM-dd'T'HH:mm:ss.fff'Z'", CultureInfo.InvariantCulture));
                }

                json.WriteEndObject();
            }

            json.WriteEndArray();
            json.WriteStartArray("warnings");
            foreach (string w in report.Warnings)
            {
                json.WriteStringValue(w);
            }

            json.WriteEndArray();
            json.WriteEndObject();
        }

        return Encoding.UTF8.GetString(buffer.WrittenSpan);
    }

    private const string ReadingsHeader = "time_s,state,frequency_hz,baseline_hz,shift_hz,shift_ppm,shift_sigma,noise_hz,drift_hz_per_s,temp_correction_hz,temp_c,target,hold,below_beat_floor,class,marks,error_hz,scatter_hz,inferred_edges";
    private const string EventsHeader = "start_s,end_s,peak_s,peak_shift_hz,peak_shift_ppm,peak_sigma,noise_hz,class,end,start_utc";

    private static StreamWriter OpenCsv(Stream stream, string header)
    {
        var w = new StreamWriter(stream, new UTF8Encoding(false), 65536) { NewLine = "\n" };
        w.WriteLine(header);
        return w;
    }

    private static string StateName(ReadoutState s) => s switch
    {
        ReadoutState.NoSignal => "no_signal",
        ReadoutState.Settling => "settling",
        ReadoutState.Tracking => "tracking",
        ReadoutState.Target => "target",
        _ => "hold",
    };

    private static string ReadingRow(Reading r, CaptureGate g)
    {
        string N(double v) => v.ToString("R", CultureInfo.InvariantCulture);
        return string.Join(",",
            N(r.TimeSeconds),
            StateName(r.State),
            r.HasFrequency ? N(r.FrequencyHz) : string.Empty,
            r.HasShift ? N(r.BaselineHz) : string.Empty,
            r.HasShift ? N(r.ShiftHz) : string.Empty,
            r.HasShift && r.HasPpm ? N(r.ShiftPpm) : string.Empty,
            r.HasShift ? N(r.ShiftSigma) : string.Empty,
            r.HasShift ? N(r.NoiseHz) : string.Empty,
            r.HasShift ? N(r.DriftHzPerSecond) : string.Empty,
            N(r.TemperatureCorrectionHz),
            g.LatestTemperatureC is double t ? N(t) : string.Empty,
            r.TargetPresent ? "1" : "0",
            r.HoldActive ? "1" : "0",
            r.BelowBeatFloor ? "1" : "0",
            r.TargetPresent ? ReplayEvent.ClassText(r.Class) : string.Empty,
            string.Join(" ", g.Marks),
            g.Gate.HasFrequency ? N(g.Gate.ErrorHz) : string.Empty,
            g.ScatterHz is double scatter ? N(scatter) : string.Empty,
            g.Gate.InferredEdges.ToString(CultureInfo.InvariantCulture));
    }

    private static string EventRow(ReplayEvent e)
    {
        string N(double v) => v.ToString("R", CultureInfo.InvariantCulture);
        var d = e.Event;
        return string.Join(",",
            N(d.StartSeconds),
            N(d.EndSeconds),
            N(d.PeakSeconds),
            N(d.PeakShiftHz),
            d.HasPpm ? N(d.PeakShiftPpm) : string.Empty,
            N(d.PeakSigma),
            N(d.NoiseHz),
            e.ClassName,
            ReplayEvent.EndText(d.End),
            e.StartUtc is DateTimeOffset u ? u.ToUniversalTime().ToString("yyyy-MM-dd'T'HH:mm:ss.fff'Z'", CultureInfo.InvariantCulture) : string.Empty);
    }

    /// <summary>
    /// A simple-bordered console table of the first <paramref name="columns"/> columns of <paramref name="rows"/>, right-aligned
    /// except the text columns from <paramref name="textFrom"/> to <paramref name="textTo"/>.
    /// </summary>
    private static Table ConsoleTable(ReportTable rows, int textFrom, int textTo, int columns)
    {
        var t = new Table().Border(TableBorder.Simple);
        for (int i = 0; i < columns; i++)
        {
            var column = new TableColumn(Markup.Escape(rows.Headers[i]));
            t.AddColumn(i >= textFrom && i <= textTo ? column : column.RightAligned());
        }

        foreach (IReadOnlyList<string> row in rows.Rows)
        {
            t.AddRow(row.Take(columns).Select(Markup.Escape).ToArray());
        }

        return t;
    }

    private static void WriteSummary(ReplayReport report, ReadoutSettings readout, CaptureGateSource source, IReadOnlyList<HoldSpan> holdSpans)
    {
        var console = CommandOutput.Stdout();
        var grid = new Grid().AddColumn().AddColumn();
        foreach (IReadOnlyList<string> row in ReplayTables.Summary(report, readout, source.Reader.SourceName, source.Settings, holdSpans).Rows)
        {
            grid.AddRow(Markup.Escape(row[0]), Markup.Escape(row[1]));
        }

        console.Write(grid);
        console.WriteLine();

        console.WriteLine($"re-baselines: {report.Rebaselines.Count}");
        if (report.Rebaselines.Count > 0)
        {
            console.Write(ConsoleTable(ReplayTables.Rebaselines(report), 1, 1, 4));
        }

        console.WriteLine($"events: {report.Events.Count}");
        if (report.Events.Count > 0)
        {
            console.Write(ConsoleTable(ReplayTables.Events(report), 6, 6, 7));
        }

        foreach (string w in report.Warnings)
        {
            CommandOutput.Diagnostic("warning: " + w);
        }

        console.WriteLine();
        console.WriteLine(Caution);
    }
}
