using System.Text.Json;
using System.Text.Json.Serialization;
using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// A simulation scene: coil, oscillator, optional beat reference, temperature, targets, sweep, hardware and faults.
/// Built in code (every part has defaults) or read from JSON with snake_case keys (<see cref="Load"/>); unknown keys are
/// errors. <see cref="Validate"/> checks every setting against its allowed range.
/// </summary>
public sealed class Scene
{
    /// <summary>Name of the scene.</summary>
    public string Name { get; set; } = "scene";

    /// <summary>Free text carried into the capture's <c>note</c> (say "invented scenario" for made-up scenes).</summary>
    public string? Note { get; set; }

    /// <summary>Random seed: the same seed gives the same capture. Default 1.</summary>
    public long Seed { get; set; } = 1;

    /// <summary>Capture length, s; null = the sweep plan's length (lead-in, passes, pauses, tail).</summary>
    public double? DurationS { get; set; }

    /// <summary>Capture start written as <c>started_utc</c>, if any.</summary>
    public DateTimeOffset? StartedUtc { get; set; }

    /// <summary>The search coil.</summary>
    public SceneCoil Coil { get; set; } = new();

    /// <summary>The search oscillator (default 100 kHz, also when the object gives neither frequency_hz nor tuning_capacitance_nf).</summary>
    public SceneOscillator Oscillator { get; set; } = new() { FrequencyHz = 100_000 };

    /// <summary>The coil temperature profile (drives the search oscillator's drift).</summary>
    public SceneTemperature Temperature { get; set; } = new();

    /// <summary>Beat mode reference, or null to count the search oscillator.</summary>
    public SceneReference? Reference { get; set; }

    /// <summary>The targets.</summary>
    public List<SceneTarget> Targets { get; set; } = new();

    /// <summary>The sweep.</summary>
    public SceneSweep Sweep { get; set; } = new();

    /// <summary>Counting hardware and capture kind.</summary>
    public SceneHardware Hardware { get; set; } = new();

    /// <summary>Faults to inject.</summary>
    public SceneFaults Faults { get; set; } = new();

    /// <summary>Mains pickup (frequency modulation of the search oscillator), or null (default) for none.</summary>
    public SceneMains? Mains { get; set; }

    /// <summary>JSON options of the scene and truth files: snake_case keys, snake_case enums, comments and trailing commas allowed, unknown keys rejected.</summary>
    public static JsonSerializerOptions JsonOptions { get; } = CreateOptions();

    /// <summary>Reads and validates a scene file. Throws <see cref="SceneException"/> naming the file, line and setting.</summary>
    public static Scene Load(string path)
    {
        string text;
        try
        {
            text = File.ReadAllText(path);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            throw new SceneException($"{path}: cannot read the scene file: {FreqReadout.Host.Commands.FileErrorText.Reason(path, ex)}", ex);
        }

        return Parse(text, path);
    }

    /// <summary>Parses and validates scene JSON; <paramref name="sourceName"/> names it in messages.</summary>
    public static Scene Parse(string json, string sourceName)
    {
        // The shape first, in the file's own terms (path, expected, found); then binding cannot fail on types.
        SceneJsonCheck.Check(json, sourceName);
        Scene? scene;
        try
        {
            scene = JsonSerializer.Deserialize<Scene>(json, JsonOptions);
        }
        catch (JsonException ex)
        {
            string where = ex.LineNumber.HasValue ? $":{ex.LineNumber.Value + 1}" : string.Empty;
            string path = string.IsNullOrEmpty(ex.Path) || ex.Path == "$" ? string.Empty : $" at {ex.Path.TrimStart('$', '.')}";
            throw new SceneException($"{sourceName}{where}: not a valid scene file (JSON, see docs/scene-format.md){path}: {FirstSentence(ex.Message)}", ex);
        }

        if (scene is null)
        {
            throw new SceneException($"{sourceName}: the file holds no scene object");
        }

        if (scene.Oscillator is { FrequencyHz: null, TuningCapacitanceNf: null })
        {
            // An oscillator object with neither key takes the documented default, as a left-out oscillator does.
            scene.Oscillator.FrequencyHz = 100_000;
        }

        scene.Validate(sourceName);
        return scene;
    }

    /// <summary>The scene as indented JSON (the scene file format).</summary>
    public string ToJson() => JsonSerializer.Serialize(this, JsonOptions);

