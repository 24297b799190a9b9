using System.Buffers.Binary;
using System.Globalization;
using System.Net;
using System.Text;

namespace FreqReadout.Host.Reports;

/// <summary>
/// One self-contained HTML page of a report (report.html): sections in the order they were added — text, tables
/// (<see cref="ReportTable"/>), figures (a PNG embedded as a base64 data URI, its SVG twin named in the caption) and the
/// cautions — with the page's own style sheet and one small inline script, so it opens from disk with no network: no
/// external style, script, font or image. Every text is HTML-encoded (<see cref="WebUtility.HtmlEncode"/>). Each
/// section is a <c>&lt;section id="SLUG"&gt;</c> with an <c>&lt;h2&gt;</c>, SLUG the heading in lower case with every
/// run of other characters than a-z and 0-9 as one '-'.
/// <para>
/// The inline script checks the page once it has loaded: every image decoded (naturalWidth above 0) and no error event.
/// It writes the result into the hidden element <c>#page-check</c>: <c>data-status</c> "ok" or "failed" (it stays
/// "pending" when scripts do not run), <c>data-images</c> "decoded/all", and <c>data-rects</c> the page rectangle
/// "left,top,width,height" of each image in CSS pixels, ';' between them (.ci/run reads them from a headless browser).
/// </para>
/// </summary>
public sealed class ReportPage
{
    private readonly StringBuilder _body = new();
    private readonly HashSet<string> _ids = new(StringComparer.Ordinal);

    /// <summary>A page with this title (the &lt;title&gt; and the &lt;h1&gt;).</summary>
    public ReportPage(string title)
    {
        Title = title;
    }

    /// <summary>The page title.</summary>
    public string Title { get; }

    /// <summary>Figures added so far.</summary>
    public int FigureCount { get; private set; }

    /// <summary>Tables added so far.</summary>
    public int TableCount { get; private set; }

    /// <summary>The section id of a heading (see the class summary).</summary>
    public static string Slug(string heading)
    {
        var sb = new StringBuilder();
        foreach (char c in heading.ToLowerInvariant())
        {
            if (c is >= 'a' and <= 'z' or >= '0' and <= '9')
            {
                sb.Append(c);
            }
            else if (sb.Length > 0 && sb[^1] != '-')
            {
                sb.Append('-');
            }
        }

        return sb.ToString().TrimEnd('-');
    }

    /// <summary>Adds a section of paragraphs (one per element of <paramref name="paragraphs"/>).</summary>
    public void AddText(string heading, params string[] paragraphs)
    {
        Open(heading, null);
        foreach (string p in paragraphs)
        {
            _body.Append("<p>").Append(E(p)).Append("</p>\n");
        }

        Close();
    }

    /// <summary>Adds a section holding <paramref name="table"/>, with an optional note under it.</summary>
    public void AddTable(string heading, ReportTable table, string? note = null)
    {
        Open(heading, null);
        _body.Append("<table>\n<thead><tr>");
        foreach (string h in table.Headers)
        {
            _body.Append("<th scope=\"col\">").Append(E(h)).Append("</th>");
        }

        _body.Append("</tr></thead>\n<tbody>\n");
        foreach (IReadOnlyList<string> row in table.Rows)
        {
            _body.Append("<tr>");
            foreach (string cell in row)
            {
                _body.Append(LooksNumeric(cell) ? "<td class=\"num\">" : "<td>").Append(E(cell)).Append("</td>");
            }

            _body.Append("</tr>\n");
        }

        if (table.Rows.Count == 0)
        {
            _body.Append("<tr><td colspan=\"").Append(table.Headers.Count.ToString(CultureInfo.InvariantCulture)).Append("\" class=\"none\">none</td></tr>\n");
        }

        _body.Append("</tbody>\n</table>\n");
        if (note != null)
        {
            _body.Append("<p class=\"note\">").Append(E(note)).Append("</p>\n");
        }

        TableCount++;
        Close();
    }

    /// <summary>
    /// Adds a figure: the PNG at <paramref name="pngPath"/> embedded (its width and height from the file's header), the
    /// caption under it, and the file names of the PNG and, when given, its SVG twin (names only, not links).
    /// </summary>
    /// <exception cref="InvalidDataException">The file is not a PNG.</exception>
    public void AddFigure(string pngPath, string? svgPath, string caption)
    {
        byte[] png = File.ReadAllBytes(pngPath);
        if (!TryReadPngSize(png, out int width, out int height))
        {
            throw new InvalidDataException($"{pngPath}: not a PNG file (no PNG signature and IHDR header)");
        }

        FigureCount++;
        string number = FigureCount.ToString(CultureInfo.InvariantCulture);
        string files = Path.GetFileName(pngPath) + (svgPath != null ? ", " + Path.GetFileName(svgPath) : string.Empty);
        _body.Append("<figure id=\"figure-").Append(number).Append("\">\n<img src=\"data:image/png;base64,").Append(Convert.ToBase64String(png))
            .Append("\" width=\"").Append(width.ToString(CultureInfo.InvariantCulture)).Append("\" height=\"").Append(height.ToString(CultureInfo.InvariantCulture))
            .Append("\" alt=\"").Append(E(caption)).Append("\">\n<figcaption><b>Figure ").Append(number).Append(".</b> ").Append(E(caption))
            .Append(" <span class=\"files\">(").Append(E(files)).Append(")</span></figcaption>\n</figure>\n");
    }

