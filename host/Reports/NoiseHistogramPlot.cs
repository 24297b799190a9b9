using FreqReadout.Numerics;
using MathNet.Numerics.Distributions;
using MathNet.Numerics.Statistics;
using ScottPlot;

namespace FreqReadout.Host.Reports;

/// <summary>
/// The noise plot of <c>replay --report DIR</c>, as noise.png and noise.svg (<see cref="ReplayPlots.Width"/> x
/// <see cref="ReplayPlots.Height"/>): a histogram of the shift of every target-free reading (the residuals whose robust
/// sigma is the replay's noise figure) with two normal curves scaled to counts (n x bin width x density): the robust fit
/// (centre the median, sigma = 1.482602218505602 x the median absolute deviation, the replay's noise) and the moment fit
/// (sample mean and standard deviation, n - 1). Where they part, the residuals are not normal (heavy tails, steps).
/// Bins are a quarter of the robust sigma wide over the median plus and minus <see cref="SpanSigma"/> robust sigmas;
/// readings beyond that are counted in the legend, not drawn. Light bars, a dark line and a mid-tone line (<see cref="ReportPalette"/>): apart in grey.
/// </summary>
public static class NoiseHistogramPlot
{
    /// <summary>Half the drawn span, in robust sigmas.</summary>
    public const double SpanSigma = 6.0;

    /// <summary>Bins per robust sigma.</summary>
    public const int BinsPerSigma = 4;

    /// <summary>
    /// The robust sigma of <paramref name="values"/>: 1.482602218505602 x median(|x - median(x)|) (the normal's sigma for
    /// normal data); NaN for no values.
    /// </summary>
    public static double RobustSigma(IReadOnlyList<double> values)
    {
        if (values.Count == 0)
        {
            return double.NaN;
        }

        double median = Median(values);
        return RobustStatistics.MadToSigma * ArrayStatistics.MedianInplace(values.Select(v => Math.Abs(v - median)).ToArray());
    }

    /// <summary>The median of <paramref name="values"/> (mean of the middle two for an even count); NaN for none.</summary>
    public static double Median(IReadOnlyList<double> values) => values.Count == 0 ? double.NaN : ArrayStatistics.MedianInplace(values.ToArray());

    /// <summary>Writes the plot into <paramref name="folder"/>; returns the files written.</summary>
    public static IReadOnlyList<string> Write(string folder, ReadingTrace trace)
    {
        IReadOnlyList<double> shifts = trace.TargetFreeShiftHz;
        var plot = new Plot();
        plot.Title("Noise: shift of target-free readings");
        plot.XLabel("shift (Hz)");
        plot.YLabel("readings per bin (count)");
        int n = shifts.Count;
        double median = Median(shifts);
        double robust = RobustSigma(shifts);
        double mean = n > 0 ? shifts.Average() : double.NaN;
        double sd = n > 1 ? shifts.StandardDeviation() : double.NaN;
        if (!(robust > 0) && sd > 0)
        {
            robust = sd; // more than half the residuals equal: the MAD is 0, so bin by the standard deviation
        }

        if (n > 0 && robust > 0)
        {
            double width = robust / BinsPerSigma;
            int bins = (int)(2 * SpanSigma * BinsPerSigma);
            double left = median - SpanSigma * robust;
            var counts = new double[bins];
            int outside = 0;
            foreach (double v in shifts)
            {
                int i = (int)Math.Floor((v - left) / width);
                if (i >= 0 && i < bins)
                {
                    counts[i]++;
                }
                else
                {
                    outside++;
                }
            }

            var bars = new List<Bar>();
            for (int i = 0; i < bins; i++)
            {
                bars.Add(new Bar
                {
                    Position = left + (i + 0.5) * width,
                    Value = counts[i],
                    Size = width,
                    FillColor = ReportPalette.Fill,
                    LineColor = ReportPalette.Light,
                    LineWidth = 1,
                });
            }

            var histogram = plot.Add.Bars(bars);
            histogram.LegendText = string.Create(System.Globalization.CultureInfo.InvariantCulture,
                $"{n} target-free readings{(outside > 0 ? $" ({outside} beyond +-{SpanSigma:0} sigma, not drawn)" : string.Empty)}");

            double[] x = Enumerable.Range(0, 241).Select(k => left + k * (2 * SpanSigma * robust) / 240).ToArray();
            var fit = plot.Add.ScatterLine(x, x.Select(v => n * width * Normal.PDF(median, robust, v)).ToArray());
            fit.LegendText = string.Create(System.Globalization.CultureInfo.InvariantCulture, $"normal, median and robust sigma {robust:0.#####} Hz (the noise figure)");
            fit.Color = ReportPalette.Ink;
            fit.LineWidth = 2.5f;
            if (sd > 0)
            {
                var moment = plot.Add.ScatterLine(x, x.Select(v => n * width * Normal.PDF(mean, sd, v)).ToArray());
                moment.LegendText = string.Create(System.Globalization.CultureInfo.InvariantCulture, $"normal, mean and standard deviation {sd:0.#####} Hz");
                moment.Color = ReportPalette.Mid;
                moment.LineWidth = 1.5f;
            }
        }
        else
        {
            var none = plot.Add.ScatterLine(new double[] { 0 }, new double[] { 0 });
            none.LegendText = "no target-free readings with spread: nothing to draw";
            none.Color = ReportPalette.Ink;
        }

        plot.ShowLegend(Alignment.UpperLeft); // the tails are low: the upper corners are free
        return ReplayPlots.Save(plot, folder, "noise");
    }
}
