using System.ComponentModel;
using System.Globalization;
using FreqReadout.Counting;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// The counting options every command that replays a capture offers (<c>count</c>, <c>replay</c>):
/// gate length, estimator, timestamp jitter, no-signal timeout, mains-nulling gates and missed-edge
/// inference. Derive a command's settings from
/// this class and call <see cref="BuildOptions"/>; clock, prescale and signal come from the capture
/// (see <c>CaptureGateSource</c>).
/// </summary>
public class CounterOptionSettings : CommandSettings
{
    [CommandOption("--gate-seconds <SECONDS>")]
    [Description("Time gate: a gate closes on the first edge at or after this many seconds, [[1e-6, 86400]]. Default 0.1.")]
    public string? GateSeconds { get; set; }

    [CommandOption("--gate-edges <N>")]
    [Description("Edge gate: a gate closes after N recorded intervals, an integer in [[1, 1048576]]. Instead of --gate-seconds. Default: none, time gates.")]
    public string? GateEdges { get; set; }

    [CommandOption("--estimator <NAME>")]
    [Description("reciprocal (first and last edge) or regression (least squares over every edge). Default regression. Snapshot captures always use snapshot-regression.")]
    public string? Estimator { get; set; }

    [CommandOption("--jitter-ticks <TICKS>")]
    [Description("Timestamp jitter, rms ticks, [[0, 1e9]], for the error model: it adds to the timer's quantisation and, below about 1 tick, decides how far that quantisation is a fixed pattern (error_hz then covers the pattern's worst phase at the gate's frequency ratio, a conservative 1-sigma figure). Default 0.")]
    public string? JitterTicks { get; set; }

    [CommandOption("--no-signal-seconds <SECONDS>")]
    [Description("No edge within this many seconds reports no_signal, [[0.001, 3600]] and at least 3 periods of the capture's recorded edges. Default 0.5 (lengthened, with a warning, for a slower signal).")]
    public string? NoSignalSeconds { get; set; }

    [CommandOption("--mains-hz <HZ>")]
    [Description("Mains frequency to null, 50 or 60 (any of 10..1000): a readout near live wiring sees its frequency modulation. Time gates are set to the nearest length that cancels a sinusoidal modulation at this frequency: whole mains periods for reciprocal, 1.4303, 2.4590, 3.4709, ... periods (the roots of tan z = z over pi) for regression and snapshot gates, whose least-squares weighting is a parabola. Not with --gate-edges. Default off.")]
    public string? MainsHz { get; set; }

    [CommandOption("--no-infer-edges")]
    [Description("Do not infer missed edges. By default an interval within a quarter period of 2..8 running periods counts as the periods it spans (the gate reports the edges it inferred); in beat mode only while the beat is at least 4 x the beat floor.")]
    public bool NoInferEdges { get; set; }

    /// <summary>Builds the counter options from the command-line settings; null with an error naming the option and its range.</summary>
    public CounterSettings? BuildOptions(out string? error)
    {
        error = null;
        var options = new CounterSettings();
        if (GateSeconds != null && GateEdges != null)
        {
            error = "give either --gate-seconds or --gate-edges, not both";
            return null;
        }

        if (GateSeconds != null)
        {
            if (!OptionValues.TryNumber(GateSeconds, out double seconds) || !(seconds >= CounterSettings.MinGateSeconds && seconds <= CounterSettings.MaxGateSeconds))
            {
                error = $"--gate-seconds must be a number of seconds in [1e-6, 86400], got {OptionValues.Quote(GateSeconds)}";
                return null;
            }

            options.Mode = GateMode.Time;
            options.GateSeconds = seconds;
        }

        if (GateEdges != null)
        {
            if (!int.TryParse(GateEdges, NumberStyles.None, CultureInfo.InvariantCulture, out int edges) || edges < 1 || edges > EdgeCounter.MaxGateIntervals)
            {
                error = $"--gate-edges must be an integer from 1 to {EdgeCounter.MaxGateIntervals}, got {OptionValues.Quote(GateEdges)}";
                return null;
            }

            options.Mode = GateMode.Edges;
            options.GateEdges = edges;
        }

        switch (Estimator)
        {
            case null:
            case "regression":
                options.Estimator = EstimatorKind.Regression;
                break;
            case "reciprocal":
                options.Estimator = EstimatorKind.Reciprocal;
                break;
            default:
                error = $"--estimator must be reciprocal or regression, got {OptionValues.Quote(Estimator)}";
                return null;
        }

        if (JitterTicks != null)
        {
            if (!OptionValues.TryNumber(JitterTicks, out double jitter) || !(jitter >= 0 && jitter <= CounterSettings.MaxJitterTicks))
            {
                error = $"--jitter-ticks must be a number of rms ticks in [0, 1e9], got {OptionValues.Quote(JitterTicks)}";
                return null;
            }

            options.JitterTicks = jitter;
        }

        if (NoSignalSeconds != null)
        {
            if (!OptionValues.TryNumber(NoSignalSeconds, out double noSignal) || !(noSignal >= CounterSettings.MinNoSignalSeconds && noSignal <= CounterSettings.MaxNoSignalSeconds))
            {
                error = $"--no-signal-seconds must be a number of seconds in [0.001, 3600], got {OptionValues.Quote(NoSignalSeconds)}";
                return null;
            }

            options.NoSignalSeconds = noSignal;
        }

        if (MainsHz != null)
        {
            if (!OptionValues.TryNumber(MainsHz, out double mains) || !(mains >= MainsGate.MinMainsHz && mains <= MainsGate.MaxMainsHz))
            {
                error = $"--mains-hz must be a number from {MainsGate.MinMainsHz:0} to {MainsGate.MaxMainsHz:0} Hz (50 or 60 for the public supply), got '{MainsHz}'";
                return null;
            }

            if (options.Mode == GateMode.Edges)
            {
                error = "--mains-hz sets the length of time gates; it does not go with --gate-edges";
                return null;
            }

            options.MainsHz = mains;
        }

        options.InferMissedEdges = !NoInferEdges;
        return options;
    }

    /// <summary>
    /// Warnings for options the capture makes moot (so a user who asked for them learns, once, that they had no effect):
    /// --estimator on a snapshot capture, whose gates always use snapshot-regression.
    /// </summary>
    public virtual IReadOnlyList<string> IgnoredOptionWarnings(FreqReadout.Host.Captures.CaptureMetadata metadata)
    {
        var warnings = new List<string>();
        if (Estimator != null && metadata.Kind == FreqReadout.Host.Captures.CaptureKind.Snapshots)
        {
            warnings.Add($"--estimator {Estimator} does not apply to a snapshot capture: its gates always use snapshot-regression");
        }

        return warnings;
    }
}
