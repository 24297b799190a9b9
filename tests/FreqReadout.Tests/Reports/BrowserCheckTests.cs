using FreqReadout.Host.Reports;
using FreqReadout.ReportBrowserCheck;
using SkiaSharp;

namespace FreqReadout.Tests.Reports;

/// <summary>
/// The checker .ci/run runs on a headless browser's output (tests/FreqReadout.ReportBrowserCheck): it reads the page's
/// check marker as <see cref="ReportPage"/> writes it, passes a real plot, and fails a blank area and a broken image
/// (a border and its alt text in a corner).
/// </summary>
public sealed class BrowserCheckTests
{
    [Fact]
    public void The_marker_is_read_from_a_dumped_dom()
    {
        string dom = "<html><body><p id=\"page-check\" hidden=\"\" data-status=\"ok\" data-images=\"3/3\" data-rects=\"70,522,1002,502;70,1089,1002,502\"></p></body></html>";
        Assert.True(PageCheckMarker.TryRead(dom, out PageCheckMarker? marker, out _));
        Assert.Equal(("ok", "3/3"), (marker!.Status, marker.Images));
        Assert.Equal(new[] { new PageRect(70, 522, 1002, 502), new PageRect(70, 1089, 1002, 502) }, marker.Rects);

        // As the page is written, before any script ran: pending, no rectangles.
        var page = new ReportPage("x");
        Assert.True(PageCheckMarker.TryRead(page.ToHtml(), out PageCheckMarker? written, out _));
        Assert.Equal(("pending", 0), (written!.Status, written.Rects.Count));

        Assert.False(PageCheckMarker.TryRead("<html></html>", out _, out string? reason));
        Assert.Contains("no #page-check element", reason);
        Assert.False(PageCheckMarker.TryRead("<p id=\"page-check\" data-rects=\"1,2,3\">", out _, out reason));
        Assert.Contains("not left,top,width,height", reason);
    }

    [Fact]
    public void A_plot_passes_a_blank_area_and_a_broken_image_fail()
    {
        // A real plot of ours (the stability plot's style: ScottPlot with grid, axes, labels), drawn at 2/3 size at (40, 30).
        var plot = new ScottPlot.Plot();
        plot.Add.Scatter(Enumerable.Range(0, 50).Select(i => (double)i).ToArray(), Enumerable.Range(0, 50).Select(i => Math.Sin(i / 5.0)).ToArray());
        plot.Title("test plot");
        using var shot = new SKBitmap(800, 1200);
        using (var canvas = new SKCanvas(shot))
        {
            canvas.Clear(SKColors.White);
            using SKBitmap image = SKBitmap.Decode(plot.GetImageBytes(600, 300, ScottPlot.ImageFormat.Png));
            canvas.DrawBitmap(image, 40, 30);

            // A broken image at (40, 400): a one-pixel border and a line of alt text in its top-left corner.
            using var border = new SKPaint { Color = new SKColor(0xbb, 0xbb, 0xbb), Style = SKPaintStyle.Stroke, StrokeWidth = 1 };
            canvas.DrawRect(40.5f, 400.5f, 599, 299, border);
            using var font = new SKFont(SKTypeface.Default, 14);
            using var ink = new SKPaint { Color = SKColors.Black };
            canvas.DrawText("Figure caption used as alt text of an image that did not decode", 44, 420, font, ink);
        }

        var plotArea = new PageRect(40, 30, 600, 300);
        var broken = new PageRect(40, 400, 600, 300);
        var blank = new PageRect(40, 800, 600, 300);
        Assert.True(PlotAreaCheck.CoveredShare(shot, plotArea) >= PlotAreaCheck.MinCoveredShare, $"plot: {PlotAreaCheck.CoveredShare(shot, plotArea):P0}");
        Assert.True(PlotAreaCheck.CoveredShare(shot, broken) < PlotAreaCheck.MinCoveredShare, $"broken: {PlotAreaCheck.CoveredShare(shot, broken):P0}");
        Assert.Equal(0.0, PlotAreaCheck.CoveredShare(shot, blank));
        Assert.Equal(0.0, PlotAreaCheck.DrawnShare(shot, blank));
        Assert.True(double.IsNaN(PlotAreaCheck.CoveredShare(shot, new PageRect(700, 1100, 200, 200))), "a rectangle outside the screenshot has no share");
    }
}
