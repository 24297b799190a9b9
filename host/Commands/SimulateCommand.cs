using System.ComponentModel;
using System.Globalization;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Output;
using FreqReadout.Host.Simulation;
using Spectre.Console;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout simulate</c>: a capture from physics (scene file or the built-in demo scene) plus a truth file.
/// </summary>
public sealed class SimulateCommand : Command<SimulateCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
        [CommandOption("--scene <FILE>")]
        [Description("Scene file (JSON; format in docs/scene-format.md, examples in host/Scenes/). Required unless --demo.")]
        [FilePath]
        public string? Scene { get; set; }

        [CommandOption("--demo")]
        [Description("Use the built-in demo scene (invented floor-scan scenario) instead of --scene.")]
        public bool Demo { get; set; }

        [CommandOption("--out <FILE>")]
        [Description("Capture file to write (an existing file is replaced only when the whole run succeeds). A long run states its expected size and time first, and is refused when it would not fit in the free space of the folder. Required unless --save-scene.")]
        [FilePath]
        public string? Out { get; set; }

        [CommandOption("--truth <FILE>")]
        [Description("Truth file to write (JSON). Default: the capture path + .truth.json. Checked and written with the capture: never the scene file or another output.")]
        [FilePath]
        public string? Truth { get; set; }

        [CommandOption("--seed <N>")]
        [Description("Random seed, any whole number from -9223372036854775808 to 9223372036854775807 (overrides the scene's). Same seed, same capture. Default: the scene's seed.")]
        public long? Seed { get; set; }

        [CommandOption("--format <FORMAT>")]
        [Description("text (default) or binary.")]
        public string Format { get; set; } = "text";

        [CommandOption("--kind <KIND>")]
        [Description("edges or snapshots (overrides the scene's hardware.kind; snapshots force prescale 1). Default: the scene's.")]
        public string? Kind { get; set; }

        [CommandOption("--duration-s <S>")]
        [Description("Capture length, s, (0, 604800]] (overrides the scene's; default the sweep plan's length).")]
        public double? DurationS { get; set; }

        [CommandOption("--mains-ppm <PPM>")]
        [Description("Mains pickup: peak frequency deviation of the search oscillator, ppm, [[0, 10000]] (overrides the scene's mains.deviation_ppm). Default: the scene's.")]
        public double? MainsPpm { get; set; }

        [CommandOption("--mains-hz <HZ>")]
        [Description("Mains pickup: modulation frequency, Hz, [[1, 1000]], usually 50 or 60 (overrides the scene's mains.frequency_hz; default 50).")]
        public double? MainsHz { get; set; }

        [CommandOption("--save-scene <FILE>")]
        [Description("Also write the effective scene (after overrides) as JSON; with no --out, only that. Default: none.")]
        [FilePath]
        public string? SaveScene { get; set; }

        [CommandOption("--quiet")]
        [Description("No progress display (there is none either when stderr is not a terminal).")]
        public bool Quiet { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        string format = settings.Format.Trim().ToLowerInvariant();
        if (format is not ("text" or "binary"))
        {
            return CommandOutput.Fail($"--format must be text or binary (got {OptionValues.Quote(settings.Format)})", CommandOutput.BadOption);
        }

        // Every output is checked, and opened as a temporary file, before the scene is even read: none may be
        // the scene file or another output, every folder must exist, and nothing is replaced unless all succeed.
        using var outputs = new OutputFileSet { StandardOutputInUse = true };
        outputs.AddInput("the scene file --scene", settings.Scene);
        OutputFile? sceneOut = settings.SaveScene is not null ? outputs.AddOutput("--save-scene", settings.SaveScene, "the scene file") : null;
        OutputFile? captureOut = settings.Out is not null ? outputs.AddOutput("--out", settings.Out, "the capture") : null;
        string? truthPath = settings.Out is null ? null : settings.Truth ?? settings.Out + ".truth.json";
        OutputFile? truthOut = truthPath is not null ? outputs.AddOutput("--truth", truthPath, "the truth file") : null;
        if (captureOut is null && sceneOut is null)
        {
            return CommandOutput.Fail("--out <FILE> is required (the capture to write)", CommandOutput.BadOption);
        }

        if (!outputs.TryPrepare(out OutputFileException? problem))
        {
            return CommandOutput.Fail(problem!.Message, problem.ExitCode);
        }

        Scene scene;
        SceneModel? model = null;
        try
        {
            scene = LoadScene(settings);
            if (captureOut is not null)
            {
                model = new SceneModel(scene, settings.Scene ?? "demo scene");
            }
        }
        catch (SceneException ex)
        {
            return CommandOutput.Fail(ex.Message, ex.CommandLine ? CommandOutput.BadOption : CommandOutput.BadInput);
        }

        try
        {
            if (sceneOut is not null)
            {
                WriteText(sceneOut, scene.ToJson() + "\n");
            }

            if (model is null || captureOut is null || truthOut is null)
            {
                outputs.Commit();
                return 0;
            }

            var captureFormat = format == "binary" ? CaptureFileFormat.Binary : CaptureFileFormat.Text;
            var estimate = SimulationEstimate.Measure(model, captureFormat, cancellationToken);
            if (estimate.IsLong)
            {
                if (captureOut.TryGetFreeBytes(out long free) && estimate.CaptureBytes > free)
                {
                    string folder = Path.GetDirectoryName(captureOut.TargetPath) ?? captureOut.TargetPath;
                    return CommandOutput.Fail(
                        $"--out {settings.Out}: the capture would need {estimate.Describe(format)}, but {folder} has only {SimulationEstimate.Bytes(free)} free; " +
                        $"shorten it (--duration-s, duration_s), {(format == "text" ? "write --format binary, " : string.Empty)}or write to a larger disk (nothing written)",
                        CommandOutput.BadInput);
                }

                if (!settings.Quiet)
                {
                    CommandOutput.Diagnostic($"simulate: {estimate.Describe(format)}");
                }
            }

            var simulator = new CaptureSimulator(model);
            SimulationTruth truth;
            using (var writer = CaptureOutput.Create(captureOut.Stream, simulator.Metadata, format))
            {
                truth = settings.Quiet || !CommandOutput.ErrorIsTerminal() ? simulator.Run(writer, null, cancellationToken) : RunWithProgress(simulator, writer, cancellationToken);
            }

            WriteText(truthOut, truth.ToJson() + "\n");
            outputs.Commit();
            PrintSummary(settings.Out!, truthPath!, truth);
            return 0;
        }
        catch (OutputFileException ex)
        {
            return CommandOutput.Fail(ex.Message, ex.ExitCode);
        }
        catch (ArgumentException ex)
        {
            string note = outputs.UnchangedNote();
            return CommandOutput.Fail(ex.Message + (note.Length > 0 ? $" ({note})" : string.Empty), CommandOutput.BadInput);
        }
    }

    private static void WriteText(OutputFile file, string text)
    {
        using var writer = new StreamWriter(file.Stream, new System.Text.UTF8Encoding(false));
        writer.Write(text);
    }

    /// <summary>Loads the scene (file or demo) and applies the command-line overrides; throws <see cref="SceneException"/>.</summary>
    internal static Scene LoadScene(Settings settings)
    {
        if (settings.Demo == (settings.Scene is not null))
        {
            throw SceneException.Usage("give exactly one of --scene <FILE> and --demo");
        }

        var scene = settings.Demo ? DemoScenes.FloorScan() : FreqReadout.Host.Simulation.Scene.Load(settings.Scene!);
        if (settings.Seed.HasValue)
        {
            scene.Seed = settings.Seed.Value;
        }

        if (settings.DurationS.HasValue)
        {
            scene.DurationS = settings.DurationS;
        }

        if (settings.Kind is not null)
        {
            switch (settings.Kind.Trim().ToLowerInvariant())
            {
                case "edges":
                    scene.Hardware.Kind = CaptureKind.Edges;
                    break;
                case "snapshots":
                    scene.Hardware.Kind = CaptureKind.Snapshots;
                    scene.Hardware.Prescale = 1;
                    break;
                default:
                    throw SceneException.Usage($"--kind must be edges or snapshots (got {OptionValues.Quote(settings.Kind)})");
            }
        }

        if (settings.MainsPpm.HasValue || settings.MainsHz.HasValue)
        {
            scene.Mains ??= new SceneMains();
            if (settings.MainsPpm.HasValue)
            {
                scene.Mains.DeviationPpm = settings.MainsPpm.Value;
            }

            if (settings.MainsHz.HasValue)
            {
                scene.Mains.FrequencyHz = settings.MainsHz.Value;
            }
        }

        string name = settings.Scene ?? "demo scene";
        try
        {
            scene.Validate(name);
        }
        catch (SceneException ex) when (settings.DurationS.HasValue && ex.Message.Contains("duration_s", StringComparison.Ordinal))
        {
            throw SceneException.Usage(ex.Message.Replace("duration_s", "--duration-s"));
        }
        catch (SceneException ex) when (ex.Message.Contains("mains.", StringComparison.Ordinal) && (settings.MainsPpm.HasValue || settings.MainsHz.HasValue))
        {
            throw SceneException.Usage(ex.Message.Replace("mains.deviation_ppm", settings.MainsPpm.HasValue ? "--mains-ppm" : "mains.deviation_ppm")
                .Replace("mains.frequency_hz", settings.MainsHz.HasValue ? "--mains-hz" : "mains.frequency_hz"));
        }

        return scene;
    }

    private static SimulationTruth RunWithProgress(CaptureSimulator simulator, ICaptureWriter writer, CancellationToken ct)
    {
        SimulationTruth? truth = null;
        CommandOutput.Stderr().Progress()
            .AutoClear(true)
            .Columns(new TaskDescriptionColumn(), new ProgressBarColumn(), new PercentageColumn(), new RemainingTimeColumn())
            .Start(ctx =>
            {
                var task = ctx.AddTask("simulating", maxValue: 1.0);
                truth = simulator.Run(writer, new ProgressTaskReporter(task), ct);
                task.Value = 1.0;
            });
        return truth!;
    }

    /// <summary>A shift with its sign and three decimals (scientific below a millihertz), so the column lines up.</summary>
    private static string SignedHz(double hz)
    {
        var ci = CultureInfo.InvariantCulture;
        string text = hz != 0 && Math.Abs(hz) < 0.001 ? hz.ToString("+0.00E+0;-0.00E+0", ci) : hz.ToString("+0.000;-0.000;0.000", ci);
        return text;
    }

    private static void PrintSummary(string capturePath, string truthPath, SimulationTruth t)
    {
        var console = CommandOutput.Stdout();
        var ci = CultureInfo.InvariantCulture;
        console.MarkupLine(Markup.Escape(
            $"wrote {capturePath}: {t.Rows.ToString(ci)} rows ({t.Kind}), {t.DurationS.ToString("F1", ci)} s, signal {t.Signal}" +
            (t.BeatSide is null ? string.Empty : $" (beat_side {t.BeatSide})") +
            $", search oscillator {t.SearchNominalHz.ToString("F1", ci)} Hz; truth in {truthPath}"));
        if (t.GlitchCount > 0 || t.DropoutCount > 0)
        {
            console.MarkupLine(Markup.Escape($"injected: {t.GlitchCount} glitches, {t.DropoutCount} dropouts"));
        }

        if (t.Targets.Count > 0)
        {
            var table = new Table().AddColumn("target").AddColumn("material").AddColumn("sign rule")
                .AddColumn(new TableColumn("peak shift Hz").RightAligned()).AddColumn(new TableColumn("crossover kHz").RightAligned());
            foreach (var target in t.Targets)
            {
                double peak = target.Passes.Count > 0 ? target.Passes[0].PeakSearchShiftHz : 0;
                table.AddRow(
                    Markup.Escape(target.Name),
                    target.MaterialClass,
                    target.SignRuleClass + (target.SignRuleClass != target.MaterialClass ? " (!)" : string.Empty),
                    SignedHz(peak),
                    target.CrossoverHz is double fx ? (fx / 1000).ToString("F2", ci) : "-");
            }

            console.Write(table);
            foreach (var target in t.Targets)
            {
                if (target.SignRuleClass != target.MaterialClass)
                {
                    console.MarkupLine(Markup.Escape($"(!) {target.Name}: {target.Explanation}"));
                }
            }
        }

        foreach (string w in t.Warnings)
        {
            Console.Error.WriteLine("warning: " + w);
        }
    }

}
