using System.ComponentModel;
using System.Globalization;
using System.Text.Json;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Planning;
using FreqReadout.Host.Simulation;
using Spectre.Console;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout plan</c>: before soldering, the resolution, update rate and device load of each timestamp method and
/// estimator for the signal to count, what counting the beat note gains, and, with a target, how deep it is seen.
/// </summary>
public sealed class PlanCommand : Command<PlanCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
        [CommandOption("--signal <NAME>")]
        [Description("The signal the device counts: search (the search oscillator, through --search-prescale) or beat (the beat note, through --beat-prescale). Default search.")]
        public string Signal { get; set; } = "search";

        [CommandOption("--search-hz <HZ>")]
        [Description("Search-oscillator frequency, Hz, (100, 2e7]]. Default 100000.")]
        public double SearchHz { get; set; } = 100_000;

        [CommandOption("--beat-hz <HZ>")]
        [Description("Beat-note frequency, Hz, (0, --search-hz). Default 1000.")]
        public double BeatHz { get; set; } = 1_000;

        [CommandOption("--search-prescale <N>")]
        [Description("Divider before the search oscillator, an integer in [[1, 65536]]. Default 1.")]
        public int SearchPrescale { get; set; } = 1;

        [CommandOption("--beat-prescale <N>")]
        [Description("Divider before the beat note, an integer in [[1, 65536]]. Default 1.")]
        public int BeatPrescale { get; set; } = 1;

        [CommandOption("--methods <LIST>")]
        [Description("Timestamp methods, comma separated: pin-event, pulse-counter, edge-capture, custom. Default pin-event,pulse-counter,edge-capture.")]
        public string Methods { get; set; } = "pin-event,pulse-counter,edge-capture";

        [CommandOption("--clock-hz <HZ>")]
        [Description("Timer clock of every preset method, Hz, [[1000, 1e10]]. Default each method's own (pin-event and pulse-counter 1e6, edge-capture 8e7).")]
        public double? ClockHz { get; set; }

        [CommandOption("--custom-jitter-us <US>")]
        [Description("custom method: rms timing jitter per timestamp (or per read), us, [[0, 1e6]]. Default 0.")]
        public double CustomJitterUs { get; set; }

        [CommandOption("--custom-clock-hz <HZ>")]
        [Description("custom method: timer clock, Hz, [[1000, 1e10]]. Default 1000000.")]
        public double CustomClockHz { get; set; } = 1e6;

        [CommandOption("--custom-read-rate-hz <HZ>")]
        [Description("custom method: 0 = edge timestamps, else pulse-counter reads a second, (0, 1e6]]. Default 0.")]
        public double CustomReadRateHz { get; set; }

        [CommandOption("--custom-max-edge-rate-hz <HZ>")]
        [Description("custom method: most edges a second it takes, (0, 1e10]]. Default 1000000.")]
        public double CustomMaxEdgeRateHz { get; set; } = 1e6;

        [CommandOption("--gates-s <LIST>")]
        [Description("Gate times of the resolution table, s, each in [[1e-4, 100]], comma separated. Default 0.01,0.03,0.1,0.3,1.")]
        public string GatesS { get; set; } = "0.01,0.03,0.1,0.3,1";

        [CommandOption("--gate-s <S>")]
        [Description("The gate of the beat comparison and the depth answer, s, [[1e-4, 100]]. Default 0.1 (the readout's default gate).")]
        public double GateS { get; set; } = 0.1;

        [CommandOption("--turns <N>")]
        [Description("Depth answer: coil turns, an integer in [[1, 100000]]. Default 45.")]
        public int? Turns { get; set; }

        [CommandOption("--diameter-mm <MM>")]
        [Description("Depth answer: mean coil diameter, mm, (5, 5000]]. Default 180.")]
        public double? DiameterMm { get; set; }

        [CommandOption("--wire-mm <MM>")]
        [Description("Depth answer: wire diameter, mm, (0, 10). Default 0.5.")]
        public double? WireMm { get; set; }

        [CommandOption("--material <NAME>")]
        [Description("Depth answer: target material (silver, copper, aluminium, brass, cupronickel, stainless, carbon_steel or custom). Default none: no depth answer.")]
        public string? Material { get; set; }

        [CommandOption("--radius-mm <MM>")]
        [Description("Depth answer: target sphere radius, mm, (0, 1000]]. Default 10.")]
        public double RadiusMm { get; set; } = 10;

        [CommandOption("--mu-r <MU>")]
        [Description("Depth answer: relative permeability, [[1, 1e6]]. Default 100 for carbon_steel, 1 for custom.")]
        public double? MuR { get; set; }

        [CommandOption("--conductivity <S_PER_M>")]
        [Description("Depth answer: conductivity, S/m, (0, 1e9]]. Default the material's (required for custom).")]
        public double? Conductivity { get; set; }

        [CommandOption("--height-mm <MM>")]
        [Description("Depth answer: coil plane above the surface, mm, [[0, 5000]]. Default 20.")]
        public double HeightMm { get; set; } = 20;

        [CommandOption("--speed-m-per-s <M_PER_S>")]
        [Description("Depth answer: sweep speed of the coil, m/s, (0, 20]]. Default 0.3.")]
        public double SpeedMPerS { get; set; } = 0.3;

        [CommandOption("--threshold-sigma <SIGMAS>")]
        [Description("Depth answer: detection threshold in noise sigmas, [[1, 1000]] (the readout's threshold_sigma). Default 5.")]
        public double ThresholdSigma { get; set; } = 5;

        [CommandOption("--report <DIR>")]
        [Description("Also write the plots (resolution.png/.svg: resolution against gate per method; depth.png/.svg with a target: shift against depth with the thresholds) and report.html, one self-contained page with the tables and the plots, into DIR, created when missing. Default: no report.")]
        [FilePath]
        public string? ReportDir { get; set; }

        [CommandOption("--json")]
        [Description("Exactly one JSON object on stdout (docs/json-output.md); diagnostics on stderr.")]
        public bool Json { get; set; }
    }

    /// <summary>Compact JSON, every key present (null where a figure does not apply).</summary>
    private static readonly JsonSerializerOptions CompactOptions = new(FreqReadout.Host.Simulation.Scene.JsonOptions)
    {
        WriteIndented = false,
        DefaultIgnoreCondition = System.Text.Json.Serialization.JsonIgnoreCondition.Never,
    };

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        PlanInputs inputs;
        try
        {
            inputs = Inputs(settings);
        }
        catch (SceneException ex)
        {
            return CommandOutput.Fail(ex.Message, CommandOutput.BadOption);
        }
        catch (ArgumentOutOfRangeException ex) when (ex.ParamName == "deltaInductanceH")
        {
            return CommandOutput.Fail(
                $"a {Fmt(settings.RadiusMm)} mm target this close changes the coil's inductance by more than the model allows (dL/L <= -1): " +
                "the small-dipole model does not hold; give a smaller --radius-mm", CommandOutput.BadOption);
        }
        catch (ArgumentOutOfRangeException ex)
        {
            string why = ex.Message.Split('\n')[0];
            int cut = why.IndexOf(" (Parameter", StringComparison.Ordinal);
            return CommandOutput.Fail($"the coil cannot be built from --turns, --diameter-mm and --wire-mm given: {(cut > 0 ? why[..cut] : why)}", CommandOutput.BadOption);
        }

        PlanReport report;
        try
        {
            report = PlanBuilder.Build(inputs);
        }
        catch (ArgumentOutOfRangeException ex) when (ex.ParamName == "deltaInductanceH")
        {
            return CommandOutput.Fail(
                $"a {Fmt(settings.RadiusMm)} mm target this close changes the coil's inductance by more than the model allows (dL/L <= -1): " +
                "the small-dipole model does not hold; give a smaller --radius-mm", CommandOutput.BadOption);
        }

        if (settings.ReportDir != null)
        {
            try
            {
                if (!FreqReadout.Host.Reports.ReportFolder.TryCreate(settings.ReportDir, out string? folderError))
                {
                    return CommandOutput.Fail(folderError!, CommandOutput.BadInput);
                }

                IReadOnlyList<string> files = new FreqReadout.Host.Reports.PlanPlots().Write(settings.ReportDir, report);
                string page = FreqReadout.Host.Reports.PlanReportPage.Write(settings.ReportDir, inputs, report, files);
                CommandOutput.Diagnostic($"plan: wrote {files.Count} plot files and {Path.GetFileName(page)} into {settings.ReportDir}");
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                return CommandOutput.Fail($"--report {settings.ReportDir}: {FileErrorText.Reason(settings.ReportDir, e)}", CommandOutput.BadInput);
            }
        }

        if (settings.Json)
        {
            Console.Out.WriteLine(JsonSerializer.Serialize(report, CompactOptions));
            if (report.Depth != null)
            {
                CommandOutput.Diagnostic(DepthCaution); // docs/json-output.md: with --json the caution goes to stderr
            }

            return 0;
        }

        Print(report);
        return 0;
    }

    /// <summary>The caution shown with a depth answer (on stdout, or on stderr with --json).</summary>
    internal const string DepthCaution =
        "A small or absent shift is not proof that nothing is there: isolate circuits and verify with an approved voltage tester before drilling or cutting; " +
        "check utility records and local locating services before digging; follow local codes and licensed practice.";

    /// <summary>A short number for the tables: plain digits from 0.001 to 1e6, three significant digits, else exponent form.</summary>
    internal static string Num(double v)
    {
        var ci = CultureInfo.InvariantCulture;
        double a = Math.Abs(v);
        if (double.IsNaN(v))
        {
            return "-";
        }

        if (a == 0)
        {
            return "0";
        }

        if (a >= 1e6 || a < 1e-3)
        {
            return v.ToString("0.##e0", ci);
        }

        if (a >= 100)
        {
            return v.ToString("0", ci);
        }

        int decimals = Math.Max(0, 2 - (int)Math.Floor(Math.Log10(a)));
        return v.ToString("F" + decimals, ci);
    }

    private static string Fmt(double v) => v.ToString("G6", CultureInfo.InvariantCulture);

    /// <summary>Checks the options and turns them into the planner's inputs; a bad value throws <see cref="SceneException"/> naming the option, its range and the value.</summary>
    internal static PlanInputs Inputs(Settings s)
    {
        string signal = s.Signal.Trim().ToLowerInvariant();
        if (signal != "search" && signal != "beat")
        {
            throw SceneException.Usage($"--signal must be search or beat (got {OptionValues.Quote(s.Signal)})");
        }

        if (!(s.SearchHz > 100 && s.SearchHz <= 2e7))
        {
            throw SceneException.Usage($"--search-hz must be in (100, 2e7] Hz (got {Fmt(s.SearchHz)})");
        }

        if (!(s.BeatHz > 0 && s.BeatHz < s.SearchHz))
        {
            throw SceneException.Usage($"--beat-hz must be in (0, {Fmt(s.SearchHz)}) Hz, below --search-hz (got {Fmt(s.BeatHz)})");
        }

        CheckPrescale("--search-prescale", s.SearchPrescale);
        CheckPrescale("--beat-prescale", s.BeatPrescale);
        if (s.ClockHz is double clock && !(clock >= 1e3 && clock <= 1e10))
        {
            throw SceneException.Usage($"--clock-hz must be in [1000, 1e10] Hz (got {Fmt(clock)})");
        }

        if (!(s.GateS >= 1e-4 && s.GateS <= 100))
        {
            throw SceneException.Usage($"--gate-s must be in [1e-4, 100] s (got {Fmt(s.GateS)})");
        }

        var gates = new List<double>();
        foreach (string part in s.GatesS.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            if (!double.TryParse(part, NumberStyles.Float, CultureInfo.InvariantCulture, out double g) || !(g >= 1e-4 && g <= 100))
            {
                throw SceneException.Usage($"--gates-s must be a comma-separated list of gate times in [1e-4, 100] s (got {OptionValues.Quote(part)})");
            }

            if (gates.Contains(g))
            {
                throw SceneException.Usage($"--gates-s names {Fmt(g)} s twice"); // as --methods: a repeated gate only repeats rows
            }

            gates.Add(g);
        }

        if (gates.Count == 0)
        {
            throw SceneException.Usage("--gates-s must list at least one gate time");
        }

        var methods = new List<TimestampPreset>();
        foreach (string part in s.Methods.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            TimestampPreset method;
            if (part.Equals(TimestampPresets.Custom, StringComparison.OrdinalIgnoreCase))
            {
                method = Custom(s);
            }
            else if (TimestampPresets.TryGet(part, out TimestampPreset? preset))
            {
                method = s.ClockHz is double c ? preset!.WithClock(c) : preset!;
            }
            else
            {
                throw SceneException.Usage($"--methods must list pin-event, pulse-counter, edge-capture or custom, comma separated (got {OptionValues.Quote(part)})");
            }

            if (methods.Exists(m => m.Name == method.Name))
            {
                throw SceneException.Usage($"--methods names {method.Name} twice");
            }

            methods.Add(method);
        }

        if (methods.Count == 0)
        {
            throw SceneException.Usage("--methods must list at least one method");
        }

        if (!methods.Exists(m => m.Name == TimestampPresets.Custom) && (s.CustomJitterUs != 0 || s.CustomClockHz != 1e6 || s.CustomReadRateHz != 0 || s.CustomMaxEdgeRateHz != 1e6))
        {
            throw SceneException.Usage("the --custom-* options describe the custom method: add custom to --methods");
        }

        return new PlanInputs
        {
            Signal = signal,
            SearchHz = s.SearchHz,
            BeatHz = s.BeatHz,
            SearchPrescale = s.SearchPrescale,
            BeatPrescale = s.BeatPrescale,
            Methods = methods,
            GatesS = gates,
            GateS = s.GateS,
            Target = Target(s),
        };
    }

    private static void CheckPrescale(string option, int value)
    {
        if (!(value >= 1 && value <= 65536))
        {
            throw SceneException.Usage($"{option} must be an integer in [1, 65536] (got {value.ToString(CultureInfo.InvariantCulture)})");
        }
    }

    private static TimestampPreset Custom(Settings s)
    {
        if (!(s.CustomJitterUs >= 0 && s.CustomJitterUs <= 1e6))
        {
            throw SceneException.Usage($"--custom-jitter-us must be in [0, 1e6] us (got {Fmt(s.CustomJitterUs)})");
        }

        if (!(s.CustomClockHz >= 1e3 && s.CustomClockHz <= 1e10))
        {
            throw SceneException.Usage($"--custom-clock-hz must be in [1000, 1e10] Hz (got {Fmt(s.CustomClockHz)})");
        }

        if (!(s.CustomReadRateHz >= 0 && s.CustomReadRateHz <= 1e6))
        {
            throw SceneException.Usage($"--custom-read-rate-hz must be 0 (edge timestamps) or in (0, 1e6] reads a second (got {Fmt(s.CustomReadRateHz)})");
        }

        if (!(s.CustomMaxEdgeRateHz > 0 && s.CustomMaxEdgeRateHz <= 1e10))
        {
            throw SceneException.Usage($"--custom-max-edge-rate-hz must be in (0, 1e10] edges a second (got {Fmt(s.CustomMaxEdgeRateHz)})");
        }

        bool snapshots = s.CustomReadRateHz > 0;
        return new TimestampPreset(
            TimestampPresets.Custom,
            snapshots ? CaptureKind.Snapshots : CaptureKind.Edges,
            s.CustomJitterUs * 1e-6,
            s.CustomClockHz,
            s.CustomReadRateHz,
            s.CustomMaxEdgeRateHz,
            snapshots ? "custom pulse-counter reads" : "custom edge timestamps");
    }

    private static PlanTarget? Target(Settings s)
    {
        if (s.Material is null)
        {
            if (s.MuR.HasValue || s.Conductivity.HasValue)
            {
                throw SceneException.Usage("--mu-r and --conductivity describe a target: give --material too");
            }

            if (s.Turns.HasValue || s.DiameterMm.HasValue || s.WireMm.HasValue || s.RadiusMm != 10 || s.HeightMm != 20 || s.SpeedMPerS != 0.3 || s.ThresholdSigma != 5)
            {
                throw SceneException.Usage("--turns, --diameter-mm, --wire-mm, --radius-mm, --height-mm, --speed-m-per-s and --threshold-sigma are for the depth answer: give --material too");
            }

            return null;
        }

        if (!(s.SpeedMPerS > 0 && s.SpeedMPerS <= 20))
        {
            throw SceneException.Usage($"--speed-m-per-s must be in (0, 20] m/s (got {Fmt(s.SpeedMPerS)})");
        }

        if (!(s.ThresholdSigma >= 1 && s.ThresholdSigma <= 1000))
        {
            throw SceneException.Usage($"--threshold-sigma must be in [1, 1000] (got {Fmt(s.ThresholdSigma)})");
        }

        // The coil command's own checks and figures (its option names and ranges are the same).
        CoilReport coil = CoilCommand.Build(new CoilCommand.Settings
        {
            Turns = s.Turns,
            DiameterMm = s.DiameterMm,
            WireMm = s.WireMm,
            FrequencyHz = s.SearchHz,
            Material = s.Material,
            RadiusMm = s.RadiusMm,
            MuR = s.MuR,
            Conductivity = s.Conductivity,
            HeightMm = s.HeightMm,
            Depths = "100",
        });
        var target = new SceneTarget { Material = s.Material, MuR = s.MuR, ConductivitySPerM = s.Conductivity };
        if (!FreqReadout.Host.Simulation.Scene.TryResolveMaterial(target, out Material material, out _))
        {
            throw SceneException.Usage($"--material is not one the coil command knows (got {OptionValues.Quote(s.Material)})");
        }

        return new PlanTarget
        {
            Coil = new SearchCoil(coil.Turns, coil.MeanDiameterM, coil.WindingLengthM, coil.WindingDepthM, coil.WireDiameterM),
            InductanceH = coil.InductanceUsedUh * 1e-6,
            Material = material,
            RadiusM = s.RadiusMm / 1000,
            HeightM = s.HeightMm / 1000,
            SpeedMPerS = s.SpeedMPerS,
            ThresholdSigma = s.ThresholdSigma,
        };
    }

    /// <summary>The rows of a shared table into a console table of the same columns (text escaped for markup).</summary>
    private static void AddRows(Table table, FreqReadout.Host.Reports.ReportTable rows)
    {
        foreach (IReadOnlyList<string> row in rows.Rows)
        {
            table.AddRow(row.Select(Markup.Escape).ToArray());
        }
    }

    private static void Print(PlanReport r)
    {
        var console = CommandOutput.Stdout();
        var ci = CultureInfo.InvariantCulture;
        bool beat = r.Signal == "beat";
        double counted = beat ? r.BeatHz : r.SearchHz;
        int prescale = beat ? r.BeatPrescale : r.SearchPrescale;
        console.MarkupLine(Markup.Escape(string.Create(ci,
            $"counting the {(beat ? "beat note" : "search oscillator")}: {counted:G6} Hz through a prescaler of {prescale} (search oscillator {r.SearchHz:G6} Hz, beat note {r.BeatHz:G6} Hz)")));

        var methods = new Table().Title("timestamp methods").AddColumn("method").AddColumn("input")
            .AddColumn(new TableColumn("jitter us rms").RightAligned()).AddColumn(new TableColumn("tick us").RightAligned())
            .AddColumn(new TableColumn("reads/s").RightAligned()).AddColumn(new TableColumn("max edges/s").RightAligned());
        foreach (TimestampPreset m in r.Methods)
        {
            methods.AddRow(
                Markup.Escape(m.Name),
                m.Input == CaptureKind.Snapshots ? "snapshots" : "edges",
                Num(m.JitterS * 1e6),
                Num(1e6 / m.ClockHz),
                m.Input == CaptureKind.Snapshots ? Num(m.ReadRateHz) : "every edge",
                Num(m.MaxEdgeRateHz));
        }

        console.Write(methods);

        console.MarkupLine("resolution: predicted standard deviation of a gate's frequency; device %: share of 1 M and of 5 M IL operations a second");
        foreach (TimestampPreset m in r.Methods)
        {
            bool snapshots = m.Input == CaptureKind.Snapshots;
            foreach (string estimator in m.Estimators)
            {
                var table = new Table().Border(TableBorder.Simple).Title($"{Markup.Escape(m.Name)}, {estimator}")
                    .AddColumn(new TableColumn("gate s").RightAligned())
                    .AddColumn(new TableColumn("Hz").RightAligned())
                    .AddColumn(new TableColumn("ppm").RightAligned())
                    .AddColumn(new TableColumn("updates/s").RightAligned())
                    .AddColumn(new TableColumn(snapshots ? "reads/s" : "edges/s").RightAligned())
                    .AddColumn(new TableColumn("% 1M").RightAligned())
                    .AddColumn(new TableColumn("% 5M").RightAligned())
                    .AddColumn("verdict");
                foreach (PlanRow row in r.Rows.Where(x => x.Method == m.Name && x.Estimator == estimator))
                {
                    table.AddRow(
                        Num(row.GateS),
                        Num(row.ResolutionHz),
                        Num(row.ResolutionPpm),
                        Num(row.UpdatesPerS),
                        Num(row.ServiceRatePerS),
                        Num(row.BudgetPctAtLowRate),
                        Num(row.BudgetPctAtHighRate),
                        row.Verdict);
                }

                console.Write(table);
                foreach (var group in r.Rows.Where(x => x.Method == m.Name && x.Estimator == estimator && x.Warnings.Count > 0).GroupBy(x => x.Verdict))
                {
                    PlanRow worst = group.OrderByDescending(x => x.BudgetPctAtLowRate).First();
                    string gates = string.Join(", ", group.Select(x => Num(x.GateS)));
                    string which = group.Count() > 1 ? $" (figures of the worst, {Num(worst.GateS)} s)" : string.Empty;
                    console.MarkupLine(Markup.Escape($"{(group.Key == "ok" ? "note" : "warning")}: gate {gates} s{which}: {string.Join("; ", worst.Warnings)}"));
                }
            }
        }

        console.MarkupLine("[grey]device %: taking the edges or reads and closing the gates (hardware-notes/device-budget.md, Release table: case 1 less EdgeCounter.CloseGate per edge, CloseGate per gate; case 10 per read, case 3 less case 10 per gate). The readout's own work per gate and the display come on top.[/]");

        var gains = new Table().Title(string.Create(ci, $"beat note ({r.BeatHz:G6} Hz, /{r.BeatPrescale}) against the search oscillator ({r.SearchHz:G6} Hz, /{r.SearchPrescale}), gate {r.GateS:G3} s"))
            .AddColumn("method").AddColumn("estimator")
            .AddColumn(new TableColumn("search Hz").RightAligned())
            .AddColumn(new TableColumn("beat Hz").RightAligned())
            .AddColumn(new TableColumn("gain x").RightAligned());
        AddRows(gains, FreqReadout.Host.Reports.PlanTables.BeatGains(r));

        console.Write(gains);
        foreach (string w in r.Warnings)
        {
            console.MarkupLine(Markup.Escape("warning: " + w));
        }

        console.MarkupLine("[grey]the beat note also carries the reference oscillator's drift, its sign depends on the tuning side, and near zero beat the two oscillators pull or lock together.[/]");
        if (r.Depth is not { } d)
        {
            return;
        }

        console.MarkupLine(Markup.Escape(string.Create(ci,
            $"depth: a {d.Material} sphere of radius {d.RadiusM * 1000:0.#} mm ({d.SignRuleClass} by the sign rule) passed straight under a {d.CoilDiameterM * 1000:0} mm coil {d.HeightM * 1000:0} mm above the surface at {d.SpeedMPerS:G3} m/s; seen where the largest gate reading of a pass ({d.GateS:G3} s gates) reaches {d.ThresholdSigma:G3} x the gate noise")));
        var depth = new Table().Border(TableBorder.Simple).Title("how deep this target is seen")
            .AddColumn("method").AddColumn("estimator")
            .AddColumn(new TableColumn("noise Hz").RightAligned())
            .AddColumn(new TableColumn("threshold Hz").RightAligned())
            .AddColumn(new TableColumn("depth mm").RightAligned())
            .AddColumn(new TableColumn("pass s").RightAligned());
        AddRows(depth, FreqReadout.Host.Reports.PlanTables.Depth(d));

        console.Write(depth);
        if (d.Rows.Exists(x => x.Smeared))
        {
            console.MarkupLine("warning: * the gate is longer than half the pass (the time the shift stays above half its peak): the peak is smeared; shorten the gate or sweep slower");
        }

        console.MarkupLine("[grey]none: not seen even 1.5 radii down; >: still seen at the deepest depth modelled. Depth of the target centre below the surface, target on the sweep line, the largest gate reading of a pass averaged over where the gate boundaries fall. The oscillator's own noise and drift are not in these figures (measure them with stability), and the readout's tracked noise rises when passes over a target just below the threshold count as noise, so a target near the limit reads a little shallower. A model, not a promise: soil, orientation and shape change it.[/]");
        console.MarkupLine("[grey]" + Markup.Escape(DepthCaution) + "[/]");
    }
}
