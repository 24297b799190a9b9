using System.Globalization;
using FreqReadout.Host.Planning;

namespace FreqReadout.Host.Reports;

/// <summary>
/// The tables <c>plan</c> prints on the console and its report page shows, built once so both carry the same cells:
/// the beat-note gain per method and estimator, and the depth answer per method and estimator.
/// </summary>
public static class PlanTables
{
    /// <summary>Method, estimator, resolution counting the search oscillator and the beat note, Hz, and their ratio.</summary>
    public static ReportTable BeatGains(PlanReport report)
    {
        var table = new ReportTable("method", "estimator", "search Hz", "beat Hz", "gain x");
        foreach (BeatGainRow g in report.BeatGains)
        {
            table.AddRow(g.Method, g.Estimator, Num(g.SearchResolutionHz), Num(g.BeatResolutionHz), Num(g.Gain));
        }

        return table;
    }

    /// <summary>
    /// Method, estimator, gate noise and threshold, Hz, the depth, mm ("none": not seen even 1.5 radii down; a leading
    /// "&gt;": still seen at the deepest depth modelled; a trailing "*": the peak is smeared), and the pass time, s.
    /// </summary>
    public static ReportTable Depth(PlanDepthReport depth)
    {
        var table = new ReportTable("method", "estimator", "noise Hz", "threshold Hz", "depth mm", "pass s");
        foreach (DepthRow row in depth.Rows)
        {
            table.AddRow(
                row.Method,
                row.Estimator,
                Num(row.NoiseHz),
                Num(row.ThresholdHz),
                row.DepthM is double m ? (row.BeyondRange ? ">" : string.Empty) + (m * 1000).ToString("0", CultureInfo.InvariantCulture) + (row.Smeared ? "*" : string.Empty) : "none",
                row.PassS is double p ? Num(p) : "-");
        }

        return table;
    }

    private static string Num(double v) => Commands.PlanCommand.Num(v);
}
