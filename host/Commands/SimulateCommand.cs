using System.ComponentModel;
using System.Globalization;
using FreqReadout.Host.Captures;
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
        [Description("Scene file (JSON, see host/Scenes/).")]
        public string? Scene { get; set; }

        [CommandOption("--demo")]
        [Description("Use the built-in demo scene (invented floor-scan scenario) instead of --scene.")]
        public bool Demo { get; set; }

        [CommandOption("--out <FILE>")]
        [Description("Capture file to write.")]
        public string? Out { get; set; }

        [CommandOption("--truth <FILE>")]
        [Description("Truth file to write (JSON). Default: the capture path + .truth.json.")]
        public string? Truth { get; set; }

        [CommandOption("--seed <N>")]
        [Description("Random seed (overrides the scene's). Same seed, same capture.")]
        public long? Seed { get; set; }

        [CommandOption("--format <FORMAT>")]
        [Description("text (default) or binary.")]
        public string Format { get; set; } = "text";

        [CommandOption("--kind <KIND>")]
        [Description("edges or snapshots (overrides the scene's hardware.kind; snapshots force prescale 1).")]
        public string? Kind { get; set; }

        [CommandOption("--duration-s <S>")]
        [Description("Capture length, s (overrides the scene's; default the sweep plan's length).")]
        public double? DurationS { get; set; }

        [CommandOption("--mains-ppm <PPM>")]
        [Description("Mains pickup: peak frequency deviation of the search oscillator, ppm, [[0, 10000]] (overrides the scene's mains.deviation_ppm).")]
        public double? MainsPpm { get; set; }

        [CommandOption("--mains-hz <HZ>")]
        [Description("Mains pickup: modulation frequency, Hz, [[1, 1000]], usually 50 or 60 (overrides the scene's mains.frequency_hz; default 50).")]
        public double? MainsHz { get; set; }

        [CommandOption("--save-scene <FILE>")]
        [Description("Also write the effective scene (after overrides) as JSON; with no --out, only that.")]
        public string? SaveScene { get; set; }

        [CommandOption("--quiet")]
        [Description("No progress display.")]
        public bool Quiet { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        Scene scene;
        try
        {
            scene = LoadScene(settings);
        }
        catch (SceneException ex)
        {
            return CommandOutput.Fail(ex.Message, CommandOutput.BadOption);
        }

        if (settings.SaveScene is not null)
        {
            try
            {
                File.WriteAllText(settings.SaveScene, scene.ToJson() + "\n");
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                return CommandOutput.Fail($"{settings.SaveScene}: cannot write the scene file: {FileErrorText.Reason(settings.SaveScene, ex)}", CommandOutput.BadOption);
            }
        }

        if (settings.Out is null)
        {
            return settings.SaveScene is not null ? 0 : CommandOutput.Fail("--out <FILE> is required (the capture to write)", CommandOutput.BadOption);
        }

        string format = settings.Format.Trim().ToLowerInvariant();
        if (format is not ("text" or "binary"))
        {
            return CommandOutput.Fail($"--format must be text or binary (got {settings.Format})", CommandOutput.BadOption);
        }

        SceneModel model;
        try
        {
            model = new SceneModel(scene, settings.Scene ?? "demo scene");
        }
        catch (SceneException ex)
        {
            return CommandOutput.Fail(ex.Message, CommandOutput.BadOption);
        }

        string truthPath = settings.Truth ?? settings.Out + ".truth.json";
        var simulator = new CaptureSimulator(model);
        SimulationTruth truth;
        try
        {
            using var writer = CaptureOutput.Create(settings.Out, simulator.Metadata, format);
            truth = settings.Quiet ? simulator.Run(writer, null, cancellationToken) : RunWithProgress(simulator, writer, cancellationToken);
        }
        catch (ArgumentException ex)
        {
            return CommandOutput.Fail(ex.Message, CommandOutput.BadOption);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return CommandOutput.Fail($"{settings.Out}: cannot write the capture: {FileErrorText.Reason(settings.Out, ex)}", CommandOutput.BadOption);
        }

        try
        {
            File.WriteAllText(truthPath, truth.ToJson() + "\n");
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return CommandOutput.Fail($"{truthPath}: cannot write the truth file: {FileErrorText.Reason(truthPath, ex)}", CommandOutput.BadOption);
        }

        PrintSummary(settings.Out, truthPath, truth);
        return 0;
    }

    /// <summary>Loads the scene (file or demo) and applies the command-line overrides; throws <see cref="SceneException"/>.</summary>
    internal static Scene LoadScene(Settings settings)
    {
        if (settings.Demo == (settings.Scene is not null))
        {
            throw new SceneException("give exactly one of --scene <FILE> and --demo");
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
                    throw new SceneException($"--kind must be edges or snapshots (got {settings.Kind})");
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
            throw new SceneException(ex.Message.Replace("duration_s", "--duration-s"));
        }
        catch (SceneException ex) when (ex.Message.Contains("mains.", StringComparison.Ordinal) && (settings.MainsPpm.HasValue || settings.MainsHz.HasValue))
        {
            throw new SceneException(ex.Message.Replace("mains.deviation_ppm", settings.MainsPpm.HasValue ? "--mains-ppm" : "mains.deviation_ppm")
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