    /// <summary>Adds the cautions section (heading "Cautions", one list item per caution).</summary>
    public void AddCautions(IEnumerable<string> cautions)
    {
        Open("Cautions", "cautions");
        _body.Append("<ul>\n");
        foreach (string c in cautions)
        {
            _body.Append("<li>").Append(E(c)).Append("</li>\n");
        }

        _body.Append("</ul>\n");
        Close();
    }

    /// <summary>The whole page as HTML text.</summary>
    public string ToHtml()
    {
        var page = new StringBuilder();
        page.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
            .Append("<title>").Append(E(Title)).Append("</title>\n<style>\n").Append(Style).Append("</style>\n<script>\n").Append(CheckScript).Append("</script>\n</head>\n<body>\n")
            .Append("<h1>").Append(E(Title)).Append("</h1>\n")
            .Append(_body)
            .Append("<p id=\"page-check\" hidden data-status=\"pending\"></p>\n</body>\n</html>\n");
        return page.ToString();
    }

    /// <summary>Writes the page (UTF-8, no byte order mark) to <paramref name="path"/>, replacing a file there.</summary>
    public void Write(string path) => File.WriteAllText(path, ToHtml(), new UTF8Encoding(false));

    /// <summary>Reads width and height from a PNG's IHDR chunk (PNG specification, ISO/IEC 15948:2004, IHDR: width and height as 4-byte big-endian integers at bytes 16-23 of the file; from memory); false when it is not a PNG.</summary>
    public static bool TryReadPngSize(ReadOnlySpan<byte> png, out int width, out int height)
    {
        ReadOnlySpan<byte> signature = stackalloc byte[] { 0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A };
        width = 0;
        height = 0;
        if (png.Length < 24 || !png[..8].SequenceEqual(signature) || !png.Slice(12, 4).SequenceEqual("IHDR"u8))
        {
            return false;
        }

        width = BinaryPrimitives.ReadInt32BigEndian(png.Slice(16, 4));
        height = BinaryPrimitives.ReadInt32BigEndian(png.Slice(20, 4));
        return width > 0 && height > 0;
    }

    private void Open(string heading, string? cssClass)
    {
        string id = Slug(heading);
        string unique = id;
        for (int i = 2; !_ids.Add(unique); i++)
        {
            unique = id + "-" + i.ToString(CultureInfo.InvariantCulture);
        }

        _body.Append("<section id=\"").Append(unique).Append('"').Append(cssClass != null ? $" class=\"{cssClass}\"" : string.Empty).Append(">\n<h2>").Append(E(heading)).Append("</h2>\n");
    }

    private void Close() => _body.Append("</section>\n");

    private static string E(string text) => WebUtility.HtmlEncode(text);

    private static bool LooksNumeric(string cell)
    {
        string first = cell.Split(' ', 2)[0];
        return first.Length > 0 && double.TryParse(first, NumberStyles.Float, CultureInfo.InvariantCulture, out _);
    }

    // Black on white, grey rules and a grey header row, a thick dark rule beside the cautions: readable printed in grey.
    private const string Style = """
        body { font-family: system-ui, "Segoe UI", Helvetica, Arial, sans-serif; color: #111; background: #fff; max-width: 1060px; margin: 1.5em auto; padding: 0 1em; line-height: 1.4; }
        h1 { font-size: 1.5em; border-bottom: 3px solid #111; padding-bottom: 0.2em; }
        h2 { font-size: 1.15em; margin-top: 1.6em; border-bottom: 1px solid #888; }
        table { border-collapse: collapse; margin: 0.5em 0; font-size: 0.92em; }
        th, td { border: 1px solid #999; padding: 0.2em 0.55em; text-align: left; vertical-align: top; }
        th { background: #e4e4e4; font-weight: 600; }
        td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
        td.none { color: #555; font-style: italic; }
        p.note, span.files { color: #444; font-size: 0.9em; }
        figure { margin: 1.2em 0; }
        figure img { display: block; max-width: 100%; height: auto; border: 1px solid #bbb; }
        figcaption { font-size: 0.92em; margin-top: 0.3em; }
        section.cautions { border-left: 6px solid #111; padding: 0.1em 0.9em 0.3em; background: #f2f2f2; }
        section.cautions li { margin: 0.3em 0; }
        @media print { body { max-width: none; margin: 0; } figure { break-inside: avoid; } section.cautions { background: none; } }

        """;

    // The page's self-check (see the class summary); plain ES5, no network.
    private const string CheckScript = """
        (function () {
          var errors = 0;
          window.addEventListener('error', function () { errors++; }, true);
          window.addEventListener('load', function () {
            var images = document.images, decoded = 0, rects = [];
            for (var i = 0; i < images.length; i++) {
              var im = images[i], r = im.getBoundingClientRect();
              if (im.complete && im.naturalWidth > 0) { decoded++; }
              rects.push([Math.round(r.left + window.scrollX), Math.round(r.top + window.scrollY), Math.round(r.width), Math.round(r.height)].join(','));
            }
            var mark = document.getElementById('page-check');
            mark.setAttribute('data-images', decoded + '/' + images.length);
            mark.setAttribute('data-rects', rects.join(';'));
            mark.setAttribute('data-status', errors === 0 && decoded === images.length ? 'ok' : 'failed');
          });
        })();

        """;
}