    /// <summary>Checks every setting; throws <see cref="SceneException"/> naming the setting (as its JSON path) and its allowed range.</summary>
    public void Validate(string sourceName = "scene")
    {
        void Fail(string setting, string range, object? got) =>
            throw new SceneException($"{sourceName}: {setting} must be {range} (got {Format(got)})");

        if (Coil is null || Oscillator is null || Temperature is null || Sweep is null || Hardware is null || Faults is null || Targets is null)
        {
            throw new SceneException($"{sourceName}: coil, oscillator, temperature, sweep, hardware, faults and targets may be left out but not null");
        }

        if (!IsOneLine(Name)) Fail("name", "one line of text (no line breaks or control characters)", Name);
        if (Coil.Turns < 1 || Coil.Turns > 100000) Fail("coil.turns", "an integer 1..100000", Coil.Turns);
        if (!(Coil.MeanDiameterM > 0.005 && Coil.MeanDiameterM <= 5)) Fail("coil.mean_diameter_m", "in (0.005, 5] m", Coil.MeanDiameterM);
        if (!(Coil.WireDiameterM > 0 && Coil.WireDiameterM < 0.01)) Fail("coil.wire_diameter_m", "in (0, 0.01) m", Coil.WireDiameterM);
        if (!(Coil.WindingLengthM >= 0 && Coil.WindingLengthM < Coil.MeanDiameterM)) Fail("coil.winding_length_m", "0 (from the wire) or in (0, mean_diameter_m) m", Coil.WindingLengthM);
        if (!(Coil.WindingDepthM >= 0 && Coil.WindingDepthM < Coil.MeanDiameterM / 2)) Fail("coil.winding_depth_m", "0 (from the wire) or in (0, mean_diameter_m / 2) m", Coil.WindingDepthM);

        var o = Oscillator;
        if (o.FrequencyHz.HasValue && o.TuningCapacitanceNf.HasValue) Fail("oscillator.frequency_hz / oscillator.tuning_capacitance_nf", "at most one of the two (neither: frequency_hz 100000)", "both");
        if (o.FrequencyHz.HasValue && !(o.FrequencyHz > 100 && o.FrequencyHz <= 20e6)) Fail("oscillator.frequency_hz", "in (100, 2e7] Hz", o.FrequencyHz);
        if (o.TuningCapacitanceNf.HasValue && !(o.TuningCapacitanceNf > 0.001 && o.TuningCapacitanceNf <= 1e6)) Fail("oscillator.tuning_capacitance_nf", "in (0.001, 1e6] nF", o.TuningCapacitanceNf);
        if (o.TempcoPpmPerK.HasValue && !(Math.Abs(o.TempcoPpmPerK.Value) <= 10000)) Fail("oscillator.tempco_ppm_per_k", "in [-10000, 10000] ppm/K", o.TempcoPpmPerK);
        if (!o.TempcoPpmPerK.HasValue && o.Capacitor == CapacitorDielectric.Custom && !o.CapacitorPpmPerK.HasValue) Fail("oscillator.capacitor_ppm_per_k", "given when oscillator.capacitor is custom", null);
        if (o.CapacitorPpmPerK.HasValue && !(Math.Abs(o.CapacitorPpmPerK.Value) <= 10000)) Fail("oscillator.capacitor_ppm_per_k", "in [-10000, 10000] ppm/K", o.CapacitorPpmPerK);
        if (!(Math.Abs(o.CoilPpmPerK) <= 10000)) Fail("oscillator.coil_ppm_per_k", "in [-10000, 10000] ppm/K", o.CoilPpmPerK);
        if (!(o.NominalTemperatureC > -100 && o.NominalTemperatureC < 200)) Fail("oscillator.nominal_temperature_c", "in (-100, 200) deg C", o.NominalTemperatureC);
        CheckNoise("oscillator", o.WhiteFmAdev1s, o.FlickerAdev, Fail);
        CheckTemperature("temperature", Temperature, Fail);

        if (Reference is not null)
        {
            if (!(Reference.FrequencyHz > 100 && Reference.FrequencyHz <= 20e6)) Fail("reference.frequency_hz", "in (100, 2e7] Hz", Reference.FrequencyHz);
            if (!(Math.Abs(Reference.TempcoPpmPerK) <= 10000)) Fail("reference.tempco_ppm_per_k", "in [-10000, 10000] ppm/K", Reference.TempcoPpmPerK);
            if (!(Reference.NominalTemperatureC > -100 && Reference.NominalTemperatureC < 200)) Fail("reference.nominal_temperature_c", "in (-100, 200) deg C", Reference.NominalTemperatureC);
            CheckNoise("reference", Reference.WhiteFmAdev1s, Reference.FlickerAdev, Fail);
            if (Reference.Temperature is null) Fail("reference.temperature", "an object (or left out)", null);
            CheckTemperature("reference.temperature", Reference.Temperature!, Fail);
        }

        for (int i = 0; i < Targets.Count; i++)
        {
            var t = Targets[i];
            string p = $"targets[{i}]";
            if (t is null) Fail(p, "an object", null);
            if (!IsOneLine(t!.Name)) Fail($"{p}.name", "one line of text (no line breaks or control characters)", t.Name);
            if (!TryResolveMaterial(t!, out _, out string? why)) Fail($"{p}.material", why!, t!.Material);
            if (!(t!.RadiusM > 0 && t.RadiusM <= 1)) Fail($"{p}.radius_m", "in (0, 1] m", t.RadiusM);
            if (!(t.DepthM > t.RadiusM && t.DepthM <= 10)) Fail($"{p}.depth_m", "above radius_m and at most 10 m (the centre lies below the surface)", t.DepthM);
            if (!(Math.Abs(t.PositionM) <= MaxDistanceM)) Fail($"{p}.position_m", "in [-10000, 10000] m", t.PositionM);
            if (!(Math.Abs(t.OffsetM) <= MaxDistanceM)) Fail($"{p}.offset_m", "in [-10000, 10000] m", t.OffsetM);
            if (t.Shape == TargetShape.Pipe && !(t.LengthM >= 2 * t.RadiusM && t.LengthM <= 100)) Fail($"{p}.length_m", "given for a pipe, in [2 radius_m, 100] m", t.LengthM);
        }

        var s = Sweep;
        if (!(Math.Abs(s.StartM) <= MaxDistanceM) || !(Math.Abs(s.EndM) <= MaxDistanceM) || s.StartM == s.EndM) Fail("sweep.start_m / sweep.end_m", "in [-10000, 10000] m and different", $"{Format(s.StartM)} / {Format(s.EndM)}");
        if (!(s.SpeedMPerS > 0 && s.SpeedMPerS <= 20)) Fail("sweep.speed_m_per_s", "in (0, 20] m/s", s.SpeedMPerS);
        if (!(s.HeightM >= 0 && s.HeightM <= 5)) Fail("sweep.height_m", "in [0, 5] m", s.HeightM);
        if (s.Passes < 1 || s.Passes > 10000) Fail("sweep.passes", "an integer 1..10000", s.Passes);
        if (!(s.PauseS >= 0 && s.PauseS <= 1e5)) Fail("sweep.pause_s", "in [0, 1e5] s", s.PauseS);
        if (!(s.LeadInS >= 0 && s.LeadInS <= 1e5)) Fail("sweep.lead_in_s", "in [0, 1e5] s", s.LeadInS);
        if (!(s.TailS >= 0 && s.TailS <= 1e5)) Fail("sweep.tail_s", "in [0, 1e5] s", s.TailS);

        if (s.Legs is not null)
        {
            double lastEnd = double.NegativeInfinity;
            for (int i = 0; i < s.Legs.Count; i++)
            {
                var leg = s.Legs[i];
                string p = $"sweep.legs[{i}]";
                if (leg is null) Fail(p, "an object", null);
                if (!(leg!.StartS >= 0 && leg.StartS <= 1e6) || !(leg.StartS >= lastEnd)) Fail($"{p}.start_s", "in [0, 1e6] s and at or after the previous leg's end", leg.StartS);
                if (!(leg.DurationS > 0 && leg.DurationS <= 1e5)) Fail($"{p}.duration_s", "in (0, 1e5] s", leg.DurationS);
                if (!double.IsFinite(leg.FromM) || !double.IsFinite(leg.ToM) || leg.FromM == leg.ToM) Fail($"{p}.from_m / {p}.to_m", "finite and different", $"{leg.FromM} / {leg.ToM}");
                if (!(Math.Abs(leg.ToM - leg.FromM) / leg.DurationS <= 20)) Fail($"{p}.duration_s", "long enough for a speed of at most 20 m/s", leg.DurationS);
                lastEnd = leg.StartS + leg.DurationS;
            }
        }

        var h = Hardware;
        if (!(h.ClockHz >= 1e3 && h.ClockHz <= 1e10)) Fail("hardware.clock_hz", "in [1e3, 1e10] Hz", h.ClockHz);
        if (!(Math.Abs(h.ClockErrorPpm) <= 1000)) Fail("hardware.clock_error_ppm", "in [-1000, 1000] ppm", h.ClockErrorPpm);
        if (h.Prescale < 1 || h.Prescale > 65536) Fail("hardware.prescale", "an integer 1..65536", h.Prescale);
        if (h.Kind == CaptureKind.Snapshots && h.Prescale != 1) Fail("hardware.prescale", "1 for snapshots (the pulse counter counts every edge)", h.Prescale);
        if (h.TimerBits is not (16 or 24 or 32 or 64)) Fail("hardware.timer_bits", "16, 24, 32 or 64", h.TimerBits);
        if (h.CountBits is not (16 or 24 or 32 or 64)) Fail("hardware.count_bits", "16, 24, 32 or 64", h.CountBits);
        if (h.TimestampMethod == TimestampMethod.Custom && !h.JitterS.HasValue) Fail("hardware.jitter_s", "given when hardware.timestamp_method is custom", null);
        if (h.JitterS.HasValue && !(h.JitterS >= 0 && h.JitterS <= 0.01)) Fail("hardware.jitter_s", "in [0, 0.01] s", h.JitterS);
        if (!(h.SnapshotIntervalS >= 1e-5 && h.SnapshotIntervalS <= 1)) Fail("hardware.snapshot_interval_s", "in [1e-5, 1] s", h.SnapshotIntervalS);
        if (!(h.ReadJitterS >= 0 && h.ReadJitterS <= h.SnapshotIntervalS / 4)) Fail("hardware.read_jitter_s", "in [0, snapshot_interval_s / 4] s", h.ReadJitterS);
        if (h.TempEveryRows < 0 || h.TempEveryRows > 1_000_000_000) Fail("hardware.temp_every_rows", "an integer 0..1000000000 (0 = no temp_c column)", h.TempEveryRows);
        if (!(h.TempResolutionC >= 0 && h.TempResolutionC <= 10)) Fail("hardware.temp_resolution_c", "in [0, 10] deg C", h.TempResolutionC);
        if (!(h.ControlStepS >= 1e-5 && h.ControlStepS <= 0.1)) Fail("hardware.control_step_s", "in [1e-5, 0.1] s", h.ControlStepS);

        if (!(Faults.GlitchesPerS >= 0 && Faults.GlitchesPerS <= 1e4)) Fail("faults.glitches_per_s", "in [0, 1e4] per s", Faults.GlitchesPerS);
        if (!(Faults.DropoutsPerS >= 0 && Faults.DropoutsPerS <= 100)) Fail("faults.dropouts_per_s", "in [0, 100] per s", Faults.DropoutsPerS);
        if (!(Faults.DropoutS > 0 && Faults.DropoutS <= 10)) Fail("faults.dropout_s", "in (0, 10] s", Faults.DropoutS);

        if (Mains is not null)
        {
            if (!(Mains.DeviationPpm >= 0 && Mains.DeviationPpm <= 1e4)) Fail("mains.deviation_ppm", "in [0, 10000] ppm", Mains.DeviationPpm);
            if (!(Mains.FrequencyHz >= 1 && Mains.FrequencyHz <= 1000)) Fail("mains.frequency_hz", "in [1, 1000] Hz", Mains.FrequencyHz);
            if (!double.IsFinite(Mains.PhaseDeg)) Fail("mains.phase_deg", "a finite number of degrees", Mains.PhaseDeg);
            if (Mains.DeviationPpm > 0 && !(h.ControlStepS <= 1.0 / (16.0 * Mains.FrequencyHz))) Fail("hardware.control_step_s", $"at most 1 / (16 mains.frequency_hz) = {1.0 / (16.0 * Mains.FrequencyHz):G4} s with mains pickup", h.ControlStepS);
        }

        if (DurationS.HasValue && !(DurationS > 0 && DurationS <= 86400 * 7)) Fail("duration_s", "in (0, 604800] s", DurationS);
    }

