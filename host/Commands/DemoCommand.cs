using System.ComponentModel;
using System.Globalization;
using System.Text.Json.Nodes;
using FreqReadout.Host.Demo;
using FreqReadout.Host.Output;
using FreqReadout.Host.Replay;
using FreqReadout.Host.Reports;
using FreqReadout.Readout;
using FreqReadout.Host.Simulation;
using Spectre.Console;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout demo</c>: the main job on built-in invented data. Simulates the floor-scan scene
/// from physics, replays the capture through the device pipeline with replay's default settings,
/// and compares what the readout found with the simulation's truth.
/// </summary>
public sealed class DemoCommand : Command<DemoCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
        [CommandOption("--keep <DIR>")]
        [Description("Keep the simulated capture (floor-demo.csv) and its truth (floor-demo.truth.json) in DIR to replay or count them yourself; existing ones are replaced only when the demo succeeds. Default: a temporary file, deleted afterwards.")]
        [FilePath]
        public string? Keep { get; set; }

        [CommandOption("--report <DIR>")]
        [Description("Also write the report of the demo's replay into DIR (created when missing), as replay --report does: plots as PNG and SVG and report.html, one self-contained page with the plots, summary, events, the simulated passes beside what was found, settings used and cautions. Files of the same names there are replaced. Default: no report.")]
        [FilePath]
        public string? ReportDir { get; set; }

        [CommandOption("--json")]
        [Description("One JSON object on stdout: the replay report plus the pass-by-pass comparison with the truth.")]
        public bool Json { get; set; }

        [CommandOption("--quiet")]
        [Description("No progress display (there is none either when stderr is not a terminal).")]
        public bool Quiet { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        // The capture goes through the output layer either way: kept, it is moved into place (with its truth
        // file) only when the demo succeeded; not kept, its temporary file is read back and then dropped.
        using var outputs = new OutputFileSet { StandardOutputInUse = true };
        OutputFile capture;
        OutputFile? truthOut = null;
        if (settings.Keep != null)
        {
            try
            {
                Directory.CreateDirectory(settings.Keep);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException)
            {
                return CommandOutput.Fail($"--keep {settings.Keep}: cannot create the folder ({e.Message})", CommandOutput.BadInput);
            }

            capture = outputs.AddOutput("--keep", Path.Combine(settings.Keep, "floor-demo.csv"), "the demo capture");
            truthOut = outputs.AddOutput("--keep", Path.Combine(settings.Keep, "floor-demo.truth.json"), "the demo truth file");
        }
        else
        {
            string scratch = Path.Combine(Path.GetTempPath(), $"freqreadout-demo-{Environment.ProcessId}-{Guid.NewGuid():N}.csv");
            capture = outputs.AddOutput("the demo's temporary capture", scratch, "the demo capture");
        }

        capture.RegularFileNeededBecause = DemoRun.ReadBackReason;
        if (!outputs.TryPrepare(out OutputFileException? problem))
        {
            return CommandOutput.Fail(problem!.Message, problem.ExitCode);
        }

        if (settings.ReportDir != null && !ReportFolder.TryCreate(settings.ReportDir, out string? folderError))
        {
            return CommandOutput.Fail(folderError!, CommandOutput.BadInput);
        }

        DemoResult result;
        ReadingTrace? trace = settings.ReportDir != null ? new ReadingTrace() : null;
        try
        {
            result = settings.Quiet || settings.Json || !CommandOutput.ErrorIsTerminal() ? DemoRun.Run(DemoScenes.FloorScan(), DemoSceneName, capture, null, trace, cancellationToken) : RunWithProgress(capture, trace, cancellationToken);
            if (truthOut != null)
            {
                using (var truth = new StreamWriter(truthOut.Stream, new System.Text.UTF8Encoding(false)))
                {
                    truth.Write(result.Truth.ToJson() + "\n");
                }

                outputs.Commit();
            }
        }
        catch (OutputFileException e)
        {
            return CommandOutput.Fail(e.Message, e.ExitCode);
        }

        if (trace != null)
        {
            try
            {
                int files = WriteReport(settings.ReportDir!, result, trace);
                CommandOutput.Diagnostic($"demo: wrote {files} plot files and {ReplayReportPage.FileName} into {settings.ReportDir}");
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                return CommandOutput.Fail($"--report {settings.ReportDir}: {FileErrorText.Reason(settings.ReportDir!, e)}", CommandOutput.BadInput);
            }
        }

        if (settings.Json)
        {
            Console.Out.WriteLine(ToJson(result));
            CommandOutput.Diagnostic(ReplayCommand.Caution); // as replay --json: the caution on stderr
        }
        else
        {
            Print(CommandOutput.Stdout(), result, settings.Keep);
        }

        return 0;
    }

    private const string DemoSceneName = "built-in demo scene";

    private static DemoResult RunWithProgress(OutputFile capture, ReadingTrace? trace, CancellationToken ct)
    {
        DemoResult? result = null;
        var err = CommandOutput.Stderr();
        err.Progress()
            .AutoClear(true)
            .Columns(new TaskDescriptionColumn(), new ProgressBarColumn(), new PercentageColumn())
            .Start(ctx =>
            {
                ProgressTask task = ctx.AddTask("simulating the floor scan, then replaying it");
                result = DemoRun.Run(DemoScenes.FloorScan(), DemoSceneName, capture, new ProgressTaskReporter(task), trace, ct);
                task.Value = task.MaxValue;
            });
        return result!;
    }

    private static string F(double v, string format = "0.000") => v.ToString(format, CultureInfo.InvariantCulture);

    /// <summary>The invented scenario, as the demo introduces it.</summary>
    internal const string ScenarioText =
        "A crew scans a floor screed along a 3 m line with a 180 mm, 45-turn search coil at 100 kHz, looking for a buried copper pipe, " +
        "a small steel fixing and a large steel anchor, while the coil, brought in from a cold van, warms up. " +
        "The readout sees only the capture (edges of the search oscillator divided by 32 on an 80 MHz timer) and runs the device pipeline with replay's defaults.";

    /// <summary>The summary the demo prints: capture, baseline, noise, drift, events (plain text).</summary>
    internal static ReportTable SummaryTable(DemoResult r)
    {
        SimulationTruth t = r.Truth;
        ReplayReport rep = r.Report;
        var summary = new ReportTable("item", "value");
        summary.AddRow("capture", $"{rep.Edges} edges, {F(rep.DurationSeconds, "0.0")} s, {rep.Gates} gates of 0.1 s");
        summary.AddRow("baseline", rep.BaselineHz is double b ? $"{F(b, "0.000")} Hz (nominal {F(t.SearchNominalHz, "0")} Hz)" : "none");
        summary.AddRow("noise", rep.NoiseHz is double n ? $"{F(n, "0.0000")} Hz" + (rep.NoisePpm is double p ? $", {F(p, "0.000")} ppm" : string.Empty) : "none");
        summary.AddRow("drift", rep.DriftHzPerMinute is double d
            ? $"{F(d, "+0.000;-0.000")} Hz/min tracked (coil warming {F(t.TempStartC, "0.0")} -> {F(t.TempEndC, "0.0")} deg C, tempco {F(t.TempcoPpmPerK, "0.00")} ppm/K: {F(t.DriftSearchHz, "+0.00;-0.00")} Hz in all)"
            : "none");
        summary.AddRow("events", $"{rep.Events.Count} (re-baselines: {rep.Rebaselines.Count})");
        return summary;
    }

    /// <summary>The simulated passes and what the readout reported, plain text ("missed" where no event matched).</summary>
    internal static ReportTable PassesTable(DemoResult r)
    {
        var table = new ReportTable("peak s", "target", "sim. Hz", "found Hz", "readout says", "sign rule", "as expected");
        foreach (DemoPassMatch m in r.Matches)
        {
            table.AddRow(F(m.TruthPeakSeconds, "0.0"), m.Target, F(m.TruthPeakShiftHz, "+0.000;-0.000"), m.Event == null ? "missed" : F(m.Event.Event.PeakShiftHz, "+0.000;-0.000"),
                m.Event == null ? "-" : m.Event.ClassName, m.SignRuleClass, m.ClassAsExpected ? "yes" : "no");
        }

        return table;
    }

    private const string SignRuleWarning = "(!) ";

    /// <summary>
    /// What the sign rule makes of each simulated target (plain text): for a target of one material class that reads as
    /// the other, a warning starting "(!) " with the reason (its ferrous crossover lies below the operating frequency);
    /// for the others, one line that it reads as expected.
    /// </summary>
    internal static IReadOnlyList<string> SignRuleNotes(DemoResult r)
    {
        var notes = new List<string>();
        foreach (TargetTruth target in r.Truth.Targets.Where(x => x.MaterialClass != x.SignRuleClass))
        {
            string crossover = target.CrossoverHz is double x ? $"{F(x / 1000, "0.0")} kHz" : "unknown";
            notes.Add(SignRuleWarning + $"{target.Name} is {target.MaterialClass} steel, yet it reads {target.SignRuleClass}: " +
                $"its ferrous crossover is {crossover}, below the 100 kHz operating frequency. Above the crossover the part's own eddy currents outweigh its flux concentration, the coil inductance falls and the search frequency rises, just as for copper. The crossover falls with the square of the part's size, so large iron reads non-ferrous at usual operating frequencies. The sign rule is a heuristic; `freqreadout coil --material carbon_steel --radius-mm R` shows a part's crossover.");
        }

        foreach (TargetTruth target in r.Truth.Targets.Where(x => x.MaterialClass == x.SignRuleClass && x.CrossoverHz is double))
        {
            notes.Add($"{target.Name}: crossover {F(target.CrossoverHz!.Value / 1000, "0.0")} kHz, above the operating frequency, so it reads ferrous as the sign rule expects.");
        }

        return notes;
    }

    /// <summary>Writes the plots and report.html of the demo's replay into <paramref name="folder"/>; returns the number of plot files.</summary>
    private static int WriteReport(string folder, DemoResult r, ReadingTrace trace)
    {
        ReadoutSettings readout = r.Readout!;
        IReadOnlyList<string> plots = ReplayPlots.Write(folder, trace, r.Report, readout.ThresholdSigma);
        ReportPage page = ReplayReportPage.Start(
            "FreqReadout demo report (invented scenario, simulated)",
            new[]
            {
                "An invented scenario, simulated from physics, not a field recording. " + ScenarioText,
                "Times are seconds from the capture's first edge; frequencies and shifts in Hz. The plots are also in this folder as PNG and SVG files.",
            },
            SummaryTable(r),
            r.Report,
            plots);
        int found = r.Matches.Count(m => m.Event != null);
        int right = r.Matches.Count(m => m.ClassAsExpected);
        page.AddTable("Simulated passes and what the readout reported", PassesTable(r),
            $"{found} of {r.Matches.Count} passes found, {right} with the class the sign rule gives; {r.UnmatchedEvents.Count} events matched no simulated pass. sim. Hz: the simulation's peak search shift (truth).");
        page.AddText("The sign rule on these targets", SignRuleNotes(r).ToArray());
        ReplayReportPage.Finish(page, SettingsTable.Of(new SettingsSource("counter", r.Counter!), new SettingsSource("readout", readout)), r.Report.Warnings);
        page.Write(Path.Combine(folder, ReplayReportPage.FileName));
        return plots.Count;
    }

    private static void Print(IAnsiConsole console, DemoResult r, string? keep)
    {
        SimulationTruth t = r.Truth;
        ReplayReport rep = r.Report;
        console.MarkupLine("[bold]FreqReadout demo[/] — an [bold]invented[/] scenario, simulated from physics, not a field recording.");
        console.WriteLine(ScenarioText);
        console.WriteLine();

        var summary = new Table().NoBorder().HideHeaders().AddColumn("k").AddColumn("v");
        foreach (IReadOnlyList<string> row in SummaryTable(r).Rows)
        {
            summary.AddRow(Markup.Escape(row[0]), Markup.Escape(row[1]));
        }

        console.Write(summary);
        console.WriteLine();

        var table = new Table().Border(TableBorder.Simple).Title("simulated passes and what the readout reported")
            .AddColumn(new TableColumn("peak s").RightAligned())
            .AddColumn("target")
            .AddColumn(new TableColumn("sim. Hz").RightAligned())
            .AddColumn(new TableColumn("found Hz").RightAligned())
            .AddColumn("readout says")
            .AddColumn("sign rule");
        foreach (DemoPassMatch m in r.Matches)
        {
            string foundText = m.Event == null ? "[red]missed[/]" : F(m.Event.Event.PeakShiftHz, "+0.000;-0.000");
            string cls = m.Event == null ? "-" : (m.ClassAsExpected ? m.Event.ClassName : $"[red]{m.Event.ClassName}[/]");
            string name = m.MaterialClass == m.SignRuleClass ? Markup.Escape(m.Target) : Markup.Escape(m.Target) + " [yellow](!)[/]";
            table.AddRow(F(m.TruthPeakSeconds, "0.0"), name, F(m.TruthPeakShiftHz, "+0.000;-0.000"), foundText, cls, m.SignRuleClass);
        }

        console.Write(table);
        int found = r.Matches.Count(m => m.Event != null);
        int right = r.Matches.Count(m => m.ClassAsExpected);
        console.WriteLine($"{found} of {r.Matches.Count} passes found, {right} with the class the sign rule gives; {r.UnmatchedEvents.Count} events matched no simulated pass.");
        console.WriteLine();

        foreach (string note in SignRuleNotes(r))
        {
            console.MarkupLine((note.StartsWith(SignRuleWarning, StringComparison.Ordinal) ? "[yellow](!)[/] " + Markup.Escape(note[SignRuleWarning.Length..]) : Markup.Escape(note)));
        }

        foreach (string w in rep.Warnings)
        {
            console.MarkupLine("[grey]note:[/] " + Markup.Escape(w));
        }

        console.WriteLine();
        if (keep != null)
        {
            console.WriteLine($"The capture and its truth are in {keep}: try `freqreadout replay {Path.Combine(keep, "floor-demo.csv")}` or `count` on it.");
        }

        console.WriteLine(ReplayCommand.Caution);
    }

    private static string ToJson(DemoResult r)
    {
        var root = new JsonObject
        {
            ["scenario"] = "invented: floor screed scan for a copper pipe, a small steel fixing and a large steel anchor while the coil warms up (simulated)",
            ["replay"] = JsonNode.Parse(ReplayCommand.ToJson(r.Report)),
        };
        var passes = new JsonArray();
        foreach (DemoPassMatch m in r.Matches)
        {
            passes.Add(new JsonObject
            {
                ["target"] = m.Target,
                ["pass"] = m.Pass,
                ["truth_peak_s"] = m.TruthPeakSeconds,
                ["truth_peak_shift_hz"] = m.TruthPeakShiftHz,
                ["material_class"] = m.MaterialClass,
                ["sign_rule_class"] = m.SignRuleClass,
                ["found"] = m.Event != null,
                ["found_peak_s"] = m.Event?.Event.PeakSeconds,
                ["found_peak_shift_hz"] = m.Event?.Event.PeakShiftHz,
                ["found_class"] = m.Event?.ClassName,
            });
        }

        root["passes"] = passes;
        root["unmatched_events"] = r.UnmatchedEvents.Count;
        return root.ToJsonString();
    }

}
