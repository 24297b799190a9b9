using System.Xml.Linq;
using FreqReadout.Host.Planning;
using FreqReadout.Host.Reports;
using FreqReadout.Tests.Commands;
using SkiaSharp;

namespace FreqReadout.Tests.Reports;

/// <summary>
/// <c>plan --report DIR</c>: the resolution and depth plots exist as PNG and SVG, decode at the stated size (PNG through
/// SkiaSharp, SVG as XML), hold traces in the plot area, and the SVG's text holds the title, the axis labels with their
/// units and the legend; <see cref="PlanPlots.Write"/> returns exactly the files it wrote.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class PlanPlotsTests
{
    [Fact]
    public void The_command_writes_both_plots()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-plan-report-").FullName;
        try
        {
            var (exit, _, error) = ConsoleCapture.Run("plan", "--material", "copper", "--radius-mm", "20", "--search-prescale", "64", "--report", dir, "--json");
            Assert.True(exit == 0, error);
            Assert.Contains("wrote 4 plot files and report.html", error);
            var expected = new Dictionary<string, string[]>
            {
                ["resolution"] = new[] { PlanPlots.ResolutionTitle, "gate time (s)", "resolution, 1 sigma (Hz)", "pin-event, reciprocal", "pulse-counter, snapshot-regression", "edge-capture, regression" },
                ["depth"] = new[] { PlanPlots.DepthTitle, "target depth below the surface (mm)", "search shift (Hz)", "peak shift of a pass", "threshold and depth, edge-capture, reciprocal" },
            };
            foreach ((string name, string[] texts) in expected)
            {
                PlotFileChecks.AssertPlot(dir, name, texts, 0.1, 0.75, 500);
            }
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    [Fact]
    public void Write_returns_the_files_it_wrote_and_only_the_resolution_plot_without_a_target()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-plan-plots-").FullName;
        try
        {
            PlanReport report = PlanBuilder.Build(new PlanInputs());
            IReadOnlyList<string> files = new PlanPlots().Write(dir, report);
            Assert.Equal(new[] { "resolution.png", "resolution.svg" }, files.Select(Path.GetFileName));
            Assert.Equal(files.OrderBy(f => f), Directory.GetFiles(dir).OrderBy(f => f));
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }
}
