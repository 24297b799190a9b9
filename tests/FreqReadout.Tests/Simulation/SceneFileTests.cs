using FreqReadout.Host.Captures;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Simulation;

public class SceneFileTests
{
    internal static string RepoRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir != null && !File.Exists(Path.Combine(dir.FullName, "FreqReadout.sln")))
        {
            dir = dir.Parent;
        }

        Assert.True(dir != null, "FreqReadout.sln not found above " + AppContext.BaseDirectory);
        return dir!.FullName;
    }

    [Fact]
    public void ShippedDemoScene_EqualsTheFactory()
    {
        string path = Path.Combine(RepoRoot(), "host", "Scenes", "demo-floor-scan.json");
        var fromFile = Scene.Load(path);
        Assert.Equal(DemoScenes.FloorScan().ToJson(), fromFile.ToJson());
    }

    [Fact]
    public void AllShippedScenes_LoadAndSimulateBriefly()
    {
        foreach (string path in Directory.GetFiles(Path.Combine(RepoRoot(), "host", "Scenes"), "*.json"))
        {
            var scene = Scene.Load(path);
            Assert.Contains("invented", scene.Note);
            scene.DurationS = 0.2;
            var truth = new CaptureSimulator(new SceneModel(scene, path)).Run(new MemoryCaptureWriter(keep: false));
            Assert.True(truth.Rows > 10, path);
        }
    }

    [Fact]
    public void RoundTrip_CodeToJsonToCode()
    {
        var scene = DemoScenes.FloorScan();
        scene.Reference = new SceneReference { FrequencyHz = 100_500, Temperature = new SceneTemperature { Kind = TemperatureProfileKind.Ramps, Points = { new() { TimeS = 5, TempC = 25 } } } };
        scene.Hardware.Kind = CaptureKind.Snapshots;
        scene.Hardware.Prescale = 1;
        var back = Scene.Parse(scene.ToJson(), "mem");
        Assert.Equal(scene.ToJson(), back.ToJson());
        Assert.Equal(CaptureKind.Snapshots, back.Hardware.Kind);
        Assert.Equal(100_500, back.Reference!.FrequencyHz);
    }

    [Fact]
    public void UnknownKey_IsAnErrorNamingFileLineAndKey()
    {
        string json = "{\n  \"name\": \"x\",\n  \"coil\": { \"turnz\": 3 }\n}";
        var ex = Assert.Throws<SceneException>(() => Scene.Parse(json, "bad.json"));
        Assert.Contains("bad.json", ex.Message);
        Assert.Contains("bad.json:3:", ex.Message); // file:line, as every user error
        Assert.Contains("turnz", ex.Message);
    }

    [Fact]
    public void BadValue_NamesTheSettingAndItsRange()
    {
        string json = "{ \"sweep\": { \"speed_m_per_s\": -1 } }";
        var ex = Assert.Throws<SceneException>(() => Scene.Parse(json, "bad.json"));
        Assert.Equal("bad.json: sweep.speed_m_per_s must be in (0, 20] m/s (got -1)", ex.Message);

        ex = Assert.Throws<SceneException>(() => Scene.Parse("{ \"targets\": [ { \"material\": \"gold\" } ] }", "t.json"));
        Assert.Contains("targets[0].material must be one of silver, copper, aluminium, brass, cupronickel, stainless, carbon_steel or custom", ex.Message);

        ex = Assert.Throws<SceneException>(() => Scene.Parse("{ \"oscillator\": { \"frequency_hz\": 1e5, \"tuning_capacitance_nf\": 3 } }", "o.json"));
        Assert.Contains("at most one of the two", ex.Message);

        ex = Assert.Throws<SceneException>(() => Scene.Parse("{ \"hardware\": { \"timer_bits\": 20 } }", "h.json"));
        Assert.Contains("hardware.timer_bits must be 16, 24, 32 or 64 (got 20)", ex.Message);

        ex = Assert.Throws<SceneException>(() => Scene.Parse("{ \"targets\": [ { \"shape\": \"pipe\" } ] }", "p.json"));
        Assert.Contains("targets[0].length_m must be given for a pipe", ex.Message);
    }

    [Fact]
    public void CustomMaterial_NeedsConductivity()
    {
        var ex = Assert.Throws<SceneException>(() => Scene.Parse("{ \"targets\": [ { \"material\": \"custom\", \"mu_r\": 50 } ] }", "c.json"));
        Assert.Contains("conductivity_s_per_m", ex.Message);
        var ok = Scene.Parse("{ \"targets\": [ { \"material\": \"custom\", \"mu_r\": 50, \"conductivity_s_per_m\": 2e6 } ] }", "c.json");
        Assert.True(Scene.TryResolveMaterial(ok.Targets[0], out Material m, out _));
        Assert.Equal(2e6, m.ConductivitySPerM);
        Assert.True(m.IsFerrous);
    }

    [Fact]
    public void MaterialPresets_AreTheHandbookTable()
    {
        // docs/references.md "Materials and temperature" (20 deg C), CRC Handbook values from memory: a separate table from the check values.
        (string Name, double Sigma)[] expected =
        {
            ("silver", 6.30e7), ("copper", 5.96e7), ("aluminium", 3.77e7), ("brass", 1.41e7),
            ("cupronickel", 5.2e6), ("stainless", 1.45e6), ("carbon_steel", 6.99e6),
        };
        foreach (var (name, sigma) in expected)
        {
            Assert.True(MaterialPresets.TryGet(name, null, out Material m));
            Assert.Equal(sigma, m.ConductivitySPerM);
            Assert.Equal(name == "carbon_steel" ? 100.0 : 1.0, m.RelativePermeability);
        }

        Assert.True(MaterialPresets.TryGet("steel", 250, out Material s));
        Assert.Equal(250, s.RelativePermeability);
    }

    [Theory]
    [InlineData("{\n  \"coil\": {\n    \"turns\": \"many\"\n  }\n}", "s.json:3: coil.turns: expected a whole number, found the text 'many'")]
    [InlineData("{ \"coil\": { \"turns\": 4.5 } }", "s.json:1: coil.turns: expected a whole number, found the number 4.5")]
    [InlineData("{ \"coil\": { \"turns\": 99999999999 } }", "s.json:1: coil.turns: expected a whole number of a size the setting can hold, found the number 99999999999")]
    [InlineData("{\n \"targets\": { \"name\": \"pipe\" }\n}", "s.json:2: targets: expected a list [ ... ], found an object { ... }")]
    [InlineData("{ \"targets\": [ {}, { \"shape\": \"cube\" } ] }", "s.json:1: targets[1].shape: expected one of \"sphere\", \"pipe\", found the text 'cube'")]
    [InlineData("{ \"hardware\": null }", "s.json:1: hardware: expected an object { ... } (or leave the key out for its default), found null")]
    [InlineData("{ \"sweep\": { \"alternate\": \"yes\" } }", "s.json:1: sweep.alternate: expected true or false, found the text 'yes'")]
    [InlineData("{ \"seed\": \"1\" }", "s.json:1: seed: expected a whole number, found the text '1'")]
    [InlineData("[ 1, 2 ]", "s.json:1: the scene: expected an object { ... }, found a list of 2 items")]
    [InlineData("{\n\n  \"coil\": { \"turn\": 5 } }", "s.json:3: coil.turn: unknown key 'turn'; expected one of turns, mean_diameter_m, winding_length_m, winding_depth_m, wire_diameter_m, inductance_model in coil")]
    [InlineData("{ \"coil\": { \"turns\": 5 ", "s.json:1: not a valid scene file (JSON, see host/Scenes/README.md): the file ends inside an object or a list: a closing } or ] is missing")]
    public void Json_errors_name_the_file_line_path_expectation_and_finding_without_dotnet_names(string json, string expected)
    {
        var ex = Assert.Throws<SceneException>(() => Scene.Parse(json, "s.json"));
        Assert.Equal(expected, ex.Message);
        foreach (string internals in new[] { "System.", "`1", ".NET", "could not be mapped", "Expected depth", "JsonTypeInfo" })
        {
            Assert.DoesNotContain(internals, ex.Message);
        }
    }

    [Fact]
    public void A_line_break_in_the_name_is_reported_as_name()
    {
        var ex = Assert.Throws<SceneException>(() => Scene.Parse("{ \"name\": \"floor\\nscan\" }", "n.json"));
        Assert.Equal("n.json: name must be one line of text (no line breaks or control characters) (got 'floor\\nscan')", ex.Message);
        ex = Assert.Throws<SceneException>(() => Scene.Parse("{ \"targets\": [ { \"name\": \"a\\tb\" } ] }", "n.json"));
        Assert.Contains("targets[0].name must be one line of text", ex.Message);
    }

    [Fact]
    public void An_oscillator_with_neither_frequency_nor_capacitance_takes_the_default_as_the_readme_says()
    {
        var scene = Scene.Parse("{ \"oscillator\": { \"tempco_ppm_per_k\": -5 } }", "o.json");
        Assert.Equal(100_000, scene.Oscillator.FrequencyHz);
    }

    [Theory]
    [InlineData("{ \"hardware\": { \"timer_bits\": 16, \"clock_hz\": 80000000 }, \"oscillator\": { \"frequency_hz\": 1000 } }", "hardware.timer_bits = 16 cannot time this signal: the search oscillator at 1000 Hz gives recorded edges 80000 ticks apart")]
    [InlineData("{ \"hardware\": { \"kind\": \"snapshots\", \"count_bits\": 16, \"snapshot_interval_s\": 0.01 }, \"oscillator\": { \"frequency_hz\": 10000000 } }", "hardware.count_bits = 16 cannot count this signal")]
    [InlineData("{ \"hardware\": { \"kind\": \"snapshots\", \"timer_bits\": 16, \"clock_hz\": 80000000 } }", "hardware.timer_bits = 16 cannot time the snapshot reads")]
    public void A_scene_whose_capture_would_be_aliased_is_refused(string json, string expected)
    {
        var scene = Scene.Parse(json, "a.json");
        var ex = Assert.Throws<SceneException>(() => new SceneModel(scene, "a.json"));
        Assert.StartsWith("a.json: " + expected, ex.Message);
    }

    [Theory]
    [InlineData("{ \"targets\": [ { \"position_m\": 1e308 } ] }", "targets[0].position_m must be in [-10000, 10000] m (got 1E+308)")]
    [InlineData("{ \"oscillator\": { \"coil_ppm_per_k\": 1e308 } }", "oscillator.coil_ppm_per_k must be in [-10000, 10000] ppm/K")]
    // The scene page's range (0, 1e7] s is the one Scene.Validate checks since the manual merge.
    [InlineData("{ \"temperature\": { \"kind\": \"settling\", \"time_constant_s\": 1e308 } }", "temperature.time_constant_s must be in (0, 1e7] s")]
    [InlineData("{ \"sweep\": { \"end_m\": 1e308 } }", "sweep.start_m / sweep.end_m must be in [-10000, 10000] m and different")]
    public void Every_scene_number_has_a_physical_range(string json, string expected)
    {
        var ex = Assert.Throws<SceneException>(() => Scene.Parse(json, "r.json"));
        Assert.Contains(expected, ex.Message);
    }
}
