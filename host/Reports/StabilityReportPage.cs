using System.Globalization;
using FreqReadout.Host.Commands;
using FreqReadout.Host.Stability;

namespace FreqReadout.Host.Reports;

/// <summary>
/// The report page of <c>stability --report DIR</c> (<see cref="ReplayReportPage.FileName"/> in DIR): what was measured,
/// the summary, the deviation plot (<see cref="StabilityPlot"/>), the deviation table <c>stability</c> prints, the settings
/// used, the command's note on what the numbers mean, and the cautions.
/// </summary>
public static class StabilityReportPage
{
    /// <summary>The deviation table as <c>stability</c> prints it: tau s, ADEV, 68 % interval, ADEV Hz, MDEV, noise (MDEV slope).</summary>
    public static ReportTable DeviationTable(EdgePhase phase, StabilityAnalysis analysis)
    {
        var table = new ReportTable("tau s", "ADEV", "68 % interval", "ADEV Hz", "MDEV", "noise (MDEV slope)");
        foreach (StabilityPoint r in analysis.Rows)
        {
            table.AddRow(Num(r.TauSeconds, "G4"), Num(r.Adev, "0.000E+00"), $"{Num(r.AdevLow, "0.000E+00")} - {Num(r.AdevHigh, "0.000E+00")}", Num(r.Adev * phase.CountedHz, "G4"), Num(r.Mdev, "0.000E+00"), StabilityCommand.NoiseWord(r.Noise));
        }

        return table;
    }

    /// <summary>The summary rows: capture, edges, counted frequency, phase step, smallest deviation, recommended gate.</summary>
    public static ReportTable Summary(string captureName, EdgePhase phase, StabilityPoint? lowest, StabilityPoint? gate, double shortestPassSeconds)
    {
        var t = new ReportTable("item", "value");
        t.AddRow("capture", captureName);
        t.AddRow("edges", phase.Edges.ToString(CultureInfo.InvariantCulture));
        t.AddRow("counted signal", Num(phase.CountedHz, "0.###") + " Hz");
        t.AddRow("phase points every", Num(phase.Tau0Seconds * 1e6, "0.###") + " us");
        t.AddRow("smallest ADEV", lowest != null ? $"{Num(lowest.Adev, "0.000E+00")} ({Num(lowest.Adev * phase.CountedHz, "G4")} Hz) at tau {Num(lowest.TauSeconds, "G4")} s" : "-");
        t.AddRow("recommended gate", gate != null
            ? $"{Num(gate.TauSeconds, "G4")} s (the smallest ADEV at or below half the shortest pass, {Num(shortestPassSeconds / 2, "G4")} s)"
            : $"none (no averaging time at or below half the shortest pass, {Num(shortestPassSeconds / 2, "G4")} s, could be analysed)");
        return t;
    }

    /// <summary>Writes report.html into <paramref name="folder"/> (the plot files already there); returns its path.</summary>
    public static string Write(string folder, string captureName, EdgePhase phase, StabilityAnalysis analysis, StabilityPoint? lowest, StabilityPoint? gate, double shortestPassSeconds, IReadOnlyList<string> plotFiles)
    {
        var page = new ReportPage("FreqReadout stability report: " + Path.GetFileName(captureName));
        page.AddText("About this report",
            "The overlapping and modified Allan deviation of the counted signal over averaging times in octave steps, from the phase that the capture's edge timestamps give, with 68.3 % intervals of the overlapping deviation.",
            StabilityCommand.MeaningNote);
        page.AddTable("Summary", Summary(captureName, phase, lowest, gate, shortestPassSeconds));
        foreach (string png in plotFiles.Where(f => f.EndsWith(".png", StringComparison.OrdinalIgnoreCase)))
        {
            string svg = Path.ChangeExtension(png, ".svg");
            page.AddFigure(png, plotFiles.Contains(svg) ? svg : null,
                "Overlapping Allan deviation (dark filled circles) with its 68.3 % interval as bars, and the modified Allan deviation (light open squares), fractional, against the averaging time tau, s; both axes in decades.");
        }

        page.AddTable("Deviations", DeviationTable(phase, analysis), "Deviations are fractional (of the counted frequency); ADEV Hz is ADEV times the counted frequency.");
        var settings = new ReportTable("setting", "value", "from");
        settings.AddRow("shortest_pass_s", shortestPassSeconds.ToString("R", CultureInfo.InvariantCulture), "command");
        settings.AddRow("tau0_s", phase.Tau0Seconds.ToString("R", CultureInfo.InvariantCulture), "capture");
        settings.AddRow("confidence", StabilityAnalysis.Confidence.ToString("R", CultureInfo.InvariantCulture), "analysis");
        page.AddTable("Settings used", settings);
        page.AddCautions(ReportCautions.BeforeDrillingCuttingOrDigging);
        string path = Path.Combine(folder, ReplayReportPage.FileName);
        page.Write(path);
        return path;
    }

    private static string Num(double v, string format) => double.IsFinite(v) ? v.ToString(format, CultureInfo.InvariantCulture) : "-";
}
