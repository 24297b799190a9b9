using System.Xml.Linq;
using FreqReadout.Host.Reports;
using FreqReadout.Tests.Commands;
using SkiaSharp;

namespace FreqReadout.Tests.Reports;

/// <summary>
/// <c>replay --report DIR</c> on the simulated demo capture: each plot exists as PNG and SVG, decodes at the stated size
/// (PNG through SkiaSharp, SVG as XML), its plot area is not blank, and the SVG's text holds the title, the axis labels
/// with their units and the legend.
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
        Assert.Contains("wrote 4 plot files", error);
        Assert.DoesNotContain("Unsupported", error);

        var expected = new Dictionary<string, string[]>
        {
            ["frequency"] = new[] { "Counted frequency and tracked baseline", "time (s)", "frequency (Hz)", "counted frequency", "tracked baseline" },
            ["shift"] = new[] { "Search shift, threshold band and events", "time (s)", "shift (Hz)", "search shift", "event: ferrous", "event: non-ferrous" },
        };
        foreach ((string name, string[] texts) in expected)
        {
            using (SKBitmap png = SKBitmap.Decode(Path.Combine(dir, name + ".png")))
            {
                Assert.NotNull(png);
                Assert.Equal(ReplayPlots.Width, png.Width);
                Assert.Equal(ReplayPlots.Height, png.Height);
                // The plot area (inside the axes' margins) holds more than background and grid: pixels of the traces.
                int traced = 0;
                for (int x = png.Width / 10; x < png.Width * 3 / 4; x++)    // left of the legend box
                {
                    for (int y = png.Height / 10; y < png.Height * 9 / 10; y++)
                    {
                        SKColor c = png.GetPixel(x, y);
                        traced += c.Red + c.Green + c.Blue < 3 * 200 ? 1 : 0;
                    }
                }

                Assert.True(traced > 1000, $"{name}.png: only {traced} traced pixels in the plot area");
            }

            XDocument svg = XDocument.Load(Path.Combine(dir, name + ".svg"));
            Assert.Equal(ReplayPlots.Width.ToString(), svg.Root!.Attribute("width")!.Value);
            Assert.Equal(ReplayPlots.Height.ToString(), svg.Root.Attribute("height")!.Value);
            string allText = string.Join("\n", svg.Descendants().Where(e => e.Name.LocalName == "text").Select(e => e.Value));
            Assert.All(texts, t => Assert.Contains(t, allText));
        }
    }
}
