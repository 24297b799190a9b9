using System.Globalization;
using System.Net;
using System.Text.RegularExpressions;

namespace FreqReadout.ReportBrowserCheck;

/// <summary>
/// What a report page's inline check wrote into its <c>#page-check</c> element, read from the DOM a browser dumped
/// (FreqReadout.Host.Reports.ReportPage): status ("ok", "failed", or "pending" when no script ran), images decoded of
/// all, and each image's rectangle on the page in CSS pixels.
/// </summary>
public sealed class PageCheckMarker
{
    private PageCheckMarker(string status, string images, IReadOnlyList<PageRect> rects)
    {
        Status = status;
        Images = images;
        Rects = rects;
    }

    /// <summary>ok, failed or pending.</summary>
    public string Status { get; }

    /// <summary>"decoded/all".</summary>
    public string Images { get; }

    /// <summary>The images' rectangles, in page order.</summary>
    public IReadOnlyList<PageRect> Rects { get; }

    /// <summary>Reads the marker from dumped DOM text; false (with the reason) when there is none.</summary>
    public static bool TryRead(string dom, out PageCheckMarker? marker, out string? reason)
    {
        marker = null;
        Match element = Regex.Match(dom, "<p\\b[^>]*\\bid=\"page-check\"[^>]*>");
        if (!element.Success)
        {
            reason = "the page has no #page-check element";
            return false;
        }

        string Attribute(string name)
        {
            Match m = Regex.Match(element.Value, "\\b" + name + "=\"([^\"]*)\"");
            return m.Success ? WebUtility.HtmlDecode(m.Groups[1].Value) : string.Empty;
        }

        var rects = new List<PageRect>();
        foreach (string part in Attribute("data-rects").Split(';', StringSplitOptions.RemoveEmptyEntries))
        {
            string[] n = part.Split(',');
            if (n.Length != 4 || !n.All(v => int.TryParse(v, NumberStyles.Integer, CultureInfo.InvariantCulture, out _)))
            {
                reason = $"data-rects entry \"{part}\" is not left,top,width,height";
                return false;
            }

            int[] v = n.Select(x => int.Parse(x, CultureInfo.InvariantCulture)).ToArray();
            rects.Add(new PageRect(v[0], v[1], v[2], v[3]));
        }

        marker = new PageCheckMarker(Attribute("data-status"), Attribute("data-images"), rects);
        reason = null;
        return true;
    }
}
