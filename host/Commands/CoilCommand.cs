using System.ComponentModel;
using System.Globalization;
using System.Text.Json;
using FreqReadout.Host.Simulation;
using Spectre.Console;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout coil</c>: a search coil's figures (Wheeler and thin-loop inductance side by side, frequency or capacitance)
/// and, for a chosen target, its expected shift against distance on the coil axis and its ferrous crossover frequency.
/// </summary>
public sealed class CoilCommand : Command<CoilCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
        [CommandOption("--scene <FILE>")]
        [Description("Take coil and oscillator from a scene file (docs/scene-format.md; options below override). Default: none, the coil and frequency of the options below.")]
        [FilePath]
        public string? Scene { get; set; }

        [CommandOption("--turns <N>")]
        [Description("Turns, an integer in [[1, 100000]] (default 45).")]
        public int? Turns { get; set; }

        [CommandOption("--diameter-mm <MM>")]
        [Description("Mean winding diameter, mm, (5, 5000]] (default 180).")]
        public double? DiameterMm { get; set; }

        [CommandOption("--winding-length-mm <MM>")]
        [Description("Axial winding length, mm, [[0, diameter); 0 = from the wire (default).")]
        public double? WindingLengthMm { get; set; }

        [CommandOption("--winding-depth-mm <MM>")]
        [Description("Radial winding depth, mm, [[0, diameter / 2); 0 = from the wire (default).")]
        public double? WindingDepthMm { get; set; }

        [CommandOption("--wire-mm <MM>")]
        [Description("Wire diameter, mm, (0, 10) (default 0.5).")]
        public double? WireMm { get; set; }

        [CommandOption("--inductance-model <MODEL>")]
        [Description("wheeler (default) or thin_loop: which L sets the frequency.")]
        public string? InductanceModel { get; set; }

        [CommandOption("--frequency-hz <HZ>")]
        [Description("Operating frequency, Hz, (100, 2e7]] (the capacitance follows). Default 100000.")]
        public double? FrequencyHz { get; set; }

        [CommandOption("--capacitance-nf <NF>")]
        [Description("Tuning capacitance, nF, (0.001, 1e6]] (the frequency follows). Default: none, the capacitance follows the frequency.")]
        public double? CapacitanceNf { get; set; }

        [CommandOption("--material <NAME>")]
        [Description("Target material: silver, copper, aluminium, brass, cupronickel, stainless, carbon_steel or custom. Default: none, the coil figures only.")]
        public string? Material { get; set; }

        [CommandOption("--radius-mm <MM>")]
        [Description("Target sphere radius, mm, (0, 1000]] (default 10).")]
        public double RadiusMm { get; set; } = 10;

        [CommandOption("--mu-r <MU>")]
        [Description("Relative permeability, [[1, 1e6]] (carbon steel default 100; custom default 1).")]
        public double? MuR { get; set; }

        [CommandOption("--conductivity <S_PER_M>")]
        [Description("Conductivity, S/m, (0, 1e9]] (required for custom; overrides a preset). Default: the material's.")]
        public double? Conductivity { get; set; }

        [CommandOption("--depths-mm <LIST>")]
        [Description("Target-centre depths below the surface, mm, each in [[0, 100000]], comma separated, target on the coil axis (default 20,50,80,100,150,200,300).")]
        public string Depths { get; set; } = "20,50,80,100,150,200,300";

        [CommandOption("--height-mm <MM>")]
        [Description("Height of the coil plane above the surface, mm, [[0, 5000]] (default 0).")]
        public double HeightMm { get; set; }

        [CommandOption("--json")]
        [Description("One JSON object on stdout (snake_case keys with units).")]
        public bool Json { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        CoilReport report;
        try
        {
            report = Build(settings);
        }
        catch (SceneException ex)
        {
            return CommandOutput.Fail(ex.Message, ex.CommandLine ? CommandOutput.BadOption : CommandOutput.BadInput);
        }
        catch (ArgumentOutOfRangeException ex) when (ex.ParamName != "deltaInductanceH")
        {
            // A coil that cannot be wound as given (e.g. --turns of --wire-mm make a bundle wider than the coil).
            string why = ex.Message.Split('\n')[0];
            int cut = why.IndexOf(" (Parameter", StringComparison.Ordinal);
            return CommandOutput.Fail($"the coil cannot be built from --turns, --diameter-mm, --wire-mm and the winding options given: {(cut > 0 ? why[..cut] : why)}", CommandOutput.BadOption);
        }
        catch (ArgumentOutOfRangeException)
        {
            // The inductance change reached -L or beyond (LcResonance): the target overlaps the coil's field so much
            // that the small-dipole model gives no frequency at all.
            return CommandOutput.Fail(
                $"a {Fmt(settings.RadiusMm)} mm target at these --depths-mm changes the coil's inductance by more than the model allows " +
                "(dL/L <= -1): the small-dipole model does not hold this close; give a smaller --radius-mm or larger --depths-mm", CommandOutput.BadOption);
        }

        if (settings.Json)
        {
            Console.Out.WriteLine(JsonSerializer.Serialize(report, CompactOptions));
            if (report.Target != null)
            {
                CommandOutput.Diagnostic(PlanCommand.DepthCaution); // docs/json-output.md: with --json the caution goes to stderr
            }

            return 0;
        }

        Print(report);
        return 0;
    }

    /// <summary>Compact JSON with every key present: a figure that does not apply is null, never left out (docs/json-output.md).</summary>
    private static readonly JsonSerializerOptions CompactOptions = new(FreqReadout.Host.Simulation.Scene.JsonOptions)
    {
        WriteIndented = false,
        DefaultIgnoreCondition = System.Text.Json.Serialization.JsonIgnoreCondition.Never,
    };

    /// <summary>Builds the report from the settings; throws <see cref="SceneException"/> naming the option and its range.</summary>
    internal static CoilReport Build(Settings s)
    {
        var coil = new SceneCoil();
        var osc = new SceneOscillator { FrequencyHz = 100_000 };
        if (s.Scene is not null)
        {
            var scene = FreqReadout.Host.Simulation.Scene.Load(s.Scene);
            coil = scene.Coil;
            osc = scene.Oscillator;
            osc.FrequencyHz = osc.FrequencyOrDefaultHz(); // an oscillator object that gives neither runs at the default frequency
        }

        CheckMm("--diameter-mm", s.DiameterMm, 5, 5000, "(5, 5000] mm", zeroAllowed: false);
        CheckMm("--wire-mm", s.WireMm, 0, 10, "(0, 10) mm", zeroAllowed: false, upperOpen: true);
        double diameterMm = s.DiameterMm ?? coil.MeanDiameterM * 1000;
        CheckMm("--winding-length-mm", s.WindingLengthMm, 0, diameterMm, $"0 (from the wire) or (0, {Fmt(diameterMm)}) mm, below the diameter", zeroAllowed: true, upperOpen: true);
        CheckMm("--winding-depth-mm", s.WindingDepthMm, 0, diameterMm / 2, $"0 (from the wire) or (0, {Fmt(diameterMm / 2)}) mm, below half the diameter", zeroAllowed: true, upperOpen: true);
        if (s.Turns.HasValue) coil.Turns = s.Turns.Value;
        if (s.DiameterMm.HasValue) coil.MeanDiameterM = s.DiameterMm.Value / 1000;
        if (s.WindingLengthMm.HasValue) coil.WindingLengthM = s.WindingLengthMm.Value / 1000;
        if (s.WindingDepthMm.HasValue) coil.WindingDepthM = s.WindingDepthMm.Value / 1000;
        if (s.WireMm.HasValue) coil.WireDiameterM = s.WireMm.Value / 1000;
        if (s.InductanceModel is not null)
        {
            coil.InductanceModel = s.InductanceModel.Trim().ToLowerInvariant() switch
            {
                "wheeler" => Simulation.InductanceModel.Wheeler,
                "thin_loop" or "thin-loop" => Simulation.InductanceModel.ThinLoop,
                _ => throw SceneException.Usage($"--inductance-model must be wheeler or thin_loop (got {OptionValues.Quote(s.InductanceModel)})"),
            };
        }

        if (s.FrequencyHz.HasValue && s.CapacitanceNf.HasValue)
        {
            throw SceneException.Usage("give --frequency-hz or --capacitance-nf, not both");
        }

        if (s.FrequencyHz.HasValue)
        {
            osc.FrequencyHz = s.FrequencyHz;
            osc.TuningCapacitanceNf = null;
        }
        else if (s.CapacitanceNf.HasValue)
        {
            osc.TuningCapacitanceNf = s.CapacitanceNf;
            osc.FrequencyHz = null;
        }

        if (osc.FrequencyHz.HasValue && !(osc.FrequencyHz > 100 && osc.FrequencyHz <= 20e6))
        {
            throw SceneException.Usage($"--frequency-hz must be in (100, 2e7] Hz (got {Fmt(osc.FrequencyHz.Value)})");
        }

        if (osc.TuningCapacitanceNf.HasValue && !(osc.TuningCapacitanceNf > 0.001 && osc.TuningCapacitanceNf <= 1e6))
        {
            throw SceneException.Usage($"--capacitance-nf must be in (0.001, 1e6] nF (got {Fmt(osc.TuningCapacitanceNf.Value)})");
        }

        // Coil geometry checks with option names.
        var probe = new FreqReadout.Host.Simulation.Scene { Coil = coil, Oscillator = new SceneOscillator { FrequencyHz = 100_000 } };
        try
        {
            probe.Validate("coil");
        }
        catch (SceneException ex)
        {
            throw SceneException.Usage(ex.Message
                .Replace("coil.turns", "--turns").Replace("coil.mean_diameter_m", "--diameter-mm (as metres)")
                .Replace("coil.wire_diameter_m", "--wire-mm (as metres)").Replace("coil.winding_length_m", "--winding-length-mm (as metres)")
                .Replace("coil.winding_depth_m", "--winding-depth-mm (as metres)"));
        }

        Material? material = null;
        if (s.Material is not null)
        {
            if (!(s.RadiusMm > 0 && s.RadiusMm <= 1000))
            {
                throw SceneException.Usage($"--radius-mm must be in (0, 1000] mm (got {Fmt(s.RadiusMm)})");
            }

            if (s.Conductivity.HasValue && !(s.Conductivity > 0 && s.Conductivity <= 1e9))
            {
                throw SceneException.Usage($"--conductivity must be in (0, 1e9] S/m (got {Fmt(s.Conductivity.Value)})");
            }

            if (s.MuR.HasValue && !(s.MuR >= 1 && s.MuR <= 1e6))
            {
                throw SceneException.Usage($"--mu-r must be in [1, 1e6] (got {Fmt(s.MuR.Value)})");
            }

            if (s.Material.Trim().Equals("custom", StringComparison.OrdinalIgnoreCase) && !s.Conductivity.HasValue)
            {
                throw SceneException.Usage("--material custom needs --conductivity <S_PER_M>, in (0, 1e9] S/m (and --mu-r, default 1)");
            }

            var target = new SceneTarget { Material = s.Material, MuR = s.MuR, ConductivitySPerM = s.Conductivity };
            if (!FreqReadout.Host.Simulation.Scene.TryResolveMaterial(target, out Material m, out string? why))
            {
                throw SceneException.Usage($"--material must be {why!.Replace("conductivity_s_per_m", "--conductivity").Replace("mu_r", "--mu-r")} (got {OptionValues.Quote(s.Material)})");
            }

            material = m;
        }
        else if (s.MuR.HasValue || s.Conductivity.HasValue)
        {
            throw SceneException.Usage("--mu-r and --conductivity describe a target: give --material too");
        }

        if (!(s.HeightMm >= 0 && s.HeightMm <= 5000))
        {
            throw SceneException.Usage($"--height-mm must be in [0, 5000] mm (got {Fmt(s.HeightMm)})");
        }

        var depths = new List<double>();
        foreach (string part in s.Depths.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            if (!double.TryParse(part, NumberStyles.Float, CultureInfo.InvariantCulture, out double mm) || !(mm >= 0 && mm <= 100_000) || mm + s.HeightMm <= 0)
            {
                throw SceneException.Usage($"--depths-mm must be a comma-separated list of depths in [0, 100000] mm, not all zero with --height-mm 0 (got {OptionValues.Quote(part)})");
            }

            depths.Add(mm / 1000);
        }

        if (depths.Count == 0)
        {
            throw SceneException.Usage("--depths-mm must list at least one depth");
        }

        var searchCoil = coil.ToSearchCoil();
        return CoilReport.Create(searchCoil, coil.InductanceModel, osc.FrequencyHz, osc.TuningCapacitanceNf * 1e-9, material, s.RadiusMm / 1000, depths, s.HeightMm / 1000);
    }

    private static string Fmt(double v) => v.ToString("G6", CultureInfo.InvariantCulture);

    /// <summary>Checks a length option in millimetres against its range, naming the option as the user typed it.</summary>
    private static void CheckMm(string option, double? valueMm, double lowMm, double highMm, string range, bool zeroAllowed, bool upperOpen = false)
    {
        if (valueMm is not double v)
        {
            return;
        }

        bool ok = (zeroAllowed && v == 0) || (v > lowMm && (upperOpen ? v < highMm : v <= highMm));
        if (!ok)
        {
            throw SceneException.Usage($"{option} must be {range} (got {Fmt(v)})");
        }
    }

    private static void Print(CoilReport r)
    {
        var console = CommandOutput.Stdout();
        var ci = CultureInfo.InvariantCulture;
        var coil = new Table().Title("search coil").AddColumn("figure").AddColumn(new TableColumn("value").RightAligned());
        coil.AddRow("turns", r.Turns.ToString(ci));
        coil.AddRow("mean diameter", (r.MeanDiameterM * 1000).ToString("F1", ci) + " mm");
        coil.AddRow("winding length x depth", $"{(r.WindingLengthM * 1000).ToString("F2", ci)} x {(r.WindingDepthM * 1000).ToString("F2", ci)} mm");
        coil.AddRow("inductance, Wheeler multilayer", r.InductanceWheelerUh.ToString("F2", ci) + " uH");
        coil.AddRow("inductance, thin loop (round bundle)", r.InductanceThinLoopUh.ToString("F2", ci) + " uH");
        coil.AddRow("thin loop vs Wheeler", r.InductanceDifferencePct.ToString("+0.00;-0.00", ci) + " %");
        coil.AddRow("frequency (" + r.InductanceModel + ")", r.FrequencyHz.ToString("F1", ci) + " Hz");
        coil.AddRow("tuning capacitance", r.CapacitanceNf.ToString("F4", ci) + " nF");
        console.Write(coil);
        if (Math.Abs(r.InductanceDifferencePct) > 2)
        {
            console.MarkupLine("the two inductances differ by more than 2 %: Wheeler's formula is meant for windings whose length and depth are comparable terms; " +
                "for a compact bundle it stays finite as the bundle shrinks while the true inductance grows as ln(8R/a), so the thin-loop figure is the better guide. " +
                (r.InductanceModel == "thin_loop" ? "The figures here use it." : "The figures here use " + r.InductanceModel + "; add --inductance-model thin_loop to base them on the thin loop."));
        }

        if (r.Target is not { } t)
        {
            return;
        }

        console.MarkupLine(Markup.Escape(
            $"target: {t.Material} sphere, radius {(t.RadiusM * 1000).ToString("F1", ci)} mm, sigma {t.ConductivitySPerM.ToString("G3", ci)} S/m, mu_r {t.MuR.ToString("G4", ci)}; " +
            $"skin depth {(t.SkinDepthM * 1000).ToString("F3", ci)} mm; M/(2 pi a^3) = {t.PolarizabilityRe.ToString("F5", ci)} {(t.PolarizabilityIm < 0 ? "-" : "+")} {Math.Abs(t.PolarizabilityIm).ToString("F5", ci)}i"));
        if (t.CrossoverHz is double fx)
        {
            string side = t.AboveCrossover == true
                ? "the operating frequency is ABOVE it: this iron part raises the frequency and the sign rule reads it as non-ferrous"
                : "the operating frequency is below it: the part lowers the frequency and reads ferrous";
            console.MarkupLine(Markup.Escape($"ferrous crossover of this part: {(fx / 1000).ToString("F2", ci)} kHz; {side}"));
        }
        else
        {
            console.MarkupLine("non-magnetic: no crossover; the frequency rises at every operating frequency");
        }

        var table = new Table().Title($"expected shift, target on the coil axis, coil {(t.HeightM * 1000).ToString("F0", ci)} mm above the surface")
            .AddColumn(new TableColumn("depth mm").RightAligned())
            .AddColumn(new TableColumn("distance mm").RightAligned())
            .AddColumn(new TableColumn("radii").RightAligned())
            .AddColumn(new TableColumn("dL nH").RightAligned())
            .AddColumn(new TableColumn("shift Hz").RightAligned())
            .AddColumn(new TableColumn("shift ppm").RightAligned());
        foreach (var row in t.Table)
        {
            table.AddRow(
                (row.DepthM * 1000).ToString("F0", ci),
                (row.DistanceM * 1000).ToString("F0", ci),
                row.DistanceRadii.ToString("F1", ci) + (row.DistanceRadii < 10 ? "*" : ""),
                row.InductanceChangeNh.ToString("G4", ci),
                row.ShiftHz.ToString("G4", ci),
                row.ShiftPpm.ToString("G4", ci));
        }

        console.Write(table);
        if (t.Table.Exists(x => x.DistanceRadii < 10))
        {
            console.MarkupLine("* closer than about 10 target radii: the small-dipole model is stretched there, figures approximate");
        }

        console.MarkupLine("[grey]" + Markup.Escape(PlanCommand.DepthCaution) + "[/]");
    }
}
