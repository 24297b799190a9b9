using System.Globalization;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Planning;

namespace FreqReadout.Host.Reports;

/// <summary>
/// The report page of <c>plan --report DIR</c> (<see cref="ReplayReportPage.FileName"/> in DIR): the signal counted, the
/// timestamp methods, the predicted resolution with the device's load per method and estimator, what counting the
/// beat note gains, the depth at which the target is seen (when a target was given), the plots of
/// <see cref="PlanPlots"/>, the warnings, the inputs used and the cautions: the tables <c>plan</c> prints.
/// </summary>
public static class PlanReportPage
{
    /// <summary>Writes report.html into <paramref name="folder"/> (the plot files already there); returns its path.</summary>
    /// <param name="folder">The report folder.</param>
    /// <param name="planned">The inputs the plan was made from (every one goes into the settings table).</param>
    /// <param name="report">The plan.</param>
    /// <param name="plotFiles">The plot files <see cref="PlanPlots.Write"/> wrote.</param>
    public static string Write(string folder, PlanInputs planned, PlanReport report, IReadOnlyList<string> plotFiles)
    {
        bool beat = report.Signal == "beat";
        double counted = beat ? report.BeatHz : report.SearchHz;
        int prescale = beat ? report.BeatPrescale : report.SearchPrescale;
        var page = new ReportPage("FreqReadout plan: " + (beat ? "counting the beat note" : "counting the search oscillator"));
        page.AddText("About this report",
            Text($"Predicted before soldering: counting the {(beat ? "beat note" : "search oscillator")} at {counted:G6} Hz through a prescaler of {prescale} (search oscillator {report.SearchHz:G6} Hz, beat note {report.BeatHz:G6} Hz)."),
            "Resolution is the predicted standard deviation of a gate's frequency from the timing noise of each method (jitter and the timer's tick in quadrature); device % is the share of 1 M and of 5 M interpreted operations a second that taking the edges or reads and closing the gates costs (hardware-notes/device-budget.md). The oscillator's own noise and drift are not in these figures: measure them with stability. docs/plan.md gives the models and their sources.");

        var methods = new ReportTable("method", "input", "jitter us rms", "tick us", "reads/s", "max edges/s", "what");
        foreach (TimestampPreset m in report.Methods)
        {
            bool snapshots = m.Input == CaptureKind.Snapshots;
            methods.AddRow(m.Name, snapshots ? "snapshots" : "edges", Num(m.JitterS * 1e6), Num(1e6 / m.ClockHz), snapshots ? Num(m.ReadRateHz) : "every edge", Num(m.MaxEdgeRateHz), m.Description);
        }

        page.AddTable("Timestamp methods", methods);

        var resolution = new ReportTable("method", "estimator", "gate s", "Hz", "ppm", "updates/s", "edges or reads/s", "% of 1 M op/s", "% of 5 M op/s", "verdict");
        foreach (PlanRow row in report.Rows)
        {
            resolution.AddRow(row.Method, row.Estimator, Num(row.GateS), Num(row.ResolutionHz), Num(row.ResolutionPpm), Num(row.UpdatesPerS), Num(row.ServiceRatePerS), Num(row.BudgetPctAtLowRate), Num(row.BudgetPctAtHighRate), row.Verdict);
        }

        page.AddTable("Predicted resolution and device load", resolution, "verdict: ok; tight (over 100 % at 1 M op/s); over (over 100 % even at 5 M op/s, or more edges than the method takes).");
        foreach (string png in plotFiles.Where(f => f.EndsWith(".png", StringComparison.OrdinalIgnoreCase)))
        {
            string svg = Path.ChangeExtension(png, ".svg");
            bool depthPlot = Path.GetFileNameWithoutExtension(png).Contains("depth", StringComparison.OrdinalIgnoreCase);
            page.AddFigure(png, plotFiles.Contains(svg) ? svg : null, depthPlot
                ? "The target's largest gate reading of a pass, Hz, against the depth of its centre, mm, with each method's threshold (threshold x predicted gate noise) and the depth where they meet."
                : "Predicted resolution (standard deviation of a gate's frequency), Hz, against gate time, s, per method and estimator; both axes in decades.");
        }

        page.AddTable("What counting the beat note gains", PlanTables.BeatGains(report),
            Text($"Resolution at a {report.GateS:G3} s gate: beat note ({report.BeatHz:G6} Hz, /{report.BeatPrescale}) against the search oscillator ({report.SearchHz:G6} Hz, /{report.SearchPrescale}). The beat note also carries the reference oscillator's drift, its sign depends on the tuning side, and near zero beat the two oscillators pull or lock together."));

        if (report.Depth is { } d)
        {
            page.AddTable("How deep this target is seen", PlanTables.Depth(d),
                Text($"A {d.Material} sphere of radius {d.RadiusM * 1000:0.#} mm ({d.SignRuleClass} by the sign rule) passed straight under a {d.CoilDiameterM * 1000:0} mm coil {d.HeightM * 1000:0} mm above the surface at {d.SpeedMPerS:G3} m/s, seen where the largest gate reading of a pass ({d.GateS:G3} s gates) reaches {d.ThresholdSigma:G3} x the gate noise. none: not seen even 1.5 radii down; >: still seen at the deepest depth modelled; *: the gate is longer than half the pass, so the peak is smeared. A model, not a promise: soil, orientation and shape change it."));
        }

        // Each row's warning with the row it is about, as plan's console output names the gates (a bare "needs 170 %" says nothing on its own).
        var notes = report.Rows.SelectMany(r => r.Warnings.Select(w => Text($"{r.Method}, {r.Estimator}, gate {Num(r.GateS)} s: {w}"))).Concat(report.Warnings).ToList();
        page.AddText("Notes", notes.Count > 0 ? notes.ToArray() : new[] { "none" });

        var inputs = new ReportTable("setting", "value", "from");
        inputs.AddRow("signal", report.Signal, "command");
        inputs.AddRow("search_hz", Raw(report.SearchHz), "command");
        inputs.AddRow("beat_hz", Raw(report.BeatHz), "command");
        inputs.AddRow("search_prescale", report.SearchPrescale.ToString(CultureInfo.InvariantCulture), "command");
        inputs.AddRow("beat_prescale", report.BeatPrescale.ToString(CultureInfo.InvariantCulture), "command");
        inputs.AddRow("methods", string.Join(", ", planned.Methods.Select(m => m.Name)), "command");
        foreach (TimestampPreset m in planned.Methods)
        {
            string from = m.Name == "custom" ? "command" : "preset, --clock-hz";
            inputs.AddRow(m.Name + ".jitter_s", Raw(m.JitterS), from);
            inputs.AddRow(m.Name + ".clock_hz", Raw(m.ClockHz), from);
            inputs.AddRow(m.Name + ".read_rate_hz", Raw(m.ReadRateHz), from);
            inputs.AddRow(m.Name + ".max_edge_rate_hz", Raw(m.MaxEdgeRateHz), from);
        }

        inputs.AddRow("gates_s", string.Join(", ", planned.GatesS.Select(Raw)), "command");
        inputs.AddRow("gate_s", Raw(report.GateS), "command");
        if (report.Depth is { } target)
        {
            inputs.AddRow("material", target.Material, "command");
            inputs.AddRow("radius_m", Raw(target.RadiusM), "command");
            inputs.AddRow("coil_diameter_m", Raw(target.CoilDiameterM), "command");
            if (planned.Target is { } t)
            {
                inputs.AddRow("turns", t.Coil.Turns.ToString(CultureInfo.InvariantCulture), "command");
                inputs.AddRow("wire_m", Raw(t.Coil.WireDiameterM), "command");
                inputs.AddRow("inductance_h", Raw(t.InductanceH), "coil model");
                inputs.AddRow("conductivity_s_per_m", Raw(t.Material.ConductivitySPerM), "material");
                inputs.AddRow("mu_r", Raw(t.Material.RelativePermeability), "material");
            }

            inputs.AddRow("height_m", Raw(target.HeightM), "command");
            inputs.AddRow("speed_m_per_s", Raw(target.SpeedMPerS), "command");
            inputs.AddRow("threshold_sigma", Raw(target.ThresholdSigma), "command");
        }

        page.AddTable("Settings used", inputs);
        page.AddCautions(ReportCautions.BeforeDrillingCuttingOrDigging);
        string path = Path.Combine(folder, ReplayReportPage.FileName);
        page.Write(path);
        return path;
    }

    private static string Num(double v) => Commands.PlanCommand.Num(v);

    private static string Raw(double v) => v.ToString("R", CultureInfo.InvariantCulture);

    private static string Text(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}
