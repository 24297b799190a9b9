using System.Text.Json;
using FreqReadout.Settings;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// <c>tune</c>: each row is exactly what <c>replay</c> finds with that value (the oracle: replay --json run per value on
/// the simulated demo capture); --settings-out writes the picked value in a file the device parser reads cleanly; bad
/// ranges and keys are one-line usage errors.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class TuneCommandTests : IClassFixture<SimulatedDemoCapture>
{
    private readonly SimulatedDemoCapture _sim;

    public TuneCommandTests(SimulatedDemoCapture sim)
    {
        _sim = sim;
    }

    [Fact]
    public void Each_row_equals_a_replay_with_that_value()
    {
        var (exit, output, error) = ConsoleCapture.Run("tune", _sim.CapturePath, "--vary", "threshold_sigma=10:60:25", "--json");
        Assert.True(exit == 0, error);
        using var tune = JsonDocument.Parse(output);
        var rows = tune.RootElement.GetProperty("rows").EnumerateArray().ToList();
        Assert.Equal(new[] { 10.0, 35.0, 60.0 }, rows.Select(r => r.GetProperty("value").GetDouble()));
        var eventCounts = new List<int>();
        foreach (JsonElement row in rows)
        {
            string value = row.GetProperty("value").GetDouble().ToString(System.Globalization.CultureInfo.InvariantCulture);
            var (replayExit, replayOut, replayErr) = ConsoleCapture.Run("replay", _sim.CapturePath, "--threshold-sigma", value, "--json");
            Assert.True(replayExit == 0, replayErr);
            using var replay = JsonDocument.Parse(replayOut);
            var events = replay.RootElement.GetProperty("events").EnumerateArray().ToList();
            Assert.Equal(events.Count, row.GetProperty("events").GetInt32());
            Assert.Equal(events.Count(e => e.GetProperty("class").GetString() == "ferrous"), row.GetProperty("ferrous").GetInt32());
            Assert.Equal(events.Count(e => e.GetProperty("class").GetString() == "non-ferrous"), row.GetProperty("non_ferrous").GetInt32());
            Assert.Equal(replay.RootElement.GetProperty("rebaselines").GetArrayLength(), row.GetProperty("rebaselines").GetInt32());
            Assert.Equal(replay.RootElement.GetProperty("gates").GetInt64(), row.GetProperty("gates").GetInt64());
            eventCounts.Add(events.Count);
        }

        Assert.True(eventCounts.Distinct().Count() > 1, "the values chosen should change what is found: " + string.Join(", ", eventCounts));
    }

    [Fact]
    public void The_picked_value_is_written_as_a_device_settings_file()
    {
        string file = Path.Combine(_sim.Dir, "tuned.settings");
        var (exit, _, error) = ConsoleCapture.Run("tune", _sim.CapturePath, "--vary", "threshold_sigma=5:7:1", "--settings-out", file, "--pick", "6");
        Assert.True(exit == 0, error);
        var values = new DeviceSettingsValues();
        var problems = new SettingsProblemList();
        Assert.True(DeviceSettingsParser.TryParse(File.ReadAllText(file), values, problems));
        Assert.Equal(0, problems.TotalCount);
        Assert.Equal(6, values.ThresholdSigma);
    }

    [Fact]
    public void With_the_truth_each_value_is_scored_as_demo_scores_its_passes()
    {
        // demo --json runs the same built-in scene at the default threshold (5 sigma): its pass matches are the oracle.
        var (demoExit, demoOut, demoErr) = ConsoleCapture.Run("demo", "--json");
        Assert.True(demoExit == 0, demoErr);
        using var demo = JsonDocument.Parse(demoOut);
        var passes = demo.RootElement.GetProperty("passes").EnumerateArray().ToList();
        int found = passes.Count(p => p.GetProperty("found").GetBoolean());
        int right = passes.Count(p => p.GetProperty("found").GetBoolean() && p.GetProperty("found_class").GetString() == p.GetProperty("sign_rule_class").GetString());
        int unmatched = demo.RootElement.GetProperty("unmatched_events").GetInt32();

        var (exit, output, error) = ConsoleCapture.Run("tune", _sim.CapturePath, "--vary", "threshold_sigma=5:5:1", "--truth", _sim.TruthPath, "--json");
        Assert.True(exit == 0, error);
        using var tune = JsonDocument.Parse(output);
        JsonElement row = tune.RootElement.GetProperty("rows")[0];
        Assert.Equal(found, row.GetProperty("passes_found").GetInt32());
        Assert.Equal(right, row.GetProperty("class_right").GetInt32());
        Assert.Equal(unmatched, row.GetProperty("false_events").GetInt32());
    }

    [Fact]
    public void A_file_that_is_not_a_truth_file_is_named_with_what_was_expected()
    {
        var (exit, _, error) = ConsoleCapture.Run("tune", _sim.CapturePath, "--vary", "threshold_sigma=5:5:1", "--truth", _sim.CapturePath);
        Assert.Equal(1, exit);
        Assert.Contains($"{_sim.CapturePath}: not JSON", error);
    }

    [Theory]
    [InlineData("sparkle=1:2:1", "--vary must be KEY=FROM:TO:STEP with KEY one of threshold_sigma")]
    [InlineData("threshold_sigma=5:4:1", "STEP must be > 0 and TO >= FROM")]
    [InlineData("threshold_sigma=1:1000:1", "1000 values; at most 200")]
    [InlineData("threshold_sigma=5:x:1", "the range must be FROM:TO:STEP (three numbers)")]
    public void Bad_ranges_are_usage_errors_naming_the_problem(string vary, string expected)
    {
        var (exit, _, error) = ConsoleCapture.Run("tune", _sim.CapturePath, "--vary", vary);
        Assert.Equal(2, exit);
        Assert.Contains(expected, error);
    }

    [Fact]
    public void A_value_out_of_its_range_is_a_row_that_says_why()
    {
        var (exit, output, error) = ConsoleCapture.Run("tune", _sim.CapturePath, "--vary", "threshold_sigma=1:3:2", "--json");
        Assert.True(exit == 0, error);
        using var tune = JsonDocument.Parse(output);
        JsonElement first = tune.RootElement.GetProperty("rows")[0];
        Assert.Contains("threshold", first.GetProperty("error").GetString());    // 1 is below the hysteresis (2)
    }
}
