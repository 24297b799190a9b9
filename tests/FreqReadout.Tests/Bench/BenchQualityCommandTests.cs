using System.Text.Json;
using FreqReadout.Tests.Commands;

namespace FreqReadout.Tests.Bench;

/// <summary>The quick tracking-quality bench, run once (as CI runs it): the table is produced and its numbers hang together.</summary>
public sealed class QuickBenchRun
{
    public QuickBenchRun()
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run("bench", "quality", "--quick", "--seeds", "tune", "--json", "--quiet");
        Assert.True(exit == 0, stderr);
        Json = JsonDocument.Parse(stdout).RootElement.Clone();
    }

    public JsonElement Json { get; }
}

/// <summary>
/// <c>bench quality --quick</c>: checks that the table is there and sane (counts within their bounds, rows adding up, the
/// score and the verdict following from them, gate noise spanning the range the bench promises), not that the readout passes.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class BenchQualityCommandTests : IClassFixture<QuickBenchRun>
{
    private static readonly string[] Kinds = { "settling", "ramp", "onset", "mains" };
    private static readonly string[] Ways = { "readout", "fixed-3s", "moving-10s" };
    private static readonly string[] Modes = { "search", "beat-above", "beat-below", "snapshots" };
    private readonly JsonElement _json;

    public BenchQualityCommandTests(QuickBenchRun run)
    {
        _json = run.Json;
    }

    [Fact]
    public void Quick_GivesOneRowPerKindAndWay_WithCountsThatHangTogether()
    {
        Assert.Equal("tune", _json.GetProperty("seed_set").GetString());
        Assert.True(_json.GetProperty("quick").GetBoolean());
        JsonElement[] kinds = _json.GetProperty("kinds").EnumerateArray().ToArray();
        Assert.Equal(Kinds, kinds.Select(k => k.GetProperty("kind").GetString()));
        foreach (JsonElement kind in kinds)
        {
            JsonElement[] ways = kind.GetProperty("ways").EnumerateArray().ToArray();
            Assert.Equal(Ways, ways.Select(w => w.GetProperty("way").GetString()));
            var scores = new Dictionary<string, int>();
            foreach (JsonElement w in ways)
            {
                string what = kind.GetProperty("kind").GetString() + "/" + w.GetProperty("way").GetString();
                int targets = w.GetProperty("targets").GetInt32();
                int found = w.GetProperty("found").GetInt32();
                int right = w.GetProperty("right").GetInt32();
                int falseTargets = w.GetProperty("false_in_target_scenes").GetInt32();
                int falseDrift = w.GetProperty("false_in_drift_only").GetInt32();
                double hours = w.GetProperty("drift_only_h").GetDouble();
                Assert.True(targets == 16, what);
                Assert.True(found >= 0 && found <= targets && right >= 0 && right <= found && falseTargets >= 0 && falseDrift >= 0, what);
                Assert.Equal(4 * 60.0 / 3600, hours, 9);
                Assert.Equal(falseDrift / hours, w.GetProperty("false_per_h").GetDouble(), 9);
                Assert.Equal(right - falseTargets - falseDrift, w.GetProperty("score").GetInt32());
                if (found > 0)
                {
                    Assert.True(w.GetProperty("peak_error_median").GetDouble() >= 0, what);
                }

                scores[w.GetProperty("way").GetString()!] = w.GetProperty("score").GetInt32();

                // The modes add up to the kind.
                JsonElement[] byMode = kind.GetProperty("modes").EnumerateArray()
                    .Select(m => m.GetProperty("ways").EnumerateArray().Single(x => x.GetProperty("way").GetString() == w.GetProperty("way").GetString()))
                    .ToArray();
                Assert.Equal(Modes, kind.GetProperty("modes").EnumerateArray().Select(m => m.GetProperty("mode").GetString()));
                foreach (string key in new[] { "targets", "found", "right", "false_in_target_scenes", "false_in_drift_only", "score" })
                {
                    Assert.True(w.GetProperty(key).GetInt32() == byMode.Sum(m => m.GetProperty(key).GetInt32()), what + " " + key);
                }
            }

            bool better = scores["readout"] > scores["fixed-3s"] && scores["readout"] > scores["moving-10s"];
            Assert.Equal(better, kind.GetProperty("readout_better").GetBoolean());
        }
    }

    [Fact]
    public void Quick_ScenesCoverEveryKindAndMode_HalfOfEachClass_AndGateNoiseFromHundredthsToTensOfPpm()
    {
        JsonElement[] scenes = _json.GetProperty("scenes").EnumerateArray().ToArray();
        Assert.Equal(Kinds.Length * Modes.Length * 2, scenes.Length);
        foreach (string kind in Kinds)
        {
            foreach (string mode in Modes)
            {
                JsonElement[] these = scenes.Where(s => s.GetProperty("kind").GetString() == kind && s.GetProperty("mode").GetString() == mode).ToArray();
                Assert.Single(these, s => s.GetProperty("drift_only").GetBoolean());
                JsonElement withTargets = Assert.Single(these, s => !s.GetProperty("drift_only").GetBoolean());
                JsonElement[] passes = withTargets.GetProperty("passes").EnumerateArray().ToArray();
                Assert.Equal(4, passes.Length);
                Assert.Equal(2, passes.Count(p => p.GetProperty("sign_rule_class").GetString() == "ferrous"));
                foreach (JsonElement p in passes)
                {
                    Assert.InRange(p.GetProperty("peak_noise").GetDouble(), 8 * 0.995, 40 * 1.005);
                    Assert.InRange(p.GetProperty("pass_s").GetDouble(), 0.2, 3.0);
                }
            }
        }

        double[] noise = scenes.Select(s => s.GetProperty("gate_noise_ppm").GetDouble()).ToArray();
        Assert.True(noise.Min() < 0.05, $"quietest scene {noise.Min()} ppm");
        Assert.True(noise.Max() > 10, $"noisiest scene {noise.Max()} ppm");
        double hours = scenes.Where(s => s.GetProperty("drift_only").GetBoolean()).Sum(s => s.GetProperty("duration_s").GetDouble()) / 3600;
        Assert.Equal(Kinds.Length * 4 * 60.0 / 3600, hours, 9);
    }

    [Fact]
    public void TextAndMarkdown_ShowTheTable()
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run("bench", "quality", "--quick", "--kinds", "ramp", "--seeds", "5", "--quiet");
        Assert.True(exit == 0, stderr);
        Assert.Contains("readout", stdout);
        Assert.Contains("fixed-3s", stdout);
        Assert.Contains("moving-10s", stdout);
        Assert.Contains("seeds: 5 (master seed 5), quick subset", stdout);

        (exit, stdout, stderr) = ConsoleCapture.Run("bench", "quality", "--quick", "--kinds", "ramp", "--seeds", "5", "--quiet", "--markdown");
        Assert.True(exit == 0, stderr);
        string[] rows = stdout.Split('\n').Where(l => l.StartsWith("| ramp |", StringComparison.Ordinal)).ToArray();
        Assert.Equal(3, rows.Length);
        Assert.StartsWith("| kind | way | targets |", stdout);
    }

    [Fact]
    public void TheResultDoesNotDependOnHowManyScenesRunAtOnce()
    {
        string One(string jobs)
        {
            var (exit, stdout, stderr) = ConsoleCapture.Run("bench", "quality", "--quick", "--kinds", "onset", "--seeds", "9", "--quiet", "--json", "--jobs", jobs);
            Assert.True(exit == 0, stderr);
            using JsonDocument d = JsonDocument.Parse(stdout);
            return d.RootElement.GetProperty("kinds").GetRawText();
        }

        Assert.Equal(One("1"), One("2"));
    }

    [Theory]
    [InlineData("--seeds", "often", "--seeds must be tune, report or a master seed")]
    [InlineData("--kinds", "ramp,wobble", "--kinds takes settling, ramp, onset and mains")]
    [InlineData("--jobs", "0", "--jobs must be a whole number from 1 to 64")]
    public void BadOptions_AreNamed(string option, string value, string message)
    {
        var (exit, _, stderr) = ConsoleCapture.Run("bench", "quality", "--quick", option, value);
        Assert.Equal(2, exit);
        Assert.Contains(message, stderr);
    }
}