    /// <summary>Resolves a target's material (preset or custom) with overrides; false with the allowed values when unknown.</summary>
    public static bool TryResolveMaterial(SceneTarget target, out Material material, out string? problem)
    {
        problem = null;
        string name = target.Material ?? string.Empty;
        if (name.Trim().Equals("custom", StringComparison.OrdinalIgnoreCase))
        {
            double sigma = target.ConductivitySPerM ?? double.NaN;
            double mur = target.MuR ?? 1.0;
            material = new Material("custom", sigma, mur);
        }
        else if (!MaterialPresets.TryGet(name, target.MuR, out material))
        {
            problem = "one of " + string.Join(", ", MaterialPresets.Names) + " or custom";
            return false;
        }
        else if (target.ConductivitySPerM.HasValue)
        {
            material = material with { ConductivitySPerM = target.ConductivitySPerM.Value };
        }

        if (!(material.ConductivitySPerM > 0 && material.ConductivitySPerM <= 1e9))
        {
            problem = "given with conductivity_s_per_m in (0, 1e9] S/m";
            return false;
        }

        if (!(material.RelativePermeability >= 1 && material.RelativePermeability <= 1e6))
        {
            problem = "given with mu_r in [1, 1e6]";
            return false;
        }

        return true;
    }

    private static void CheckNoise(string owner, double white, double flicker, Action<string, string, object?> fail)
    {
        if (!(white >= 0 && white <= 1e-2)) fail($"{owner}.white_fm_adev_1s", "in [0, 1e-2]", white);
        if (!(flicker >= 0 && flicker <= 1e-2)) fail($"{owner}.flicker_adev", "in [0, 1e-2]", flicker);
    }

