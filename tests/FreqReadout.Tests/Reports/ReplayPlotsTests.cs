using System.Xml.Linq;
using FreqReadout.Host.Reports;
using FreqReadout.Tests.Commands;
using SkiaSharp;

namespace FreqReadout.Tests.Reports;

/// <summary>
/// <c>replay --report DIR</c> on the simulated demo capture: each plot exists as PNG and SVG, decodes at the stated size
/// (PNG through SkiaSharp, SVG as XML), its plot area is not blank, and the SVG's text holds the title, the axis labels
/// with their units and the legend; the noise histogram's robust fit is the noise figure replay reports.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ReplayPlotsTests : IClassFixture<SimulatedDemoCapture>
{
    private readonly SimulatedDemoCapture _sim;

    public ReplayPlotsTests(SimulatedDemoCapture sim)
    {
        _sim = sim;
    }

    [Fact]
    public void The_plots_decode_at_their_size_carry_their_labels_and_are_not_blank()
    {
        string dir = Path.Combine(_sim.Dir, "report");
        var (exit, _, error) = ConsoleCapture.Run("replay", _sim.CapturePath, "--report", dir, "--json");
        Assert.True(exit == 0, error);
        Assert.Contains("wrote 6 plot files and report.html", error);
        Assert.DoesNotContain("Unsupported", error);

        var expected = new Dictionary<string, string[]>
        {
            ["frequency"] = new[] { "Counted frequency and tracked baseline", "time (s)", "frequency (Hz)", "counted frequency", "tracked baseline" },
            ["shift"] = new[] { "Search shift, threshold band and events", "time (s)", "shift (Hz)", "search shift", "event: ferrous", "event: non-ferrous" },
            ["noise"] = new[] { "Noise: shift of target-free readings", "shift (Hz)", "readings per bin (count)", "target-free readings", "normal, median and robust sigma", "normal, mean and standard deviation" },
        };
        foreach ((string name, string[] texts) in expected)
        {
            // The plot area right of the legend box holds more than background and grid: pixels of the traces.
            PlotFileChecks.AssertPlot(dir, name, texts, 0.25, 0.9, 1000);
        }
    }

    [Fact]
    public void The_noise_histogram_fits_the_noise_figure_replay_reports_and_counts_every_target_free_reading()
    {
        string dir = Path.Combine(_sim.Dir, "report-noise");
        var (exit, json, error) = ConsoleCapture.Run("replay", _sim.CapturePath, "--report", dir, "--json");
        Assert.True(exit == 0, error);
        // Expected: noise_hz of replay --json on the same capture (the robust sigma of the target-free residuals).
        double noiseHz = System.Text.Json.JsonDocument.Parse(json).RootElement.GetProperty("noise_hz").GetDouble();
        string text = string.Join("\n", XDocument.Load(Path.Combine(dir, "noise.svg")).Descendants().Where(e => e.Name.LocalName == "text").Select(e => e.Value));
        var sigma = System.Text.RegularExpressions.Regex.Match(text, @"median and robust sigma ([0-9.]+) Hz");
        Assert.True(sigma.Success, "no robust sigma in the legend: " + text);
        // The legend rounds to 5 decimals: tolerance half a step.
        Assert.Equal(noiseHz, double.Parse(sigma.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture), 0.000005 + 1e-12);

        // The count in the legend is the number of target-free rows of the readings CSV (a shift known, target 0) of the same replay.
        string csv = Path.Combine(_sim.Dir, "noise-readings.csv");
        Assert.Equal(0, ConsoleCapture.Run("replay", _sim.CapturePath, "--readings", csv, "--json").Exit);
        string[] lines = File.ReadAllLines(csv);
        string[] header = lines[0].Split(',');
        int shiftColumn = Array.IndexOf(header, "shift_hz"), targetColumn = Array.IndexOf(header, "target");
        int targetFree = lines.Skip(1).Select(l => l.Split(',')).Count(c => c[shiftColumn].Length > 0 && c[targetColumn] == "0");
        Assert.True(targetFree > 100, $"only {targetFree} target-free readings");
        Assert.Contains($"{targetFree} target-free readings", text);
    }
}
