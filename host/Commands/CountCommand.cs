using System.ComponentModel;
using System.Globalization;
using System.Text.Json;
using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Counting;
using Spectre.Console;
using Spectre.Console.Cli;
using Spectre.Console.Rendering;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout count &lt;capture&gt;</c>: the capture's metadata, then a gate-by-gate table (time,
/// frequency, shift from the first gate, edges, predicted error, measured scatter of consecutive gates,
/// state with the edges inferred as missed) in a fixed layout (<see cref="CountTableLayout"/>), or with
/// <c>--json</c> one JSON object per gate, or with <c>--csv</c> one CSV header row and one row per gate
/// (keys and columns in docs/json-output.md and docs/csv-output.md). Text or binary captures, picked by
/// content. Warnings and errors go to stderr.
/// </summary>
public sealed class CountCommand : Command<CountCommand.Settings>
{
    /// <summary>The columns of <c>count --csv</c> that every capture gets (temp_c and marks follow when the capture has those columns).</summary>
    public const string CsvHeader = "time_s,start_s,frequency_hz,shift_hz,search_shift_hz,edges,error_hz,estimator,state,glitches,inferred_edges,scatter_hz";

    /// <summary>Line length of the table when stdout is a file or pipe (7 columns and a state with marks do not fit in 80).</summary>
    public const int RedirectedWidth = 120;

    public sealed class Settings : CounterOptionSettings
    {
        [CommandArgument(0, "<capture>")]
        [Description("Capture file, text or binary (picked by content); - reads it from standard input.")]
        [FilePath(StandardInput = true)]
        public string Capture { get; set; } = string.Empty;

        [CommandOption("--json")]
        [Description("One JSON object per gate on stdout: time_s, frequency_hz, shift_hz (counted signal), search_shift_hz (search oscillator, beat side applied), edges, error_hz, estimator, state, start_s, glitches, inferred_edges, scatter_hz (measured scatter of consecutive gates, null until two). Keys: docs/json-output.md.")]
        public bool Json { get; set; }

        [CommandOption("--csv")]
        [Description("CSV on stdout: one header row, then one row per gate (the --json keys as columns, '.' decimals, blank = none). Columns: docs/csv-output.md.")]
        public bool Csv { get; set; }
    }

    /// <summary>The <c>estimator</c> value of the JSON contract.</summary>
    public static string EstimatorName(EstimatorKind kind) => kind switch
    {
        EstimatorKind.Reciprocal => "reciprocal",
        EstimatorKind.Regression => "regression",
        _ => "snapshot-regression",
    };

    /// <summary>The <c>state</c> value of the JSON contract.</summary>
    public static string StateName(GateState state) => state switch
    {
        GateState.Ok => "ok",
        GateState.NoSignal => "no_signal",
        GateState.Glitch => "glitch",
        _ => "dropout",
    };

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        var options = settings.BuildOptions(out string? optionError);
        if (options == null)
        {
            return CommandOutput.Fail(optionError!, CommandOutput.BadOption);
        }

        if (settings.Json && settings.Csv)
        {
            return CommandOutput.Fail("give either --json or --csv, not both", CommandOutput.BadOption);
        }

        int openExit = CommandOutput.TryOpenCapture(settings.Capture, out ICaptureReader? opened);
        if (opened == null)
        {
            return openExit;
        }

