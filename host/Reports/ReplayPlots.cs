using FreqReadout.Detection;
using FreqReadout.Host.Replay;
using ScottPlot;

namespace FreqReadout.Host.Reports;

/// <summary>
/// The plots of <c>replay --report DIR</c>, each as PNG and SVG of <see cref="Width"/> x <see cref="Height"/> pixels
/// (ScottPlot): frequency.png/svg (counted frequency and the tracked baseline against time) and shift.png/svg (the
/// search shift against time with the detection threshold band of plus and minus threshold x noise, events marked by
/// class and re-baselines as thin vertical lines), and noise.png/svg (<see cref="NoiseHistogramPlot"/>). Colours and marker shapes are the project's own and stay apart in
/// grey print: a dark line, a mid-tone band, light lines, a filled square for ferrous, an open circle for non-ferrous,
/// a cross for unclear. Lines are solid: SkiaSharp's SVG canvas cannot write dash patterns (it says so on stderr).
/// </summary>
public static class ReplayPlots
{
    /// <summary>Width of every plot, pixels.</summary>
    public const int Width = 1000;

    /// <summary>Height of every plot, pixels.</summary>
    public const int Height = 500;

    private static readonly Color Dark = ReportPalette.Ink;
    private static readonly Color Light = ReportPalette.Light;
    private static readonly Color Band = ReportPalette.Mid;

    /// <summary>Writes the plots into <paramref name="folder"/>; returns the files written.</summary>
    public static IReadOnlyList<string> Write(string folder, ReadingTrace trace, ReplayReport report, double thresholdSigma)
    {
        var written = new List<string>();
        double[] t = trace.TimeSeconds.ToArray();

        var frequency = new Plot();
        var counted = frequency.Add.ScatterLine(t, trace.FrequencyHz.ToArray());
        counted.LegendText = "counted frequency";
        counted.Color = Light;
        var baseline = frequency.Add.ScatterLine(t, trace.BaselineHz.ToArray());
        baseline.LegendText = "tracked baseline";
        baseline.Color = Dark;
        baseline.LineWidth = 2;
        counted.LineWidth = 1;
        frequency.Title("Counted frequency and tracked baseline");
        frequency.XLabel("time (s)");
        frequency.YLabel("frequency (Hz)");
        frequency.ShowLegend(Alignment.UpperLeft); // above the first seconds, before any pass: free of traces
        written.AddRange(Save(frequency, folder, "frequency"));

        var shift = new Plot();
        var line = shift.Add.ScatterLine(t, trace.ShiftHz.ToArray());
        line.LegendText = "search shift";
        line.Color = Dark;
        double[] upper = trace.NoiseHz.Select(n => thresholdSigma * n).ToArray();
        var bandUp = shift.Add.ScatterLine(t, upper);
        bandUp.LegendText = $"threshold (+-{thresholdSigma:0.##} noise sigmas)";
        bandUp.Color = Band;
        bandUp.LineWidth = 1.5f;
        var bandDown = shift.Add.ScatterLine(t, upper.Select(u => -u).ToArray());
        bandDown.Color = Band;
        bandDown.LineWidth = 1.5f;
        foreach ((TargetClass cls, MarkerShape shape, string label) in new[]
        {
            (TargetClass.Ferrous, MarkerShape.FilledSquare, "ferrous"),
            (TargetClass.NonFerrous, MarkerShape.OpenCircle, "non-ferrous"),
            (TargetClass.Unclear, MarkerShape.Cross, "unclear"),
        })
        {
            ReplayEvent[] events = report.Events.Where(e => e.Event.Class == cls).ToArray();
            if (events.Length == 0)
            {
                continue;
            }

            var markers = shift.Add.Markers(events.Select(e => e.Event.PeakSeconds).ToArray(), events.Select(e => e.Event.PeakShiftHz).ToArray(), shape, 10, Dark);
            markers.LegendText = "event: " + label;
        }

        foreach (ReplayRebaseline r in report.Rebaselines)
        {
            var v = shift.Add.VerticalLine(r.TimeSeconds);
            v.Color = Light;
            v.LineWidth = 1;
        }

        shift.Title("Search shift, threshold band and events");
        shift.XLabel("time (s)");
        shift.YLabel("shift (Hz)");
        shift.ShowLegend(Alignment.UpperLeft);
        written.AddRange(Save(shift, folder, "shift"));
        written.AddRange(NoiseHistogramPlot.Write(folder, trace));
        return written;
    }

    /// <summary>Saves <paramref name="plot"/> as NAME.png and NAME.svg with plain axis numbers; returns both paths.</summary>
    internal static IReadOnlyList<string> Save(Plot plot, string folder, string name)
    {
        // Plain numbers on both axes: no thousands separators (100,036 would read as 100.036 in much of the world).
        foreach (ScottPlot.IAxis axis in new ScottPlot.IAxis[] { plot.Axes.Left, plot.Axes.Bottom })
        {
            axis.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic
            {
                LabelFormatter = v => v.ToString("0.######", System.Globalization.CultureInfo.InvariantCulture),
            };
        }

        string png = Path.Combine(folder, name + ".png");
        string svg = Path.Combine(folder, name + ".svg");
        plot.SavePng(png, Width, Height);
        plot.SaveSvg(svg, Width, Height);
        return new[] { png, svg };
    }
}
