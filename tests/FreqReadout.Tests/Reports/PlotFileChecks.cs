using System.Xml.Linq;
using FreqReadout.Host.Reports;
using SkiaSharp;

namespace FreqReadout.Tests.Reports;

/// <summary>
/// What every plot of a report must be: NAME.png decodes (SkiaSharp) at <see cref="ReplayPlots.Width"/> x
/// <see cref="ReplayPlots.Height"/> with traces in its plot area (dark pixels, not only background and grid), and
/// NAME.svg parses as XML of the same size whose text holds the expected title, axis labels and legend.
/// </summary>
internal static class PlotFileChecks
{
    /// <summary>Checks NAME.png and NAME.svg in <paramref name="dir"/>.</summary>
    /// <param name="dir">The report folder.</param>
    /// <param name="name">The plot's file name without extension.</param>
    /// <param name="texts">Texts the SVG must hold.</param>
    /// <param name="fromX">Left edge of the area counted for traces, as a fraction of the width (right of a legend box, say).</param>
    /// <param name="toX">Right edge of that area, as a fraction of the width.</param>
    /// <param name="minTraced">Dark pixels the area must hold at least.</param>
    public static void AssertPlot(string dir, string name, IEnumerable<string> texts, double fromX, double toX, int minTraced)
    {
        using (SKBitmap png = SKBitmap.Decode(Path.Combine(dir, name + ".png")))
        {
            Assert.NotNull(png);
            Assert.Equal(ReplayPlots.Width, png.Width);
            Assert.Equal(ReplayPlots.Height, png.Height);
            int traced = 0;
            for (int x = (int)(png.Width * fromX); x < (int)(png.Width * toX); x++)
            {
                for (int y = png.Height / 10; y < png.Height * 9 / 10; y++)
                {
                    SKColor c = png.GetPixel(x, y);
                    traced += c.Red + c.Green + c.Blue < 3 * 200 ? 1 : 0;
                }
            }

            Assert.True(traced > minTraced, $"{name}.png: only {traced} traced pixels in the plot area");
        }

        XDocument svg = XDocument.Load(Path.Combine(dir, name + ".svg"));
        Assert.Equal(ReplayPlots.Width.ToString(System.Globalization.CultureInfo.InvariantCulture), svg.Root!.Attribute("width")!.Value);
        Assert.Equal(ReplayPlots.Height.ToString(System.Globalization.CultureInfo.InvariantCulture), svg.Root.Attribute("height")!.Value);
        string allText = string.Join("\n", svg.Descendants().Where(e => e.Name.LocalName == "text").Select(e => e.Value));
        Assert.All(texts, t => Assert.Contains(t, allText));
    }
}
