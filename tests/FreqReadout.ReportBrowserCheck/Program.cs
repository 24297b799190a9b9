using System.Globalization;
using FreqReadout.ReportBrowserCheck;
using SkiaSharp;

// Usage: FreqReadout.ReportBrowserCheck DOM_FILE SCREENSHOT_PNG
// Prints one "PASS ..." or "FAIL ..." line per check (the page's own check; the plot areas of the screenshot);
// exit code 0 when both passed, 1 otherwise, 2 on a usage error.
if (args.Length != 2)
{
    Console.Error.WriteLine("usage: FreqReadout.ReportBrowserCheck DOM_FILE SCREENSHOT_PNG");
    return 2;
}

int failed = 0;
string dom = File.Exists(args[0]) ? File.ReadAllText(args[0]) : string.Empty;
PageCheckMarker.TryRead(dom, out PageCheckMarker? marker, out string? reason);
if (marker == null)
{
    Console.WriteLine($"FAIL page check: {reason} in {args[0]} (did the browser load the page?)");
    failed++;
}
else if (marker.Status != "ok")
{
    Console.WriteLine($"FAIL page check: status {marker.Status} (images decoded {marker.Images}; \"pending\" means the page's script did not run)");
    failed++;
}
else
{
    Console.WriteLine($"PASS page check: no page errors, images decoded {marker.Images}");
}

using SKBitmap? shot = File.Exists(args[1]) ? SKBitmap.Decode(args[1]) : null;
if (shot == null)
{
    Console.WriteLine($"FAIL plot areas: no screenshot to read at {args[1]}");
    failed++;
}
else if (marker == null || marker.Rects.Count == 0)
{
    Console.WriteLine("FAIL plot areas: the page reported no image rectangles to look at");
    failed++;
}
else
{
    var problems = new List<string>();
    var shares = new List<string>();
    for (int i = 0; i < marker.Rects.Count; i++)
    {
        double share = PlotAreaCheck.CoveredShare(shot, marker.Rects[i]);
        double drawn = PlotAreaCheck.DrawnShare(shot, marker.Rects[i]);
        shares.Add(double.IsNaN(share) ? "-" : $"{share.ToString("P0", CultureInfo.InvariantCulture)} of cells, {drawn.ToString("P1", CultureInfo.InvariantCulture)} of pixels");
        if (double.IsNaN(share))
        {
            problems.Add($"image {i + 1} at {marker.Rects[i]} lies outside the {shot.Width}x{shot.Height} screenshot");
        }
        else if (share < PlotAreaCheck.MinCoveredShare)
        {
            problems.Add($"image {i + 1} looks blank: drawn pixels in only {share.ToString("P0", CultureInfo.InvariantCulture)} of its {PlotAreaCheck.Columns}x{PlotAreaCheck.Rows} cells (a plot needs {PlotAreaCheck.MinCoveredShare.ToString("P0", CultureInfo.InvariantCulture)})");
        }
    }

    if (problems.Count > 0)
    {
        Console.WriteLine("FAIL plot areas: " + string.Join("; ", problems));
        failed++;
    }
    else
    {
        Console.WriteLine($"PASS plot areas: {marker.Rects.Count} plots drawn in the screenshot (drawn: {string.Join("; ", shares)})");
    }
}

return failed == 0 ? 0 : 1;
