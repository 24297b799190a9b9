using System.Text.Json;
using FreqReadout.Host;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Simulation;

[Collection("Console")]
public class SimulationCommandTests
{
    private static (int Code, string Out, string Err) RunCli(params string[] args)
    {
        var oldOut = Console.Out;
        var oldErr = Console.Error;
        var o = new StringWriter();
        var e = new StringWriter();
        Console.SetOut(o);
        Console.SetError(e);
        try
        {
            int code = Program.BuildApp().Run(args);
            return (code, o.ToString(), e.ToString());
        }
        finally
        {
            Console.SetOut(oldOut);
            Console.SetError(oldErr);
        }
    }

    [Fact]
    public void Coil_Json_CarriesBothInductancesAndTheTargetTable()
    {
        // The worked coil of docs/references.md (Wheeler 358.82 uH) with the 1 cm steel check sphere (sigma 6e6, mu_r 100):
        // crossover 69.25 kHz (docs/references.md, calculated); at 10 kHz and 100 mm on axis dL = +18.27 nH.
        var (code, output, err) = RunCli("coil", "--turns", "30", "--diameter-mm", "200", "--winding-length-mm", "10", "--winding-depth-mm", "10",
            "--frequency-hz", "10000", "--material", "custom", "--conductivity", "6e6", "--mu-r", "100", "--radius-mm", "10", "--depths-mm", "80,180", "--height-mm", "20", "--json");
        Assert.True(code == 0, err);
        using var doc = JsonDocument.Parse(output);
        var root = doc.RootElement;
        Assert.Equal(358.82, root.GetProperty("inductance_wheeler_uh").GetDouble(), 0.005);
        Assert.Equal(362.41, root.GetProperty("inductance_thin_loop_uh").GetDouble(), 0.01);
        Assert.Equal(10000, root.GetProperty("frequency_hz").GetDouble());
        var target = root.GetProperty("target");
        Assert.Equal(69.25e3, target.GetProperty("crossover_hz").GetDouble(), 10.0);
        Assert.Equal("ferrous", target.GetProperty("sign_rule_class").GetString());
        var row = target.GetProperty("table")[0];
        Assert.Equal(0.1, row.GetProperty("distance_m").GetDouble(), 1e-12);
        Assert.Equal(0.08, row.GetProperty("depth_m").GetDouble(), 1e-12);
        Assert.Equal(18.27, row.GetProperty("inductance_change_nh").GetDouble(), 0.01);
    }

    [Fact]
    public void Coil_BadOption_NamesItAndItsRange()
    {
        var (code, _, err) = RunCli("coil", "--frequency-hz", "5");
        Assert.Equal(2, code);
        Assert.Contains("--frequency-hz must be in (100, 2e7] Hz (got 5)", err);
        (code, _, err) = RunCli("coil", "--material", "unobtainium");
        Assert.Equal(2, code);
        Assert.Contains("--material must be one of", err);
    }

    [Fact]
    public void Coil_Table_ShowsCrossoverAndCaution()
    {
        var (code, output, _) = RunCli("coil", "--material", "carbon_steel", "--radius-mm", "15");
        Assert.Equal(0, code);
        Assert.Contains("ABOVE", output);
        Assert.Contains("not proof that nothing is there", output);
    }

