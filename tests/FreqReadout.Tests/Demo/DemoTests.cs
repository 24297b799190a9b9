using System.Text.Json;
using FreqReadout.Host.Demo;
using FreqReadout.Tests.Docs;

namespace FreqReadout.Tests.Demo;

/// <summary>
/// The built-in demo (invented scenario) end to end: physics simulation -> capture file -> the device
/// pipeline. The expected values are the simulation's own truth file for this scene (not a reference);
/// the point is that the readout, knowing only the capture, finds what the physics put there.
/// </summary>
public class DemoTests
{
    [Fact]
    public void Demo_finds_every_simulated_pass_with_the_sign_rule_class_and_peak_within_10_percent_or_4_sigma()
    {
        string path = Path.Combine(Path.GetTempPath(), "freqreadout-demo-test-" + Guid.NewGuid().ToString("N") + ".csv");
        try
        {
            DemoResult r = DemoRun.Run(path, null, CancellationToken.None);
            Assert.Equal(12, r.Matches.Count); // 3 targets x 4 passes in the scene
            foreach (DemoPassMatch m in r.Matches)
            {
                Assert.True(m.Event != null, $"{m.Target} pass {m.Pass} at {m.TruthPeakSeconds} s missed");
                Assert.True(m.ClassAsExpected, $"{m.Target} pass {m.Pass}: {m.Event!.ClassName}, sign rule expects {m.SignRuleClass}");
                // Peak within 10 % or 4 noise sigmas, whichever is larger: the peak is the largest |shift| of the
                // readings, so it carries one gate's noise plus the upward bias of a maximum (the same bound and reason
                // as TargetPassTests; 4 sigma, normal tail, common practice). The small fixing's -0.54 Hz is 23 sigmas.
                double noise = r.Report.NoiseHz ?? 0;
                double bound = Math.Max(0.1 * Math.Abs(m.TruthPeakShiftHz), 4 * noise);
                Assert.True(Math.Abs(m.Event!.Event.PeakShiftHz - m.TruthPeakShiftHz) <= bound, $"{m.Target} pass {m.Pass}: peak {m.Event.Event.PeakShiftHz} Hz, truth {m.TruthPeakShiftHz} Hz, noise {noise} Hz");
            }

            Assert.Empty(r.UnmatchedEvents); // no false alarm from the warming coil's drift
            Assert.Empty(r.Report.Rebaselines);

            // The demo's point about the sign rule: the large anchor is steel but reads non-ferrous,
            // the small fixing reads ferrous.
            Assert.Contains(r.Matches, m => m.Target == "large steel anchor" && m.MaterialClass == "ferrous" && m.Event!.ClassName == "non-ferrous");
            Assert.Contains(r.Matches, m => m.Target == "small steel fixing" && m.Event!.ClassName == "ferrous");
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Demo_command_runs_as_a_user_would_and_explains_the_anchor()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-demo-cli-").FullName;
        try
        {
            CliProcess.Result text = CliProcess.Run(dir, new[] { "demo", "--keep", "kept" });
            Assert.True(text.ExitCode == 0, text.Stderr + text.Stdout);
            Assert.Contains("invented", text.Stdout);
            Assert.Contains("12 of 12 passes found, 12 with the class the sign rule gives", text.Stdout);
            Assert.Contains("yet it reads non-ferrous", text.Stdout);
            Assert.Contains("crossover", text.Stdout);
            Assert.Contains("is not proof that a wall or floor holds no live wiring or pipe", text.Stdout.Replace("\n", " ").Replace("  ", " "));
            Assert.True(File.Exists(Path.Combine(dir, "kept", "floor-demo.csv")));
            Assert.True(File.Exists(Path.Combine(dir, "kept", "floor-demo.truth.json")));

            CliProcess.Result json = CliProcess.Run(dir, new[] { "demo", "--json" });
            Assert.True(json.ExitCode == 0, json.Stderr);
            using JsonDocument doc = JsonDocument.Parse(json.Stdout);
            JsonElement passes = doc.RootElement.GetProperty("passes");
            Assert.Equal(12, passes.GetArrayLength());
            Assert.All(passes.EnumerateArray(), p => Assert.True(p.GetProperty("found").GetBoolean()));
            Assert.Equal(12, doc.RootElement.GetProperty("replay").GetProperty("events").GetArrayLength());
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }
}

/// <summary>
/// Every example scene shipped in host/Scenes (invented scenarios), simulated and replayed with
/// replay's defaults: each simulated pass is found with the class the sign rule should give.
/// Expected values are the simulation's own truth (not a reference).
/// </summary>
public class ExampleSceneTests
{
    public static IEnumerable<object[]> Scenes() =>
        Directory.GetFiles(Path.Combine(CliProcess.RepoRoot(), "host", "Scenes"), "*.json").Select(f => new object[] { Path.GetFileName(f) });

    [Theory]
    [MemberData(nameof(Scenes))]
    public void Example_scene_replays_with_every_pass_found_and_classed(string file)
    {
        string scenePath = Path.Combine(CliProcess.RepoRoot(), "host", "Scenes", file);
        FreqReadout.Host.Simulation.Scene scene = FreqReadout.Host.Simulation.Scene.Load(scenePath);
        string path = Path.Combine(Path.GetTempPath(), "freqreadout-scene-test-" + Guid.NewGuid().ToString("N") + ".csv");
        try
        {
            DemoResult r = DemoRun.Run(scene, file, path, null, CancellationToken.None);
            Assert.NotEmpty(r.Matches);
            foreach (DemoPassMatch m in r.Matches)
            {
                Assert.True(m.Event != null, $"{file}: {m.Target} pass {m.Pass} at {m.TruthPeakSeconds} s missed");
                Assert.True(m.ClassAsExpected, $"{file}: {m.Target} pass {m.Pass}: {m.Event!.ClassName}, sign rule expects {m.SignRuleClass}");
            }

            Assert.Empty(r.UnmatchedEvents);
        }
        finally
        {
            File.Delete(path);
        }
    }
}