    private static void CheckTemperature(string owner, SceneTemperature t, Action<string, string, object?> fail)
    {
        if (!(t.StartC > -100 && t.StartC < 200)) fail($"{owner}.start_c", "in (-100, 200) deg C", t.StartC);
        if (!(t.AmbientC > -100 && t.AmbientC < 200)) fail($"{owner}.ambient_c", "in (-100, 200) deg C", t.AmbientC);
        if (t.Kind == TemperatureProfileKind.Settling && !(t.TimeConstantS > 0 && t.TimeConstantS <= 1e7)) fail($"{owner}.time_constant_s", "in (0, 1e7] s", t.TimeConstantS);
        if (t.Points is null) fail($"{owner}.points", "a list (or left out)", null);
        double last = double.NegativeInfinity;
        for (int i = 0; i < t.Points!.Count; i++)
        {
            var p = t.Points[i];
            if (p is null || !(p.TimeS >= 0 && p.TimeS <= 86400 * 7) || !(p.TimeS > last)) fail($"{owner}.points[{i}].time_s", "increasing, in [0, 604800] s", p?.TimeS);
            if (!(p!.TempC > -100 && p.TempC < 200)) fail($"{owner}.points[{i}].temp_c", "in (-100, 200) deg C", p.TempC);
            last = p.TimeS;
        }

        if ((t.Kind == TemperatureProfileKind.Steps || t.Kind == TemperatureProfileKind.Ramps) && t.Points.Count == 0)
        {
            fail($"{owner}.points", "at least one point for steps or ramps", "none");
        }
    }

