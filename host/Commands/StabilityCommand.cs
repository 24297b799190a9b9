using System.ComponentModel;
using System.Globalization;
using System.Text.Json;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Stability;
using Spectre.Console;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout stability &lt;capture&gt; [--shortest-pass-s S] [--json]</c>: the overlapping and modified Allan
/// deviation of the counted signal over averaging times in octave steps, from the phase that an edge capture's
/// timestamps give directly (<see cref="EdgePhase"/>, <see cref="StabilityAnalysis"/>), with 68.3 % intervals, the
/// noise type each local slope suggests, the averaging time with the smallest deviation, and the gate it recommends:
/// that time, capped at half the shortest coil pass the user expects (a longer gate smears a pass). Meant for a
/// capture with no target near the coil.
/// </summary>
public sealed class StabilityCommand : Command<StabilityCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
        [CommandArgument(0, "<capture>")]
        [Description("An edge capture (text or binary, picked by content) taken with no target near the coil; - reads standard input.")]
        [FilePath(StandardInput = true)]
        public string Capture { get; set; } = string.Empty;

        [CommandOption("--shortest-pass-s <S>")]
        [Description("The shortest coil pass over a target you expect, s, (0, 3600]]: the recommended gate is at most half of it. Default 1.")]
        public double? ShortestPassSeconds { get; set; }

        [CommandOption("--report <DIR>")]
        [Description("Also write the deviation plot (deviation.png and deviation.svg, log-log with the 68.3 % intervals) and report.html (one self-contained page: summary, plot, deviation table, settings, cautions) into DIR, created when missing; files of those names there are replaced. Default: no report.")]
        [FilePath]
        public string? ReportDir { get; set; }

        [CommandOption("--json")]
        [Description("Exactly one JSON object on stdout (docs/json-output.md); diagnostics on stderr.")]
        public bool Json { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        double pass = settings.ShortestPassSeconds ?? 1.0;
        if (!(pass > 0 && pass <= 3600))
        {
            return CommandOutput.Fail($"--shortest-pass-s must be in (0, 3600] seconds, got {pass.ToString("R", CultureInfo.InvariantCulture)}", CommandOutput.BadOption);
        }

        if (settings.ReportDir != null && !FreqReadout.Host.Reports.ReportFolder.TryCreate(settings.ReportDir, out string? folderError))
        {
            return CommandOutput.Fail(folderError!, CommandOutput.BadInput);
        }

        int openError = CommandOutput.TryOpenCapture(settings.Capture, out ICaptureReader? opened);
        if (opened == null)
        {
            return openError;
        }

        EdgePhase phase;
        using (ICaptureReader reader = opened)
        {
            try
            {
                if (!EdgePhase.TryRead(reader, out EdgePhase? read, out string? error))
                {
                    return CommandOutput.Fail(error!, CommandOutput.BadInput);
                }

                phase = read!;
            }
            catch (CaptureFormatException e)
            {
                return CommandOutput.Fail(e.Message, CommandOutput.BadInput);
            }
        }

        cancellationToken.ThrowIfCancellationRequested();
        StabilityAnalysis analysis = StabilityAnalysis.Of(phase.X, phase.Tau0Seconds);
        StabilityPoint? lowest = analysis.Lowest();
        StabilityPoint? gate = analysis.Lowest(pass / 2);
        if (settings.ReportDir != null)
        {
            try
            {
                IReadOnlyList<string> files = FreqReadout.Host.Reports.StabilityPlot.Write(settings.ReportDir, analysis);
                string page = FreqReadout.Host.Reports.StabilityReportPage.Write(settings.ReportDir, settings.Capture, phase, analysis, lowest, gate, pass, files);
                CommandOutput.Diagnostic($"stability: wrote {files.Count} plot files and {Path.GetFileName(page)} into {settings.ReportDir}");
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                return CommandOutput.Fail($"--report {settings.ReportDir}: {FileErrorText.Reason(settings.ReportDir, e)}", CommandOutput.BadInput);
            }
        }

        if (settings.Json)
        {
            Console.Out.WriteLine(ToJson(phase, analysis, lowest, gate, pass));
            return ExitCodes.Ok;
        }

        var console = CommandOutput.Stdout();
        console.WriteLine($"{settings.Capture}: {phase.Edges} edges, counted signal {Num(phase.CountedHz, "0.###")} Hz, phase points every {Num(phase.Tau0Seconds * 1e6, "0.###")} us");
        var table = new Table();
        FreqReadout.Host.Reports.ReportTable rows = FreqReadout.Host.Reports.StabilityReportPage.DeviationTable(phase, analysis);
        table.AddColumns(rows.Headers.Select(Markup.Escape).ToArray());
        foreach (IReadOnlyList<string> row in rows.Rows)
        {
            table.AddRow(row.Select(Markup.Escape).ToArray());
        }

        console.Write(table);
        if (lowest != null)
        {
            console.WriteLine($"smallest ADEV {Num(lowest.Adev, "0.000E+00")} ({Num(lowest.Adev * phase.CountedHz, "G4")} Hz) at tau {Num(lowest.TauSeconds, "G4")} s");
        }

        console.WriteLine(gate != null
            ? $"recommended gate: {Num(gate.TauSeconds, "G4")} s (the smallest ADEV at or below half the shortest pass, {Num(pass / 2, "G4")} s)"
            : $"recommended gate: none (no averaging time at or below half the shortest pass, {Num(pass / 2, "G4")} s, could be analysed)");
        console.WriteLine(MeaningNote);
        return ExitCodes.Ok;
    }

    private static string ToJson(EdgePhase phase, StabilityAnalysis analysis, StabilityPoint? lowest, StabilityPoint? gate, double pass)
    {
        using var stream = new MemoryStream();
        using (var w = new Utf8JsonWriter(stream))
        {
            w.WriteStartObject();
            w.WriteNumber("edges", phase.Edges);
            w.WriteNumber("counted_hz", phase.CountedHz);
            w.WriteNumber("tau0_s", phase.Tau0Seconds);
            w.WriteNumber("points", analysis.Points);
            w.WriteStartArray("rows");
            foreach (StabilityPoint r in analysis.Rows)
            {
                w.WriteStartObject();
                w.WriteNumber("tau_s", r.TauSeconds);
                w.WriteNumber("m", r.M);
                JsonValues.NumberOrNull(w, "adev", r.Adev);
                JsonValues.NumberOrNull(w, "adev_low", r.AdevLow);
                JsonValues.NumberOrNull(w, "adev_high", r.AdevHigh);
                JsonValues.NumberOrNull(w, "adev_hz", r.Adev * phase.CountedHz);
                JsonValues.NumberOrNull(w, "mdev", r.Mdev);
                JsonValues.NumberOrNull(w, "edf", r.Edf);
                w.WriteString("noise", NoiseWord(r.Noise));
                w.WriteEndObject();
            }

            w.WriteEndArray();
            JsonValues.NumberOrNull(w, "lowest_tau_s", lowest?.TauSeconds ?? double.NaN);
            JsonValues.NumberOrNull(w, "lowest_adev", lowest?.Adev ?? double.NaN);
            w.WriteNumber("shortest_pass_s", pass);
            JsonValues.NumberOrNull(w, "recommended_gate_s", gate?.TauSeconds ?? double.NaN);
            w.WriteEndObject();
        }

        return System.Text.Encoding.UTF8.GetString(stream.ToArray());
    }

    /// <summary>What the numbers mean, printed under the table and shown on the report page.</summary>
    public const string MeaningNote = "Deviations are fractional (of the counted frequency), from a capture meant to have no target near the coil; the timer's tick sets a floor (white phase noise) at short tau.";

    /// <summary>The word for a noise type, as the table and the JSON show it.</summary>
    public static string NoiseWord(NoiseType noise) => noise switch
    {
        NoiseType.WhitePhase => "white PM",
        NoiseType.FlickerPhase => "flicker PM",
        NoiseType.WhiteFrequency => "white FM",
        NoiseType.FlickerFrequency => "flicker FM",
        NoiseType.RandomWalkFrequency => "random-walk FM",
        _ => "-",
    };

    private static string Num(double v, string format) => double.IsFinite(v) ? v.ToString(format, CultureInfo.InvariantCulture) : "-";
}