    [Fact]
    public void Simulate_WritesCaptureAndTruth_SameSeedSameFile()
    {
        string dir = Path.Combine(Path.GetTempPath(), "freqreadout-sim-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(dir);
        try
        {
            string a = Path.Combine(dir, "a.csv");
            string b = Path.Combine(dir, "b.csv");
            var r1 = RunCli("simulate", "--demo", "--duration-s", "3", "--out", a, "--truth", Path.Combine(dir, "a.json"), "--quiet");
            Assert.True(r1.Code == 0, r1.Err);
            var r2 = RunCli("simulate", "--demo", "--duration-s", "3", "--out", b, "--quiet");
            Assert.True(r2.Code == 0, r2.Err);
            Assert.Equal(File.ReadAllBytes(a), File.ReadAllBytes(b));
            string[] lines = File.ReadAllLines(a);
            Assert.Equal("# freqreadout capture 1", lines[0]);
            Assert.Contains("tick,temp_c", lines);
            var truth = SimulationTruth.Parse(File.ReadAllText(Path.Combine(dir, "a.json")));
            Assert.Equal(3, truth.DurationS);
            Assert.Equal("non-ferrous", truth.Targets.Single(t => t.Name == "large steel anchor").SignRuleClass);
            Assert.True(File.Exists(b + ".truth.json"));

            var r3 = RunCli("simulate", "--demo", "--duration-s", "3", "--seed", "99", "--out", b, "--quiet");
            Assert.Equal(0, r3.Code);
            Assert.NotEqual(File.ReadAllBytes(a), File.ReadAllBytes(b));
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    [Fact]
    public void Simulate_TextAndBinary_ReadBackThroughTheCaptureReaders_AndCount()
    {
        // The capture formats' own readers (picked by content) must accept what the simulator writes, in both formats, with
        // identical rows; and `count` on it gives the intended frequency: at t = 0 the demo coil is at 12 C, 8 K below the
        // nominal 20 C, with -8.25 ppm/K (copper 16.5 ppm/K and C0G 0, docs/references.md): 100 000 (1 + 66e-6) = 100 006.6 Hz.
        // Tolerance 0.05 Hz (flicker and white FM of the demo are a few mHz; the first gate is 0.1 s).
        string dir = Path.Combine(Path.GetTempPath(), "freqreadout-sim-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(dir);
        try
        {
            string text = Path.Combine(dir, "d.csv");
            string bin = Path.Combine(dir, "d.bin");
            Assert.Equal(0, RunCli("simulate", "--demo", "--duration-s", "2", "--out", text, "--quiet").Code);
            Assert.Equal(0, RunCli("simulate", "--demo", "--duration-s", "2", "--out", bin, "--format", "binary", "--quiet").Code);
            using (var a = FreqReadout.Host.Captures.CaptureFile.Open(text))
            using (var b = FreqReadout.Host.Captures.CaptureFile.Open(bin))
            {
                Assert.Equal(80e6, a.Metadata.ClockHz);
                Assert.Equal(32, b.Metadata.Prescale);
                var ra = a.ReadRows().Select(r => (r.Tick, r.TemperatureC)).ToList();
                var rb = b.ReadRows().Select(r => (r.Tick, r.TemperatureC)).ToList();
                Assert.True(ra.Count > 6000);
                Assert.Equal(ra, rb);
            }

            var counted = RunCli("count", bin, "--json");
            Assert.True(counted.Code == 0, counted.Err);
            string first = counted.Out.Split('\n', StringSplitOptions.RemoveEmptyEntries)[0];
            using var doc = JsonDocument.Parse(first);
            Assert.Equal(100_006.6, doc.RootElement.GetProperty("frequency_hz").GetDouble(), 0.05);
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    [Fact]
    public void Simulate_Errors_NameTheFileOrOption()
    {
        var r = RunCli("simulate", "--scene", "/nonexistent/scene.json", "--out", "x.csv", "--quiet");
        Assert.Equal(1, r.Code); // a file that cannot be read is a data problem (docs/exit-codes.md); an option's value a usage problem
        Assert.Contains("/nonexistent/scene.json: cannot read the scene file", r.Err);
        r = RunCli("simulate", "--demo", "--duration-s", "-4", "--out", "x.csv", "--quiet");
        Assert.Equal(2, r.Code);
        Assert.Contains("--duration-s must be in (0, 604800] s (got -4)", r.Err);
        r = RunCli("simulate", "--demo", "--kind", "waves", "--out", "x.csv");
        Assert.Equal(2, r.Code);
        Assert.Contains("--kind must be edges or snapshots (got 'waves')", r.Err);
    }
}