    /// <summary>Farthest position along or across the scan line, m.</summary>
    private const double MaxDistanceM = 10000;

    private static bool IsOneLine(string? text) => text is not null && !text.Any(char.IsControl);

    private static string Format(object? v) => v switch
    {
        null => "nothing",
        double d => d.ToString("R", System.Globalization.CultureInfo.InvariantCulture),
        string text => TextExcerpt.Quote(text),
        _ => TextExcerpt.Plain(Convert.ToString(v, System.Globalization.CultureInfo.InvariantCulture) ?? "?"),
    };

    private static string FirstSentence(string message)
    {
        int i = message.IndexOf(" Path:", StringComparison.Ordinal);
        string text = i > 0 ? message[..i] : message;
        int stop = text.IndexOf(". ", StringComparison.Ordinal);
        return (stop > 0 ? text[..stop] : text).TrimEnd('.');
    }

    private static JsonSerializerOptions CreateOptions()
    {
        var options = new JsonSerializerOptions
        {
            PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
            ReadCommentHandling = JsonCommentHandling.Skip,
            AllowTrailingCommas = true,
            WriteIndented = true,
            UnmappedMemberHandling = JsonUnmappedMemberHandling.Disallow,
            DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull,
            NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
            TypeInfoResolver = new System.Text.Json.Serialization.Metadata.DefaultJsonTypeInfoResolver(),
        };
        options.Converters.Add(new JsonStringEnumConverter(JsonNamingPolicy.SnakeCaseLower));
        return options;
    }
}
