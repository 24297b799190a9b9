using System.Globalization;
using FreqReadout.Counting;
using FreqReadout.Host.Commands;
using FreqReadout.Host.Replay;
using FreqReadout.Readout;

namespace FreqReadout.Host.Reports;

/// <summary>
/// The tables of a replay as plain text, shared by the console summary of <c>replay</c> and the report page, so both
/// show the same numbers: the summary (item, value), the re-baselines and the events.
/// </summary>
public static class ReplayTables
{
    /// <summary>The summary rows <c>replay</c> prints (capture, signal, edges, duration, gates, baseline, noise, drift, threshold, hold).</summary>
    public static ReportTable Summary(ReplayReport report, ReadoutSettings readout, string captureName, CounterSettings counter, IReadOnlyList<HoldSpan> holdSpans)
    {
        var t = new ReportTable("item", "value");
        t.AddRow("capture", captureName);
        t.AddRow("signal", report.Signal == SignalKind.Beat ? $"beat ({(readout.BeatSide == BeatSide.Above ? "search above reference" : "search below reference")})" : "search oscillator");
        t.AddRow("edges", report.Edges.ToString(CultureInfo.InvariantCulture));
        t.AddRow("duration", N(report.DurationSeconds, "0.000") + " s");
        t.AddRow("gates", $"{report.Gates} ({CountCommand.GateText(counter)}, {CountCommand.EstimatorName(counter.Estimator)})");
        t.AddRow("baseline", N(report.BaselineHz, "0.000") + " Hz (first captured, counted signal)");
        t.AddRow("noise", $"{N(report.NoiseHz, "0.0000")} Hz, {N(report.NoisePpm, "0.000")} ppm (robust sigma of target-free residuals)");
        t.AddRow("drift", N(report.DriftHzPerMinute, "0.0000") + " Hz/min (least-squares slope of the tracked baseline)");
        t.AddRow("threshold", $"{N(readout.ThresholdSigma)} sigma, release {N(readout.ThresholdSigma - readout.HysteresisSigma)} sigma, unclear below {N(readout.ThresholdSigma + readout.UnclearBandSigma)} sigma, polarity {(readout.Polarity == FreqReadout.Detection.Polarity.Inverted ? "inverted" : "normal")}");
        if (holdSpans.Count > 0)
        {
            t.AddRow("hold", string.Join(", ", holdSpans.Select(h => $"{N(h.FromSeconds)}-{N(h.ToSeconds)} s")) + " (--hold-span)");
        }

        return t;
    }

    /// <summary>The re-baselines: time s, reason, shift Hz, shift ppm (signed, "-" where unknown).</summary>
    public static ReportTable Rebaselines(ReplayReport report)
    {
        var t = new ReportTable("time s", "reason", "shift Hz", "shift ppm");
        foreach (ReplayRebaseline r in report.Rebaselines)
        {
            t.AddRow(N(r.TimeSeconds, "0.000"), r.ReasonName, N(r.ShiftHz, "+0.000;-0.000;0.000"), N(r.ShiftPpm, "+0.000;-0.000;0.000"));
        }

        return t;
    }

    /// <summary>The events: start s, end s, peak s, peak shift Hz, ppm, sigma, class, end (how the event ended).</summary>
    public static ReportTable Events(ReplayReport report)
    {
        var t = new ReportTable("start s", "end s", "peak s", "peak shift Hz", "ppm", "sigma", "class", "end");
        foreach (ReplayEvent e in report.Events)
        {
            var d = e.Event;
            t.AddRow(N(d.StartSeconds, "0.000"), N(d.EndSeconds, "0.000"), N(d.PeakSeconds, "0.000"), N(d.PeakShiftHz, "+0.000;-0.000;0.000"),
                d.HasPpm ? N(d.PeakShiftPpm, "+0.00;-0.00;0.00") : "-", N(d.PeakSigma, "0.0"), e.ClassName, ReplayEvent.EndText(d.End));
        }

        return t;
    }

    private static string N(double? v, string format = "0.######") => v is double x ? x.ToString(format, CultureInfo.InvariantCulture) : "-";
}
