using System.Globalization;
using System.Text.Json;

namespace FreqReadout.Tests.Commands;

/// <summary>The simulator's built-in floor-scan scene (invented scenario, physics of docs/references.md), written once per class.</summary>
public sealed class SimulatedDemoCapture : IDisposable
{
    public SimulatedDemoCapture()
    {
        Dir = Path.Combine(Path.GetTempPath(), "freqreadout-sim-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Dir);
        CapturePath = Path.Combine(Dir, "demo.edges.csv");
        TruthPath = Path.Combine(Dir, "demo.truth.json");
        var (exit, _, stderr) = ConsoleCapture.Run("simulate", "--demo", "--out", CapturePath, "--truth", TruthPath, "--quiet");
        Assert.True(exit == 0, "simulate failed: " + stderr);
    }

    public string Dir { get; }

    public string CapturePath { get; }

    public string TruthPath { get; }

    public void Dispose()
    {
        Directory.Delete(Dir, true);
    }
}

/// <summary>
/// Replay and calibrate on a capture from the simulator (copper pipe, small steel fixing below its
/// ferrous crossover, large steel anchor above it, four passes each, coil warming): every pass found once,
/// classed as the truth's sign rule says (the anchor reads non-ferrous, README.md sign rule), peak near
/// the truth's peak search shift; calibrate finds the scene's tempco.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ReplaySimulatedTests : IClassFixture<SimulatedDemoCapture>
{
    private readonly SimulatedDemoCapture _sim;

    public ReplaySimulatedTests(SimulatedDemoCapture sim)
    {
        _sim = sim;
    }

    [Fact]
    public void Every_simulated_pass_is_one_event_with_the_sign_rule_class_and_its_peak()
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", _sim.CapturePath, "--json");
        Assert.True(exit == 0, stderr);
        using var doc = JsonDocument.Parse(stdout);
        JsonElement[] events = doc.RootElement.GetProperty("events").EnumerateArray().ToArray();
        double noise = doc.RootElement.GetProperty("noise_hz").GetDouble();
        Assert.Empty(doc.RootElement.GetProperty("rebaselines").EnumerateArray());

        using var truth = JsonDocument.Parse(File.ReadAllText(_sim.TruthPath));
        int passes = 0;
        foreach (JsonElement target in truth.RootElement.GetProperty("targets").EnumerateArray())
        {
            string cls = target.GetProperty("sign_rule_class").GetString()!;
            foreach (JsonElement pass in target.GetProperty("passes").EnumerateArray())
            {
                passes++;
                double at = pass.GetProperty("peak_time_s").GetDouble();
                double shift = pass.GetProperty("peak_search_shift_hz").GetDouble();
                JsonElement[] near = events.Where(e => Math.Abs(e.GetProperty("peak_s").GetDouble() - at) < 0.5).ToArray();
                string what = $"{target.GetProperty("name").GetString()} pass at {at.ToString(CultureInfo.InvariantCulture)} s, truth {shift.ToString(CultureInfo.InvariantCulture)} Hz";
                JsonElement e = Assert.Single(near);
                Assert.True(cls == e.GetProperty("class").GetString(), what + ": class " + e.GetProperty("class").GetString());

                // 10 % of the truth's instantaneous peak, or 4 noise sigma (see TargetPassTests).
                double peak = e.GetProperty("peak_shift_hz").GetDouble();
                Assert.True(Math.Abs(peak - shift) <= Math.Max(0.1 * Math.Abs(shift), 4 * noise), what + ": peak " + peak);
            }
        }

        Assert.Equal(12, passes);
        Assert.Equal(passes, events.Length); // nothing else: the warming coil gave no event
    }

    [Fact]
    public void Calibrate_finds_the_scene_tempco()
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run("calibrate", _sim.CapturePath, "--json");
        Assert.True(exit == 0, stderr);
        using var doc = JsonDocument.Parse(stdout);
        double fit = doc.RootElement.GetProperty("tempco_ppm_per_k").GetDouble();
        double se = doc.RootElement.GetProperty("standard_error_ppm_per_k").GetDouble();
        using var truth = JsonDocument.Parse(File.ReadAllText(_sim.TruthPath));
        double tempco = truth.RootElement.GetProperty("tempco_ppm_per_k").GetDouble();

        // Within 4 standard errors or 3 % of the simulator's tempco (its oscillator also has white and
        // flicker FM, so the residuals are not quite independent).
        Assert.True(Math.Abs(fit - tempco) <= Math.Max(4 * se, 0.03 * Math.Abs(tempco)), $"fit {fit} +- {se}, truth {tempco}");
    }
}
