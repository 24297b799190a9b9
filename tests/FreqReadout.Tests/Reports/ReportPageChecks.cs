using AngleSharp.Dom;
using AngleSharp.Html.Parser;
using SkiaSharp;

namespace FreqReadout.Tests.Reports;

/// <summary>
/// Structure checks of a report.html, parsed with AngleSharp's HTML5 parser: sections and their tables, every image
/// embedded as a data URI that decodes (PNG through SkiaSharp) at the size its attributes state, and no reference that
/// would need a network or another file.
/// </summary>
internal static class ReportPageChecks
{
    /// <summary>Parses the page at <paramref name="path"/>.</summary>
    public static IDocument Parse(string path)
    {
        Assert.True(File.Exists(path), path + " was not written");
        return new HtmlParser().ParseDocument(File.ReadAllText(path));
    }

    /// <summary>Every src and href is a data: URI or a fragment; no external style sheet, script source, frame or object.</summary>
    public static void AssertSelfContained(IDocument doc)
    {
        foreach (IElement e in doc.All)
        {
            foreach (string attribute in new[] { "src", "href", "srcset", "poster", "data", "action" })
            {
                string? v = e.GetAttribute(attribute);
                if (v != null)
                {
                    Assert.True(v.StartsWith("data:", StringComparison.Ordinal) || v.StartsWith('#'), $"<{e.LocalName} {attribute}=\"{Excerpt(v)}\"> refers outside the page");
                }
            }
        }

        Assert.Empty(doc.QuerySelectorAll("link, iframe, object, embed, base, script[src]"));
        string styles = string.Join("\n", doc.QuerySelectorAll("style").Select(s => s.TextContent));
        Assert.DoesNotContain("@import", styles);
        Assert.DoesNotContain("url(", styles);
        Assert.DoesNotContain("@font-face", styles);
    }

    /// <summary>
    /// Checks that the page has <paramref name="count"/> images, each a base64 PNG data URI with alt text that SkiaSharp
    /// decodes at the width and height the img states, which are <paramref name="width"/> x <paramref name="height"/>.
    /// Inline SVG elements, if any, must parse as XML.
    /// </summary>
    public static void AssertImagesDecode(IDocument doc, int count, int width, int height)
    {
        IElement[] images = doc.QuerySelectorAll("img").ToArray();
        Assert.Equal(count, images.Length);
        foreach (IElement img in images)
        {
            string src = img.GetAttribute("src") ?? string.Empty;
            const string prefix = "data:image/png;base64,";
            Assert.StartsWith(prefix, src);
            Assert.False(string.IsNullOrWhiteSpace(img.GetAttribute("alt")), "an image without alt text");
            using SKBitmap bitmap = SKBitmap.Decode(Convert.FromBase64String(src[prefix.Length..]));
            Assert.NotNull(bitmap);
            Assert.Equal(width, bitmap.Width);
            Assert.Equal(height, bitmap.Height);
            Assert.Equal(width.ToString(), img.GetAttribute("width"));
            Assert.Equal(height.ToString(), img.GetAttribute("height"));
        }

        foreach (IElement svg in doc.QuerySelectorAll("svg"))
        {
            System.Xml.Linq.XDocument.Parse(svg.OuterHtml);
        }
    }

    /// <summary>The headers and body rows (cell texts) of the table in the section with id <paramref name="sectionId"/>.</summary>
    public static (string[] Headers, string[][] Rows) Table(IDocument doc, string sectionId)
    {
        IElement? table = doc.QuerySelector($"section#{sectionId} table");
        Assert.True(table != null, $"no table in section #{sectionId}");
        string[] headers = table.QuerySelectorAll("thead th").Select(th => th.TextContent).ToArray();
        string[][] rows = table.QuerySelectorAll("tbody tr")
            .Select(tr => tr.QuerySelectorAll("td").Select(td => td.TextContent).ToArray())
            .Where(cells => !(cells.Length == 1 && cells[0] == "none"))
            .ToArray();
        return (headers, rows);
    }

    /// <summary>The value column of the two-column summary for <paramref name="item"/>.</summary>
    public static string SummaryValue(IDocument doc, string item)
    {
        string[]? row = Table(doc, "summary").Rows.FirstOrDefault(r => r[0] == item);
        Assert.True(row != null, $"no summary row {item}");
        return row[1];
    }

    /// <summary>The cautions section holds the safety cautions of hardware-notes/safety.md.</summary>
    public static void AssertCautions(IDocument doc)
    {
        string cautions = doc.QuerySelector("section#cautions")?.TextContent ?? string.Empty;
        Assert.Contains("is not proof that a wall or floor holds no live wiring or pipe", cautions);
        Assert.Contains("approved voltage tester", cautions);
        Assert.Contains("call before you dig", cautions);
        Assert.Contains("local electrical and building codes and licensed practice", cautions);
    }

    private static string Excerpt(string v) => v.Length > 60 ? v[..60] + "..." : v;
}
