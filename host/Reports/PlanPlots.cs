using System.Globalization;
using FreqReadout.Host.Planning;
using ScottPlot;

namespace FreqReadout.Host.Reports;

/// <summary>
/// The plots of <c>plan --report DIR</c>, each as PNG and SVG of <see cref="ReplayPlots.Width"/> x
/// <see cref="ReplayPlots.Height"/> pixels: resolution.* (predicted resolution against gate time, one series per method and
/// estimator, both axes in decades) and, with a target, depth.* (the target's peak shift against depth, the gate-averaged
/// peak, each method's threshold as a horizontal line and its predicted depth as a marker on it). A method keeps one grey
/// level from dark to light and an estimator one marker shape (filled circle reciprocal, open square regression, filled
/// triangle snapshot regression), so the series stay apart in grey print; lines are solid (SkiaSharp's SVG canvas cannot
/// write dashes). <see cref="Write"/> returns the files written, for a page that embeds them.
/// </summary>
public sealed class PlanPlots
{
    /// <summary>The title of the resolution plot.</summary>
    public const string ResolutionTitle = "Predicted resolution against gate time";

    /// <summary>The title of the depth plot.</summary>
    public const string DepthTitle = "Target shift against depth";

    private static readonly string[] MethodColours = { "#111827", "#4b5563", "#9ca3af", "#6b3e1e" };

    /// <summary>Writes resolution.png/.svg and, when the report has a depth answer, depth.png/.svg; returns the paths in that order.</summary>
    public IReadOnlyList<string> Write(string folder, PlanReport report)
    {
        var files = new List<string>();
        files.AddRange(WriteResolution(folder, report));
        if (report.Depth is not null)
        {
            files.AddRange(WriteDepth(folder, report, report.Depth));
        }

        return files;
    }

    private static Color MethodColour(PlanReport report, string method)
    {
        int i = report.Methods.FindIndex(m => m.Name == method);
        return Color.FromHex(MethodColours[Math.Max(0, i) % MethodColours.Length]);
    }

    private static MarkerShape EstimatorMarker(string estimator) => estimator switch
    {
        PlanEstimators.Reciprocal => MarkerShape.FilledCircle,
        PlanEstimators.Regression => MarkerShape.OpenSquare,
        _ => MarkerShape.FilledTriangleUp,
    };

    private static void DecadeAxis(IAxis axis)
    {
        axis.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic
        {
            IntegerTicksOnly = true,
            MinorTickGenerator = new ScottPlot.TickGenerators.LogMinorTickGenerator(),
            LabelFormatter = v => "1e" + Math.Round(v).ToString("0", CultureInfo.InvariantCulture),
        };
    }

    private static IReadOnlyList<string> Save(Plot plot, string folder, string name)
    {
        string png = Path.Combine(folder, name + ".png");
        string svg = Path.Combine(folder, name + ".svg");
        plot.SavePng(png, ReplayPlots.Width, ReplayPlots.Height);
        plot.SaveSvg(svg, ReplayPlots.Width, ReplayPlots.Height);
        return new[] { png, svg };
    }

    private static IReadOnlyList<string> WriteResolution(string folder, PlanReport report)
    {
        var plot = new Plot();
        foreach (var group in report.Rows.Where(r => r.ResolutionHz > 0).GroupBy(r => (r.Method, r.Estimator)))
        {
            PlanRow[] rows = group.OrderBy(r => r.GateS).ToArray();
            var series = plot.Add.Scatter(rows.Select(r => Math.Log10(r.GateS)).ToArray(), rows.Select(r => Math.Log10(r.ResolutionHz)).ToArray());
            series.LegendText = group.Key.Method + ", " + group.Key.Estimator;
            series.Color = MethodColour(report, group.Key.Method);
            series.MarkerShape = EstimatorMarker(group.Key.Estimator);
            series.MarkerSize = 8;
            series.LineWidth = 1.5f;
        }

        string signal = report.Signal == "beat" ? "beat note" : "search oscillator";
        plot.Title(ResolutionTitle + " (" + signal + ")");
        plot.XLabel("gate time (s)");
        plot.YLabel("resolution, 1 sigma (Hz)");
        DecadeAxis(plot.Axes.Left);
        DecadeAxis(plot.Axes.Bottom);
        plot.ShowLegend(Alignment.LowerLeft);
        return Save(plot, folder, "resolution");
    }

    private static IReadOnlyList<string> WriteDepth(string folder, PlanReport report, PlanDepthReport depth)
    {
        var plot = new Plot();
        DepthPoint[] curve = depth.Curve.Where(p => p.PeakShiftHz > 0).ToArray();
        double[] x = curve.Select(p => p.DepthM * 1000).ToArray();
        DepthPoint[] gated = curve.Where(p => p.GateShiftHz > 0).ToArray();
        var gate = plot.Add.ScatterLine(gated.Select(p => p.DepthM * 1000).ToArray(), gated.Select(p => Math.Log10(p.GateShiftHz)).ToArray());
        gate.LegendText = string.Create(CultureInfo.InvariantCulture, $"largest {depth.GateS:G3} s gate reading");
        gate.Color = Color.FromHex("#b8bec6");
        gate.LineWidth = 6f;
        var peak = plot.Add.ScatterLine(x, curve.Select(p => Math.Log10(p.PeakShiftHz)).ToArray());
        peak.LegendText = "peak shift of a pass";
        peak.Color = Color.FromHex("#111827");
        peak.LineWidth = 1.5f;
        double left = x.Length > 0 ? x[0] : 0;
        double right = x.Length > 0 ? x[^1] : 1;
        foreach (DepthRow row in depth.Rows.Where(r => r.ThresholdHz > 0))
        {
            double y = Math.Log10(row.ThresholdHz);
            var line = plot.Add.Line(left, y, right, y);
            line.Color = MethodColour(report, row.Method);
            line.LineWidth = 1;
            if (row.DepthM is double d)
            {
                var mark = plot.Add.Scatter(new[] { d * 1000 }, new[] { y });
                mark.Color = MethodColour(report, row.Method);
                mark.MarkerShape = EstimatorMarker(row.Estimator);
                mark.MarkerSize = 10;
                mark.LineWidth = 0;
                mark.LegendText = string.Create(CultureInfo.InvariantCulture, $"threshold and depth, {row.Method}, {row.Estimator}: {d * 1000:0} mm");
            }
            else
            {
                line.LegendText = $"threshold, {row.Method}, {row.Estimator}: not reached";
            }
        }

        plot.Title(string.Create(CultureInfo.InvariantCulture, $"{DepthTitle} ({depth.Material}, radius {depth.RadiusM * 1000:0.#} mm)"));
        plot.XLabel("target depth below the surface (mm)");
        plot.YLabel("search shift (Hz)");
        DecadeAxis(plot.Axes.Left);
        plot.Axes.Bottom.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic
        {
            LabelFormatter = v => v.ToString("0.##", CultureInfo.InvariantCulture),
        };
        plot.ShowLegend(Alignment.UpperRight);
        return Save(plot, folder, "depth");
    }
}
