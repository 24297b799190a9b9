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
}
