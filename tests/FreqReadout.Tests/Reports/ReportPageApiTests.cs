using AngleSharp.Dom;
using FreqReadout.Host.Reports;
using SkiaSharp;

namespace FreqReadout.Tests.Reports;

/// <summary>
/// The page API another report calls (<see cref="ReportPage"/>, <see cref="ReportTable"/>): text is encoded, not markup;
/// sections get their ids; a figure embeds a PNG at the size its header states; what is not a PNG is refused.
/// </summary>
public sealed class ReportPageApiTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-page-").FullName;

    public void Dispose() => Directory.Delete(_dir, true);

    [Fact]
    public void Text_that_looks_like_markup_is_shown_as_text()
    {
        var page = new ReportPage("Title <b>&</b>");
        page.AddText("Notes & more", "a <script>alert(1)</script> note");
        page.AddTable("Rows", new ReportTable("name", "value").AddRow("<img src=x>", "1.5 Hz"));
        page.AddCautions(new[] { "caution <i>one</i>" });
        string path = Path.Combine(_dir, "report.html");
        page.Write(path);

        IDocument doc = ReportPageChecks.Parse(path);
        Assert.Equal("Title <b>&</b>", doc.Title);
        Assert.Single(doc.QuerySelectorAll("script")); // the page's own inline check, nothing from the text
        Assert.Empty(doc.QuerySelectorAll("img, b, i"));
        Assert.Equal("a <script>alert(1)</script> note", doc.QuerySelector("section#notes-more p")?.TextContent);
        (string[] headers, string[][] rows) = ReportPageChecks.Table(doc, "rows");
        Assert.Equal(new[] { "name", "value" }, headers);
        Assert.Equal(new[] { "<img src=x>", "1.5 Hz" }, Assert.Single(rows));
        Assert.Equal("num", doc.QuerySelectorAll("section#rows td")[1].ClassName); // a number with its unit is right-aligned
        Assert.Equal("caution <i>one</i>", doc.QuerySelector("section#cautions li")?.TextContent);
        ReportPageChecks.AssertSelfContained(doc);
        Assert.Equal((0, 1), (page.FigureCount, page.TableCount));
    }

    [Fact]
    public void A_figure_embeds_the_png_at_its_own_size_and_names_its_files()
    {
        string png = Path.Combine(_dir, "plot.png");
        using (var bitmap = new SKBitmap(321, 123))
        {
            bitmap.Erase(SKColors.DarkSlateGray);
            using var data = bitmap.Encode(SKEncodedImageFormat.Png, 100);
            File.WriteAllBytes(png, data.ToArray());
        }

        var page = new ReportPage("figures");
        page.AddFigure(png, Path.Combine(_dir, "plot.svg"), "one plot");
        page.AddFigure(png, null, "the same again");
        string path = Path.Combine(_dir, "report.html");
        page.Write(path);

        IDocument doc = ReportPageChecks.Parse(path);
        ReportPageChecks.AssertImagesDecode(doc, 2, 321, 123);
        Assert.Equal(new[] { "figure-1", "figure-2" }, doc.QuerySelectorAll("figure").Select(f => f.Id));
        Assert.Equal("Figure 1. one plot (plot.png, plot.svg)", doc.QuerySelectorAll("figcaption")[0].TextContent);
        Assert.Equal("Figure 2. the same again (plot.png)", doc.QuerySelectorAll("figcaption")[1].TextContent);
    }

    [Fact]
    public void What_is_not_a_png_is_refused_with_its_name()
    {
        string svg = Path.Combine(_dir, "plot.svg");
        File.WriteAllText(svg, "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"10\" height=\"10\"/>");
        var e = Assert.Throws<InvalidDataException>(() => new ReportPage("x").AddFigure(svg, null, "caption"));
        Assert.Contains("plot.svg: not a PNG file", e.Message);
        Assert.False(ReportPage.TryReadPngSize(new byte[30], out _, out _));
    }

    [Theory]
    [InlineData("Summary", "summary")]
    [InlineData("Re-baselines", "re-baselines")]
    [InlineData("Simulated passes and what the readout reported", "simulated-passes-and-what-the-readout-reported")]
    [InlineData("  Settings used (2)  ", "settings-used-2")]
    public void Section_ids_are_the_headings_in_lower_case_with_dashes(string heading, string id)
    {
        Assert.Equal(id, ReportPage.Slug(heading));
    }

    [Fact]
    public void Repeated_headings_get_distinct_ids_and_rows_must_match_the_headers()
    {
        var page = new ReportPage("x");
        page.AddText("Notes", "a");
        page.AddText("Notes", "b");
        Assert.Contains("<section id=\"notes-2\">", page.ToHtml());
        var e = Assert.Throws<ArgumentException>(() => new ReportTable("a", "b").AddRow("only one"));
        Assert.Contains("needs 2 cells, got 1", e.Message);
    }
}