        ICaptureReader reader = opened;
        using (reader)
        {
            int sourceExit = CommandOutput.TryCreateGateSource(reader, options, settings, null, out CaptureGateSource? created);
            if (created == null)
            {
                return sourceExit;
            }

            CaptureGateSource source = created;
            foreach (string ignored in settings.IgnoredOptionWarnings(reader.Metadata))
            {
                CommandOutput.Diagnostic("warning: " + ignored);
            }

            var format = CommandOutput.FormatOf(reader);
            int exit = 0;
            long gates = 0;
            try
            {
                gates = settings.Json ? WriteJson(source, cancellationToken) : settings.Csv ? WriteCsv(source, cancellationToken) : WriteTable(source, format, cancellationToken);
            }
            catch (CaptureFormatException e)
            {
                exit = CommandOutput.Fail(e.Message, CommandOutput.BadInput);
            }
            catch (ArgumentException e)
            {
                exit = CommandOutput.Fail(e.Message, CommandOutput.BadOption);
            }

            foreach (string warning in source.Warnings)
            {
                CommandOutput.Diagnostic("warning: " + warning);
            }

            if (exit == 0 && gates == 0)
            {
                // Nothing counted is not a success: the reason, as an error (stdout keeps what was printed).
                exit = CommandOutput.Fail($"{reader.SourceName}: {NoGateText(source)}", CommandOutput.BadInput);
            }

            return exit;
        }
    }

    /// <summary>Why no gate closed: no data rows at all, or fewer than one gate's worth.</summary>
    public static string NoGateText(CaptureGateSource source) => source.RowsRead == 0
        ? "no gate closed: the capture holds no data rows"
        : source.RowsFed < 2
            ? $"no gate closed: the capture holds {source.RowsFed} usable row{(source.RowsFed == 1 ? string.Empty : "s")}, a gate needs at least 2"
            : "no gate closed: the capture is shorter than one gate (try a shorter --gate-seconds or --gate-edges)";

    /// <summary>The search oscillator's shift from a shift of the counted signal: the beat's sign flips when the search oscillator is below the reference.</summary>
    public static double SearchShiftHz(double countedShiftHz, CaptureMetadata metadata) =>
        metadata.Signal == SignalKind.Beat && metadata.BeatSide == BeatSide.Below ? 0.0 - countedShiftHz : countedShiftHz; // 0 - x, not -x: no "-0" for an unchanged gate

    private static long WriteJson(CaptureGateSource source, CancellationToken cancellationToken)
    {
        long gates = 0;
        var stdout = Console.Out;
        var buffer = new System.Buffers.ArrayBufferWriter<byte>(256);
        bool hasTemp = source.Metadata.HasTemperatureColumn;
        bool hasMark = source.Metadata.HasMarkColumn;
        double? reference = null;
        foreach (var item in source.ReadGates())
        {
            cancellationToken.ThrowIfCancellationRequested();
            var gate = item.Gate;
            if (gate.HasFrequency && reference == null)
            {
                reference = gate.FrequencyHz;
            }

            buffer.Clear();
            using (var json = new Utf8JsonWriter(buffer))
            {
                json.WriteStartObject();
                json.WriteNumber("time_s", gate.EndSeconds);
                JsonValues.NumberOrNull(json, "frequency_hz", gate.HasFrequency ? gate.FrequencyHz : null);
                double? shift = gate.HasFrequency ? gate.FrequencyHz - reference!.Value : null;
                JsonValues.NumberOrNull(json, "shift_hz", shift);
                JsonValues.NumberOrNull(json, "search_shift_hz", shift is double sh ? SearchShiftHz(sh, source.Metadata) : null);
                json.WriteNumber("edges", gate.Edges);
                JsonValues.NumberOrNull(json, "error_hz", gate.HasFrequency ? gate.ErrorHz : null);
                json.WriteString("estimator", EstimatorName(gate.Estimator));
                json.WriteString("state", StateName(gate.State));
                json.WriteNumber("start_s", gate.StartSeconds);
                json.WriteNumber("glitches", gate.Glitches);
                json.WriteNumber("inferred_edges", gate.InferredEdges);
                JsonValues.NumberOrNull(json, "scatter_hz", item.ScatterHz);
                if (hasTemp)
                {
                    JsonValues.NumberOrNull(json, "temp_c", item.TemperatureC);
                }

                if (hasMark)
                {
                    json.WriteStartArray("marks");
                    foreach (string mark in item.Marks)
                    {
                        json.WriteStringValue(mark);
                    }

                    json.WriteEndArray();
                }

                json.WriteEndObject();
            }

            stdout.WriteLine(System.Text.Encoding.UTF8.GetString(buffer.WrittenSpan));
            gates++;
        }

        stdout.Flush();
        return gates;
    }

    private static long WriteCsv(CaptureGateSource source, CancellationToken cancellationToken)
    {
        var stdout = Console.Out;
        bool hasTemp = source.Metadata.HasTemperatureColumn;
        bool hasMark = source.Metadata.HasMarkColumn;
        stdout.Write(CsvHeader);
        stdout.Write(hasTemp ? ",temp_c" : string.Empty);
        stdout.Write(hasMark ? ",marks\n" : "\n");
        double? reference = null;
        long gates = 0;
        var line = new System.Text.StringBuilder(160);
        foreach (var item in source.ReadGates())
        {
            cancellationToken.ThrowIfCancellationRequested();
            var gate = item.Gate;
            if (gate.HasFrequency && reference == null)
            {
                reference = gate.FrequencyHz;
            }

            line.Clear();
            line.Append(Num(gate.EndSeconds)).Append(',')
                .Append(Num(gate.StartSeconds)).Append(',')
                .Append(gate.HasFrequency ? CsvNumber(gate.FrequencyHz) : string.Empty).Append(',')
                .Append(gate.HasFrequency ? CsvNumber(gate.FrequencyHz - reference!.Value) : string.Empty).Append(',')
                .Append(gate.HasFrequency ? CsvNumber(SearchShiftHz(gate.FrequencyHz - reference!.Value, source.Metadata)) : string.Empty).Append(',')
                .Append(gate.Edges.ToString(CultureInfo.InvariantCulture)).Append(',')
                .Append(gate.HasFrequency ? CsvNumber(gate.ErrorHz) : string.Empty).Append(',')
                .Append(EstimatorName(gate.Estimator)).Append(',')
                .Append(StateName(gate.State)).Append(',')
                .Append(gate.Glitches.ToString(CultureInfo.InvariantCulture)).Append(',')
                .Append(gate.InferredEdges.ToString(CultureInfo.InvariantCulture)).Append(',')
                .Append(item.ScatterHz is double scatter ? CsvNumber(scatter) : string.Empty);
            if (hasTemp)
            {
                line.Append(',').Append(item.TemperatureC is double t ? CsvNumber(t) : string.Empty);
            }

            if (hasMark)
            {
                line.Append(',').Append(CsvText(string.Join(" ", item.Marks)));
            }

            line.Append('\n');
            stdout.Write(line.ToString());
            gates++;
        }

        stdout.Flush();
        return gates;
    }

    /// <summary>A finite number as invariant round-trip text; blank for NaN or infinity (as JSON's null).</summary>
    private static string CsvNumber(double value) => double.IsFinite(value) ? Num(value) : string.Empty;

    /// <summary>A text field, quoted (RFC 4180) only when it holds a comma, a quote or a line break.</summary>
    internal static string CsvText(string text) =>
        text.IndexOfAny(new[] { ',', '"', '\n', '\r' }) < 0 ? text : "\"" + text.Replace("\"", "\"\"") + "\"";

    private static long WriteTable(CaptureGateSource source, CaptureFileFormat format, CancellationToken cancellationToken)
    {
        var console = CommandOutput.Stdout();
        if (Console.IsOutputRedirected && console.Profile.Width < RedirectedWidth)
        {
            // A file or pipe has no line length to fit: keep each gate's row on one line.
            console.Profile.Width = RedirectedWidth;
        }

        CaptureMetadataView.Write(console, source.Reader, format);
        var s = source.Settings;
        string gateText = GateText(s);
        console.WriteLine($"gate {gateText}, estimator {EstimatorName(s.Estimator)}, jitter {Num(s.JitterTicks)} ticks rms; frequencies of the {(s.Signal == SignalKind.Beat ? "beat note" : "search oscillator")} before the prescaler");
        bool beat = s.Signal == SignalKind.Beat;
        if (beat)
        {
            console.WriteLine(source.Metadata.BeatSide == BeatSide.Below
                ? "beat shift: the beat note's change from the first gate; search shift: the search oscillator's, opposite in sign (beat_side = below: the search oscillator is below the reference)"
                : "beat shift: the beat note's change from the first gate; search shift: the search oscillator's, the same (beat_side = above)");
        }

        console.WriteLine();

        double? reference = null;
        long gates = 0;
        long withFrequency = 0;
        var layout = new CountTableLayout(source.Metadata, s, beat);
        var stdout = Console.Out;
        stdout.WriteLine(layout.Header());
        stdout.WriteLine(layout.Rule());
        foreach (var item in source.ReadGates())
        {
            cancellationToken.ThrowIfCancellationRequested();
            var gate = item.Gate;
            if (gate.HasFrequency && reference == null)
            {
                reference = gate.FrequencyHz;
            }

            // Streamed row by row: gates counted before a malformed row (or a corrupt binary block) are already shown.
            double? shift = gate.HasFrequency ? gate.FrequencyHz - reference!.Value : null;
            stdout.WriteLine(layout.Row(
                gate.EndSeconds,
                gate.HasFrequency ? gate.FrequencyHz : null,
                shift,
                shift is double sh ? SearchShiftHz(sh, source.Metadata) : null,
                gate.Edges,
                gate.HasFrequency ? gate.ErrorHz : null,
                item.ScatterHz,
                StateName(gate.State)
                    + (gate.InferredEdges > 0 ? $", {gate.InferredEdges} inferred" : string.Empty)
                    + (item.Marks.Count > 0 ? " (" + string.Join(", ", item.Marks) + ")" : string.Empty)));
            gates++;
            if (gate.HasFrequency)
            {
                withFrequency++;
            }
        }

        console.WriteLine();
        console.WriteLine($"{gates} gates ({withFrequency} with a frequency) from {source.RowsRead} rows; {source.FlaggedSteps} rows skipped");
        CaptureMetadataView.WriteTrailer(console, source.Reader);
        return gates;
    }

    /// <summary>
    /// The gate as set: "N periods", "T s", or with --mains-hz the nulling length, e.g.
    /// "0.089548 s (4.4774 periods of 50 Hz mains, asked 0.1 s)".
    /// </summary>
    public static string GateText(CounterSettings s)
    {
        if (s.Mode == GateMode.Edges)
        {
            return $"{s.GateEdges} periods";
        }

        if (!(s.MainsHz > 0))
        {
            return $"{Num(s.GateSeconds)} s";
        }

        double seconds = MainsGate.GateSecondsFor(s.GateSeconds, s.MainsHz, s.Estimator);
        return $"{Num(seconds, "0.######")} s ({Num(seconds * s.MainsHz, "0.####")} periods of {Num(s.MainsHz)} Hz mains, asked {Num(s.GateSeconds)} s)";
    }

    private static string Num(double value, string format = "R") => value.ToString(format, CultureInfo.InvariantCulture);
}
