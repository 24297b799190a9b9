using System.Globalization;
using System.Text.Json;
using AngleSharp.Dom;
using FreqReadout.Host.Reports;
using FreqReadout.Tests.Commands;

namespace FreqReadout.Tests.Reports;

/// <summary>
/// report.html of <c>replay --report</c>, <c>demo --report</c> and <c>stability --report</c>, parsed with AngleSharp: the
/// title, the tables against the same command's --json output (the expected values), the embedded plots decoding at
/// their size, no reference outside the page, the settings and the cautions.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ReportPageTests : IClassFixture<SimulatedDemoCapture>
{
    private static readonly string[] EventHeaders = { "start s", "end s", "peak s", "peak shift Hz", "ppm", "sigma", "class", "end" };
    private readonly SimulatedDemoCapture _sim;

    public ReportPageTests(SimulatedDemoCapture sim)
    {
        _sim = sim;
    }

    [Fact]
    public void Replay_page_holds_the_summary_events_plots_settings_and_cautions_of_the_run()
    {
        string dir = Path.Combine(_sim.Dir, "page-replay");
        var (exit, json, error) = ConsoleCapture.Run("replay", _sim.CapturePath, "--report", dir, "--json");
        Assert.True(exit == 0, error);
        using JsonDocument expected = JsonDocument.Parse(json); // the same run's --json: the expected values
        JsonElement root = expected.RootElement;

        IDocument doc = ReportPageChecks.Parse(Path.Combine(dir, "report.html"));
        Assert.Equal("FreqReadout replay report: demo.edges.csv", doc.Title);
        Assert.Equal(doc.Title, doc.QuerySelector("h1")?.TextContent);
        ReportPageChecks.AssertSelfContained(doc);
        ReportPageChecks.AssertImagesDecode(doc, 3, ReplayPlots.Width, ReplayPlots.Height);
        foreach (string name in new[] { "frequency", "shift", "noise" })
        {
            Assert.True(File.Exists(Path.Combine(dir, name + ".png")) && File.Exists(Path.Combine(dir, name + ".svg")), name + " plot files missing");
            Assert.Contains(doc.QuerySelectorAll("figcaption"), c => c.TextContent.Contains($"({name}.png, {name}.svg)", StringComparison.Ordinal));
        }

        Assert.Equal(root.GetProperty("capture").GetProperty("edges").GetInt64().ToString(CultureInfo.InvariantCulture), ReportPageChecks.SummaryValue(doc, "edges"));
        Assert.StartsWith(root.GetProperty("noise_hz").GetDouble().ToString("0.0000", CultureInfo.InvariantCulture) + " Hz", ReportPageChecks.SummaryValue(doc, "noise"));

        (string[] headers, string[][] rows) = ReportPageChecks.Table(doc, "events");
        Assert.Equal(EventHeaders, headers);
        JsonElement[] events = root.GetProperty("events").EnumerateArray().ToArray();
        Assert.True(events.Length >= 4, "the simulated capture has passes over targets");
        Assert.Equal(events.Length, rows.Length);
        for (int i = 0; i < events.Length; i++)
        {
            // Shown to 3 decimals: tolerance half a step.
            Assert.Equal(events[i].GetProperty("peak_s").GetDouble(), double.Parse(rows[i][2], CultureInfo.InvariantCulture), 0.0005 + 1e-9);
            Assert.Equal(events[i].GetProperty("peak_shift_hz").GetDouble(), double.Parse(rows[i][3], CultureInfo.InvariantCulture), 0.0005 + 1e-9);
            Assert.Equal(events[i].GetProperty("class").GetString(), rows[i][6]);
        }

        (string[] rebaselineHeaders, string[][] rebaselines) = ReportPageChecks.Table(doc, "re-baselines");
        Assert.Equal(new[] { "time s", "reason", "shift Hz", "shift ppm" }, rebaselineHeaders);
        Assert.Equal(root.GetProperty("rebaselines").GetArrayLength(), rebaselines.Length);

        // Settings: replay's defaults (ReadoutSettings / CounterSettings, shared-logic/Readout/README.md) as the run used them.
        (string[] settingHeaders, string[][] settings) = ReportPageChecks.Table(doc, "settings-used");
        Assert.Equal(new[] { "setting", "value", "from" }, settingHeaders);
        Assert.Contains(new[] { "threshold_sigma", "5", "readout" }, settings);
        Assert.Contains(new[] { "gate_seconds", "0.1", "counter" }, settings);
        ReportPageChecks.AssertCautions(doc);
        Assert.Equal("pending", doc.QuerySelector("#page-check")?.GetAttribute("data-status"));
    }

    [Fact]
    public void A_replay_without_a_baseline_still_gets_its_page_with_dashes_and_an_empty_noise_plot_that_says_so()
    {
        // The contract sample beat-with-temp (docs/contracts): 0.2 s, too short for a baseline, so replay --json gives
        // noise_hz null and no events.
        string dir = Path.Combine(_sim.Dir, "page-short");
        var (exit, json, error) = ConsoleCapture.Run("replay", FreqReadout.Tests.Captures.CaptureTestFiles.Contract("beat-with-temp.edges.csv"), "--report", dir, "--json");
        Assert.True(exit == 0, error);
        using JsonDocument expected = JsonDocument.Parse(json);
        Assert.Equal(JsonValueKind.Null, expected.RootElement.GetProperty("noise_hz").ValueKind);

        IDocument doc = ReportPageChecks.Parse(Path.Combine(dir, "report.html"));
        ReportPageChecks.AssertImagesDecode(doc, 3, ReplayPlots.Width, ReplayPlots.Height);
        Assert.StartsWith("- Hz, - ppm", ReportPageChecks.SummaryValue(doc, "noise"));
        Assert.Empty(ReportPageChecks.Table(doc, "events").Rows);
        Assert.Equal("none", doc.QuerySelector("section#events td.none")?.TextContent);
        Assert.Contains("no baseline was captured", doc.QuerySelector("section#notes")?.TextContent);
        string noise = string.Join("\n", System.Xml.Linq.XDocument.Load(Path.Combine(dir, "noise.svg")).Descendants().Where(e => e.Name.LocalName == "text").Select(e => e.Value));
        Assert.Contains("no target-free readings with spread: nothing to draw", noise);
        ReportPageChecks.AssertCautions(doc);
    }

    [Fact]
    public void Demo_page_holds_the_replay_sections_and_the_simulated_passes()
    {
        string dir = Path.Combine(_sim.Dir, "page-demo");
        var (exit, json, error) = ConsoleCapture.Run("demo", "--report", dir, "--json");
        Assert.True(exit == 0, error);
        Assert.Contains("demo: wrote 6 plot files and report.html", error);
        using JsonDocument expected = JsonDocument.Parse(json);
        JsonElement root = expected.RootElement;

        IDocument doc = ReportPageChecks.Parse(Path.Combine(dir, "report.html"));
        Assert.Equal("FreqReadout demo report (invented scenario, simulated)", doc.Title);
        Assert.Contains("An invented scenario, simulated from physics, not a field recording.", doc.QuerySelector("section#about-this-report")?.TextContent);
        ReportPageChecks.AssertSelfContained(doc);
        ReportPageChecks.AssertImagesDecode(doc, 3, ReplayPlots.Width, ReplayPlots.Height);
        Assert.Equal(root.GetProperty("replay").GetProperty("events").GetArrayLength(), ReportPageChecks.Table(doc, "events").Rows.Length);

        (string[] headers, string[][] passes) = ReportPageChecks.Table(doc, "simulated-passes-and-what-the-readout-reported");
        Assert.Equal(new[] { "peak s", "target", "sim. Hz", "found Hz", "readout says", "sign rule", "as expected" }, headers);
        JsonElement[] truth = root.GetProperty("passes").EnumerateArray().OrderBy(p => p.GetProperty("truth_peak_s").GetDouble()).ToArray();
        Assert.Equal(truth.Length, passes.Length);
        for (int i = 0; i < truth.Length; i++)
        {
            Assert.Equal(truth[i].GetProperty("target").GetString(), passes[i][1]);
            Assert.Equal(truth[i].GetProperty("found").GetBoolean() ? truth[i].GetProperty("found_class").GetString() : "-", passes[i][4]);
        }

        Assert.Contains(ReportPageChecks.Table(doc, "settings-used").Rows, r => r[0] == "clock_hz" && r[1] != "0");
        // The scene's large steel anchor reads non-ferrous (README "The sign rule and its limit"): the page says why, as the console does.
        string signRule = doc.QuerySelector("section#the-sign-rule-on-these-targets")?.TextContent ?? string.Empty;
        Assert.Contains("large steel anchor is ferrous steel, yet it reads non-ferrous", signRule);
        ReportPageChecks.AssertCautions(doc);
    }

    [Fact]
    public void Stability_page_holds_the_deviation_table_and_plot()
    {
        string dir = Path.Combine(_sim.Dir, "page-stability");
        var (exit, json, error) = ConsoleCapture.Run("stability", _sim.CapturePath, "--report", dir, "--json");
        Assert.True(exit == 0, error);
        using JsonDocument expected = JsonDocument.Parse(json);
        IDocument doc = ReportPageChecks.Parse(Path.Combine(dir, "report.html"));
        Assert.Equal("FreqReadout stability report: demo.edges.csv", doc.Title);
        ReportPageChecks.AssertSelfContained(doc);
        ReportPageChecks.AssertImagesDecode(doc, 1, ReplayPlots.Width, ReplayPlots.Height);
        (string[] headers, string[][] rows) = ReportPageChecks.Table(doc, "deviations");
        Assert.Equal(new[] { "tau s", "ADEV", "68 % interval", "ADEV Hz", "MDEV", "noise (MDEV slope)" }, headers);
        JsonElement[] expectedRows = expected.RootElement.GetProperty("rows").EnumerateArray().ToArray();
        Assert.Equal(expectedRows.Length, rows.Length);
        for (int i = 0; i < rows.Length; i++)
        {
            // ADEV shown with 4 significant digits (0.000E+00): relative tolerance half a step.
            double adev = expectedRows[i].GetProperty("adev").GetDouble();
            Assert.Equal(adev, double.Parse(rows[i][1], CultureInfo.InvariantCulture), adev * 0.0005 + 1e-18);
        }

        Assert.Equal(expected.RootElement.GetProperty("edges").GetInt64().ToString(CultureInfo.InvariantCulture), ReportPageChecks.SummaryValue(doc, "edges"));
        ReportPageChecks.AssertCautions(doc);
    }

    [Fact]
    public void Plan_page_holds_the_resolution_beat_gain_and_depth_tables_and_both_plots()
    {
        string dir = Path.Combine(_sim.Dir, "page-plan");
        var (exit, json, error) = ConsoleCapture.Run("plan", "--material", "copper", "--radius-mm", "20", "--search-prescale", "64", "--report", dir, "--json");
        Assert.True(exit == 0, error);
        Assert.Contains("wrote 4 plot files and report.html", error);
        using JsonDocument expected = JsonDocument.Parse(json);
        IDocument doc = ReportPageChecks.Parse(Path.Combine(dir, "report.html"));
        Assert.Equal("FreqReadout plan: counting the search oscillator", doc.Title);
        ReportPageChecks.AssertSelfContained(doc);
        ReportPageChecks.AssertImagesDecode(doc, 2, ReplayPlots.Width, ReplayPlots.Height);

        // One row per method, estimator and gate, in the order and with the verdicts of --json.
        (string[] headers, string[][] rows) = ReportPageChecks.Table(doc, "predicted-resolution-and-device-load");
        Assert.Equal(new[] { "method", "estimator", "gate s", "Hz", "ppm", "updates/s", "edges or reads/s", "% of 1 M op/s", "% of 5 M op/s", "verdict" }, headers);
        JsonElement[] expectedRows = expected.RootElement.GetProperty("rows").EnumerateArray().ToArray();
        Assert.Equal(expectedRows.Length, rows.Length);
        for (int i = 0; i < rows.Length; i++)
        {
            Assert.Equal(expectedRows[i].GetProperty("method").GetString(), rows[i][0]);
            Assert.Equal(expectedRows[i].GetProperty("verdict").GetString(), rows[i][9]);
            double hz = expectedRows[i].GetProperty("resolution_hz").GetDouble();
            Assert.Equal(hz, double.Parse(rows[i][3], CultureInfo.InvariantCulture), Math.Abs(hz) * 0.01); // three significant digits
        }

        (_, string[][] depth) = ReportPageChecks.Table(doc, "how-deep-this-target-is-seen");
        JsonElement[] expectedDepth = expected.RootElement.GetProperty("depth").GetProperty("rows").EnumerateArray().ToArray();
        Assert.Equal(expectedDepth.Length, depth.Length);
        Assert.Equal(expected.RootElement.GetProperty("beat_gains").GetArrayLength(), ReportPageChecks.Table(doc, "what-counting-the-beat-note-gains").Rows.Length);
        // Every input the plan was made from, defaults included: the methods with their figures, the coil and the material.
        (_, string[][] settings) = ReportPageChecks.Table(doc, "settings-used");
        var names = settings.Select(r => r[0]).ToHashSet();
        Assert.Contains("methods", names);
        foreach (JsonElement m in expected.RootElement.GetProperty("methods").EnumerateArray())
        {
            string row = m.GetProperty("name").GetString() + ".clock_hz";
            Assert.Equal(m.GetProperty("clock_hz").GetDouble(), double.Parse(settings.Single(r => r[0] == row)[1], CultureInfo.InvariantCulture));
        }

        Assert.Contains("turns", names);
        Assert.Contains("wire_m", names);
        Assert.Contains("mu_r", names);
        Assert.Contains("conductivity_s_per_m", names);

        // Notes: every row's warning of --json once, naming its method, estimator and gate (as the console does).
        string[] notes = doc.QuerySelectorAll("section#notes p").Select(p => p.TextContent).ToArray();
        int rowWarnings = 0;
        foreach (JsonElement row in expectedRows)
        {
            string about = $"{row.GetProperty("method").GetString()}, {row.GetProperty("estimator").GetString()}, gate {FreqReadout.Host.Commands.PlanCommand.Num(row.GetProperty("gate_s").GetDouble())} s: ";
            foreach (JsonElement w in row.GetProperty("warnings").EnumerateArray())
            {
                Assert.Contains(about + w.GetString(), notes);
                rowWarnings++;
            }
        }

        Assert.True(rowWarnings > 0, "the case should have row warnings (pin-event and pulse-counter over or tight)");
        Assert.Equal(rowWarnings + expected.RootElement.GetProperty("warnings").GetArrayLength(), notes.Length);
        ReportPageChecks.AssertCautions(doc);
    }
}
