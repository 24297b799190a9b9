using FreqReadout.Host.Bench;
using FreqReadout.Tests.Commands;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Docs;

/// <summary>
/// docs/json-output.md and docs/csv-output.md list exactly the keys and columns real runs print: every key a run
/// prints is documented, and every documented key is printed by at least one of the runs here (which between them
/// reach every optional key: temp_c and mark columns, started_utc, re-baselines, a magnetic and a non-magnetic
/// target). The runs use the contract samples and the simulator's invented demo scene.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class OutputKeysDocumentedTests : IClassFixture<SimulatedDemoCapture>
{
    private readonly SimulatedDemoCapture _sim;

    public OutputKeysDocumentedTests(SimulatedDemoCapture sim)
    {
        _sim = sim;
    }

    private static string Run(params string[] args)
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run(args);
        Assert.True(exit == 0, "freqreadout " + string.Join(' ', args) + " exited " + exit + ": " + stderr);
        return stdout;
    }

    private static void AssertSame(string what, SortedSet<string> documented, SortedSet<string> printed)
    {
        var undocumented = printed.Except(documented).ToList();
        var neverPrinted = documented.Except(printed).ToList();
        Assert.True(
            undocumented.Count == 0 && neverPrinted.Count == 0,
            $"{what}: printed but not documented: [{string.Join(", ", undocumented)}]; documented but not printed: [{string.Join(", ", neverPrinted)}]");
    }

    [Fact]
    public void Count_json_keys_are_the_documented_ones()
    {
        var printed = new SortedSet<string>(StringComparer.Ordinal);
        foreach (string output in new[]
        {
            Run("count", Contract("beat-with-temp.edges.csv"), "--gate-seconds", "0.02", "--json"),
            Run("count", Contract("minimal.edges.csv"), "--gate-edges", "25", "--json"),
            Run("count", Contract("snapshots.edges.csv"), "--gate-seconds", "0.5", "--json"),
        })
        {
            foreach (string line in output.Split('\n', StringSplitOptions.RemoveEmptyEntries))
            {
                DocTables.AddDocument(line, printed);
            }
        }

        AssertSame("count --json", DocTables.Keys("json-output.md", "keys: count"), printed);
    }

    [Fact]
    public void Replay_json_keys_are_the_documented_ones()
    {
        var printed = new SortedSet<string>(StringComparer.Ordinal);

        // The demo scene has started_utc (events get start_utc); a 1 s persistent-shift timeout turns the copper pipe's
        // passes into automatic re-baselines; the beat sample has a rebaseline mark and no baseline (nulls).
        DocTables.AddDocument(Run("replay", _sim.CapturePath, "--json", "--persistent-shift-s", "1"), printed);
        DocTables.AddDocument(Run("replay", Contract("beat-with-temp.edges.csv"), "--json"), printed);
        Assert.Contains("rebaselines[].reason", printed);
        Assert.Contains("events[].start_utc", printed);
        AssertSame("replay --json", DocTables.Keys("json-output.md", "keys: replay"), printed);
    }

    [Fact]
    public void Calibrate_json_keys_are_the_documented_ones()
    {
        var printed = new SortedSet<string>(StringComparer.Ordinal);
        DocTables.AddDocument(Run("calibrate", _sim.CapturePath, "--json"), printed);
        AssertSame("calibrate --json", DocTables.Keys("json-output.md", "keys: calibrate"), printed);
    }

    [Fact]
    public void Stability_json_keys_are_the_documented_ones()
    {
        var printed = new SortedSet<string>(StringComparer.Ordinal);
        DocTables.AddDocument(Run("stability", _sim.CapturePath, "--json"), printed);
        AssertSame("stability --json", DocTables.Keys("json-output.md", "keys: stability"), printed);
    }

    [Fact]
    public void Import_json_keys_are_the_documented_ones()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-import-keys-").FullName;
        try
        {
            // A one-bit signal (bit null) and a bit of a vector, from the hand-written example dump of the import tests.
            string vcd = Path.Combine(AppContext.BaseDirectory, "Data", "two-clocks.vcd");
            var vcdKeys = new SortedSet<string>(StringComparer.Ordinal);
            DocTables.AddDocument(Run("import", "vcd", vcd, "--signal", "top.probe.clk", "--out", Path.Combine(dir, "a.csv"), "--json"), vcdKeys);
            DocTables.AddDocument(Run("import", "vcd", vcd, "--signal", "data[0]", "--out", Path.Combine(dir, "b.csv"), "--json"), vcdKeys);
            AssertSame("import vcd --json", DocTables.Keys("json-output.md", "keys: import vcd"), vcdKeys);

            // An invented 700 Hz tone with a second of silence in it, so that a lost stretch is listed.
            const int rate = 48000;
            double[] tone = Import.WavBuilder.Tone(700, 4, rate, 0.01, 5);
            for (int i = 2 * rate; i < 3 * rate; i++)
            {
                tone[i] *= 0.0005;
            }

            string wav = Path.Combine(dir, "beat.wav");
            File.WriteAllBytes(wav, Import.WavBuilder.Build(new[] { tone }, rate, 16, false, false, false));
            string json = Run("import", "wav", wav, "--beat-side", "above", "--out", Path.Combine(dir, "c.csv"), "--json");
            var wavKeys = new SortedSet<string>(StringComparer.Ordinal);
            DocTables.AddDocument(json, wavKeys);
            AssertSame("import wav --json", DocTables.Keys("json-output.md", "keys: import wav"), wavKeys);
            using var doc = System.Text.Json.JsonDocument.Parse(json);
            Assert.Equal("silence", doc.RootElement.GetProperty("lost")[0].GetProperty("reason").GetString());
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }

    [Fact]
    public void Bench_speed_json_keys_are_the_documented_ones()
    {
        // The JSON writer on results made by hand (the bench itself runs in BenchSpeedCommandTests): a raw read with
        // no peak memory, a replay with one, and a case with no edges and no run.
        var raw = new SpeedCaseResult(new SpeedCase("raw read", "FileStream", new[] { RawRead.Argument, "big.csv" }, 1000));
        raw.Seconds.AddRange(new[] { 0.05, 0.04, 0.06 });
        var replay = new SpeedCaseResult(new SpeedCase("text replay", "replay big.csv --json", new[] { "replay", "big.csv", "--json" }, 1000));
        replay.Seconds.AddRange(new[] { 0.2, 0.25, 0.3 });
        replay.PeakWorkingSetBytes.Add(40 << 20);
        var none = new SpeedCaseResult(new SpeedCase("nothing", "no edges", new[] { "--version" }, 0));
        string json = SpeedBench.Json(new[] { raw, replay, none }, SpeedBenchSize.Quick(), 12345);
        var printed = new SortedSet<string>(StringComparer.Ordinal);
        DocTables.AddDocument(json, printed);
        AssertSame("bench speed --json", DocTables.Keys("json-output.md", "keys: bench speed"), printed);
        using var doc = System.Text.Json.JsonDocument.Parse(json);
        var cases = doc.RootElement.GetProperty("cases");
        Assert.Equal(5.0, cases[1].GetProperty("x_raw_read").GetDouble(), 12); // 0.25 / 0.05
        Assert.Equal(40.0, cases[1].GetProperty("peak_mib").GetDouble(), 12);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, cases[0].GetProperty("peak_mib").ValueKind);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, cases[2].GetProperty("median_s").ValueKind);
    }

    [Fact]
    public void Tune_json_keys_are_the_documented_ones()
    {
        var printed = new SortedSet<string>(StringComparer.Ordinal);
        DocTables.AddDocument(Run("tune", _sim.CapturePath, "--vary", "threshold_sigma=1:5:4", "--json"), printed);
        AssertSame("tune --json", DocTables.Keys("json-output.md", "keys: tune"), printed);
    }

    [Fact]
    public void Coil_json_keys_are_the_documented_ones_and_always_present()
    {
        var printed = new SortedSet<string>(StringComparer.Ordinal);
        string bare = Run("coil", "--json");
        DocTables.AddDocument(bare, printed);
        DocTables.AddDocument(Run("coil", "--json", "--material", "carbon_steel", "--radius-mm", "5", "--depths-mm", "50,100"), printed);
        string copper = Run("coil", "--json", "--material", "copper", "--depths-mm", "80");
        DocTables.AddDocument(copper, printed);
        AssertSame("coil --json", DocTables.Keys("json-output.md", "keys: coil"), printed);

        // Not applicable means null, not a missing key.
        using var noTarget = System.Text.Json.JsonDocument.Parse(bare);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, noTarget.RootElement.GetProperty("target").ValueKind);
        using var nonMagnetic = System.Text.Json.JsonDocument.Parse(copper);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, nonMagnetic.RootElement.GetProperty("target").GetProperty("crossover_hz").ValueKind);
    }

    [Fact]
    public void Plan_json_keys_are_the_documented_ones_and_always_present()
    {
        var printed = new SortedSet<string>(StringComparer.Ordinal);
        string bare = Run("plan", "--json", "--gates-s", "0.1");
        DocTables.AddDocument(bare, printed);
        DocTables.AddDocument(Run("plan", "--json", "--gates-s", "0.1,1", "--material", "copper", "--radius-mm", "20", "--methods", "pulse-counter,custom", "--custom-jitter-us", "2"), printed);
        AssertSame("plan --json", DocTables.Keys("json-output.md", "keys: plan"), printed);

        // Not applicable means null, not a missing key.
        using var noTarget = System.Text.Json.JsonDocument.Parse(bare);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, noTarget.RootElement.GetProperty("depth").ValueKind);
    }

    [Fact]
    public void Demo_json_keys_are_the_documented_ones_and_its_replay_object_is_replays()
    {
        var printed = new SortedSet<string>(StringComparer.Ordinal);
        string json = Run("demo", "--json");
        DocTables.AddDocument(json, printed, "replay");
        AssertSame("demo --json", DocTables.Keys("json-output.md", "keys: demo"), printed);

        using var doc = System.Text.Json.JsonDocument.Parse(json);
        var inner = new SortedSet<string>(StringComparer.Ordinal);
        DocTables.AddPaths(doc.RootElement.GetProperty("replay"), string.Empty, inner);
        var replayKeys = DocTables.Keys("json-output.md", "keys: replay");
        Assert.True(inner.IsSubsetOf(replayKeys), "demo's replay object has keys replay --json does not document: " + string.Join(", ", inner.Except(replayKeys)));
    }

    [Fact]
    public void Truth_file_keys_are_the_documented_ones_and_its_parameters_are_a_scene()
    {
        var printed = new SortedSet<string>(StringComparer.Ordinal);
        string json = File.ReadAllText(_sim.TruthPath);
        DocTables.AddDocument(json, printed, "parameters");

        // A beat scene adds nothing new (every key is written, null when it does not apply), but it must not differ either.
        string dir = Directory.CreateTempSubdirectory("freqreadout-truth-keys").FullName;
        try
        {
            string scene = Path.Combine(CliProcess.RepoRoot(), "host", "Scenes", "bench-beat-pin-events.json");
            string truth = Path.Combine(dir, "beat.truth.json");
            Run("simulate", "--scene", scene, "--out", Path.Combine(dir, "beat.csv"), "--truth", truth, "--quiet", "--duration-s", "2");
            var beat = new SortedSet<string>(StringComparer.Ordinal);
            DocTables.AddDocument(File.ReadAllText(truth), beat, "parameters");
            Assert.True(beat.SetEquals(printed), "search and beat truth files differ in their keys: " + string.Join(", ", beat.Except(printed).Concat(printed.Except(beat))));

            // parameters reads back as a scene file.
            using var doc = System.Text.Json.JsonDocument.Parse(File.ReadAllText(truth));
            FreqReadout.Host.Simulation.Scene.Parse(doc.RootElement.GetProperty("parameters").GetRawText(), "parameters");
        }
        finally
        {
            Directory.Delete(dir, true);
        }

        AssertSame("truth file", DocTables.Keys("json-output.md", "keys: truth"), printed);
    }

    [Fact]
    public void Csv_columns_are_the_documented_ones()
    {
        string countHeader = Run("count", Contract("beat-with-temp.edges.csv"), "--gate-seconds", "0.05", "--csv").Split('\n')[0];
        AssertSame("count --csv", DocTables.Keys("csv-output.md", "columns: count-csv"), new SortedSet<string>(countHeader.Split(','), StringComparer.Ordinal));

        string readings = Path.Combine(_sim.Dir, "doc-readings.csv");
        string events = Path.Combine(_sim.Dir, "doc-events.csv");
        try
        {
            Run("replay", _sim.CapturePath, "--json", "--readings", readings, "--events", events);
            AssertSame("replay --readings", DocTables.Keys("csv-output.md", "columns: readings-csv"), new SortedSet<string>(File.ReadLines(readings).First().Split(','), StringComparer.Ordinal));
            AssertSame("replay --events", DocTables.Keys("csv-output.md", "columns: events-csv"), new SortedSet<string>(File.ReadLines(events).First().Split(','), StringComparer.Ordinal));
        }
        finally
        {
            File.Delete(readings);
            File.Delete(events);
        }
    }

    [Fact]
    public void Documented_column_order_is_the_printed_order()
    {
        // The tables list columns in file order, so a reader of the manual sees the real layout.
        string countHeader = Run("count", Contract("beat-with-temp.edges.csv"), "--gate-seconds", "0.05", "--csv").Split('\n')[0];
        Assert.Equal(string.Join(",", DocTables.KeysInOrder("csv-output.md", "columns: count-csv")), countHeader);
        string readings = Path.Combine(_sim.Dir, "order-readings.csv");
        string events = Path.Combine(_sim.Dir, "order-events.csv");
        try
        {
            Run("replay", Contract("beat-with-temp.edges.csv"), "--json", "--readings", readings, "--events", events);
            Assert.Equal(string.Join(",", DocTables.KeysInOrder("csv-output.md", "columns: readings-csv")), File.ReadLines(readings).First());
            Assert.Equal(string.Join(",", DocTables.KeysInOrder("csv-output.md", "columns: events-csv")), File.ReadLines(events).First());
        }
        finally
        {
            File.Delete(readings);
            File.Delete(events);
        }
    }
}
