using FreqReadout.Host.Stability;
using ScottPlot;

namespace FreqReadout.Host.Reports;

/// <summary>
/// The plot of <c>stability --report DIR</c>, as deviation.png and deviation.svg (<see cref="ReplayPlots.Width"/> x
/// <see cref="ReplayPlots.Height"/>): the overlapping Allan deviation with its 68.3 % interval as bars, and the modified
/// deviation, against tau, both axes in decades (log10 of the values, labelled with the values). Dark filled circles
/// and light open squares, solid lines: apart in grey print.
/// </summary>
public static class StabilityPlot
{
    /// <summary>Writes the plot into <paramref name="folder"/>; returns the files written.</summary>
    public static IReadOnlyList<string> Write(string folder, StabilityAnalysis analysis)
    {
        StabilityPoint[] rows = analysis.Rows.Where(r => r.Adev > 0).ToArray();
        double[] x = rows.Select(r => Math.Log10(r.TauSeconds)).ToArray();
        var plot = new Plot();
        var adev = plot.Add.Scatter(x, rows.Select(r => Math.Log10(r.Adev)).ToArray());
        adev.LegendText = "Allan deviation (overlapping), 68.3 % interval";
        adev.Color = ReportPalette.Ink;
        adev.MarkerShape = MarkerShape.FilledCircle;
        adev.MarkerSize = 7;
        for (int i = 0; i < rows.Length; i++)
        {
            if (rows[i].AdevLow > 0 && rows[i].AdevHigh > 0)
            {
                var bar = plot.Add.Line(x[i], Math.Log10(rows[i].AdevLow), x[i], Math.Log10(rows[i].AdevHigh));
                bar.Color = ReportPalette.Ink;
                bar.LineWidth = 2;
            }
        }

        StabilityPoint[] mod = rows.Where(r => r.Mdev > 0).ToArray();
        var mdev = plot.Add.Scatter(mod.Select(r => Math.Log10(r.TauSeconds)).ToArray(), mod.Select(r => Math.Log10(r.Mdev)).ToArray());
        mdev.LegendText = "modified Allan deviation";
        mdev.Color = ReportPalette.Light;
        mdev.MarkerShape = MarkerShape.OpenSquare;
        mdev.MarkerSize = 7;
        plot.Title("Frequency stability of the counted signal");
        plot.XLabel("averaging time tau (s)");
        plot.YLabel("deviation (fractional)");
        foreach (IAxis axis in new IAxis[] { plot.Axes.Left, plot.Axes.Bottom })
        {
            axis.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic
            {
                LabelFormatter = v => "1e" + Math.Round(v, 2).ToString("0.##", System.Globalization.CultureInfo.InvariantCulture),
            };
        }

        plot.ShowLegend();
        string png = Path.Combine(folder, "deviation.png");
        string svg = Path.Combine(folder, "deviation.svg");
        plot.SavePng(png, ReplayPlots.Width, ReplayPlots.Height);
        plot.SaveSvg(svg, ReplayPlots.Width, ReplayPlots.Height);
        return new[] { png, svg };
    }
}
