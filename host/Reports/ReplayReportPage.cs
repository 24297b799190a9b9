using FreqReadout.Host.Replay;

namespace FreqReadout.Host.Reports;

/// <summary>
/// The report page of <c>replay --report DIR</c> and <c>demo --report DIR</c> (<see cref="FileName"/> in DIR), in two
/// steps so a command can put its own sections between them: <see cref="Start"/> (introduction, summary, the plots of
/// <see cref="ReplayPlots"/>, re-baselines, events), then <see cref="Finish"/> (settings used, notes, cautions).
/// </summary>
public static class ReplayReportPage
{
    /// <summary>The page's file name in the report folder.</summary>
    public const string FileName = "report.html";

    /// <summary>The heading of the events table (its section id is "events").</summary>
    public const string EventsHeading = "Events";

    /// <summary>Starts the page: introduction, summary table, every PNG of <paramref name="plotFiles"/> with its caption, re-baselines and events.</summary>
    public static ReportPage Start(string title, IReadOnlyList<string> introduction, ReportTable summary, ReplayReport report, IReadOnlyList<string> plotFiles)
    {
        var page = new ReportPage(title);
        page.AddText("About this report", introduction.ToArray());
        page.AddTable("Summary", summary);
        foreach (string png in plotFiles.Where(f => f.EndsWith(".png", StringComparison.OrdinalIgnoreCase)))
        {
            string svg = Path.ChangeExtension(png, ".svg");
            page.AddFigure(png, plotFiles.Contains(svg) ? svg : null, Caption(Path.GetFileNameWithoutExtension(png)));
        }

        page.AddTable("Re-baselines", ReplayTables.Rebaselines(report), "Times from the first edge of the capture; the shift is the level the baseline moved to.");
        page.AddTable(EventsHeading, ReplayTables.Events(report), "Times from the first edge of the capture; peak shift of the search oscillator from the tracked baseline; sigma: the peak over the noise.");
        return page;
    }

    /// <summary>Ends the page: the settings used, the replay's warnings as notes (when any), and the cautions.</summary>
    public static void Finish(ReportPage page, ReportTable settings, IReadOnlyList<string> warnings)
    {
        page.AddTable("Settings used", settings, "Every setting of the counting and the readout as the run used it, defaults included.");
        if (warnings.Count > 0)
        {
            page.AddText("Notes", warnings.ToArray());
        }

        page.AddCautions(ReportCautions.BeforeDrillingCuttingOrDigging);
    }

    private static string Caption(string plot) => plot switch
    {
        "frequency" => "Counted frequency per gate (light line) and the tracked baseline (dark line), Hz, against time from the first edge, s.",
        "shift" => "Search-oscillator shift from the tracked baseline (dark line) with the detection threshold band of plus and minus threshold x noise (mid-tone lines); events at their peaks by class (filled square ferrous, open circle non-ferrous, cross unclear); re-baselines as light vertical lines.",
        "noise" => "Histogram of the shift of every target-free reading (the residuals behind the noise figure), with two normal curves scaled to counts: median and robust sigma, 1.4826 x MAD, which is the noise figure (dark), and mean and standard deviation (mid-tone). Bins are a quarter of the robust sigma wide.",
        _ => plot,
    };
}
