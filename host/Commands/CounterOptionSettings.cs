using System.ComponentModel;
using System.Globalization;
using FreqReadout.Counting;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// The counting options every command that replays a capture offers (<c>count</c>, <c>replay</c>):
/// gate length, estimator, timestamp jitter and no-signal timeout. Derive a command's settings from
/// this class and call <see cref="BuildOptions"/>; clock, prescale and signal come from the capture
/// (see <c>CaptureGateSource</c>).
/// </summary>
public class CounterOptionSettings : CommandSettings
{
    [CommandOption("--gate-seconds <SECONDS>")]
    [Description("Time gate: a gate closes on the first edge at or after this many seconds (> 0). Default 0.1.")]
    public string? GateSeconds { get; set; }

    [CommandOption("--gate-edges <N>")]
    [Description("Edge gate: a gate closes after N recorded intervals (integer >= 1). Instead of --gate-seconds.")]
    public string? GateEdges { get; set; }

    [CommandOption("--estimator <NAME>")]
    [Description("reciprocal (first and last edge) or regression (least squares over every edge). Default regression. Snapshot captures always use snapshot-regression.")]
    public string? Estimator { get; set; }

    [CommandOption("--jitter-ticks <TICKS>")]
    [Description("Timestamp jitter, rms ticks (>= 0), added to the quantisation in the error model. Default 0.")]
    public string? JitterTicks { get; set; }

    [CommandOption("--no-signal-seconds <SECONDS>")]
    [Description("No edge within this many seconds reports no_signal (> 0). Default 0.5.")]
    public string? NoSignalSeconds { get; set; }

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
            if (!OptionValues.TryNumber(GateSeconds, out double seconds) || !(seconds > 0))
            {
                error = $"--gate-seconds must be a number > 0 (seconds), got '{GateSeconds}'";
                return null;
            }

            options.Mode = GateMode.Time;
            options.GateSeconds = seconds;
        }

        if (GateEdges != null)
        {
            if (!int.TryParse(GateEdges, NumberStyles.None, CultureInfo.InvariantCulture, out int edges) || edges < 1 || edges > EdgeCounter.MaxGateIntervals)
            {
                error = $"--gate-edges must be an integer from 1 to {EdgeCounter.MaxGateIntervals}, got '{GateEdges}'";
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
                error = $"--estimator must be reciprocal or regression, got '{Estimator}'";
                return null;
        }

        if (JitterTicks != null)
        {
            if (!OptionValues.TryNumber(JitterTicks, out double jitter) || !(jitter >= 0))
            {
                error = $"--jitter-ticks must be a number >= 0 (rms ticks), got '{JitterTicks}'";
                return null;
            }

            options.JitterTicks = jitter;
        }

        if (NoSignalSeconds != null)
        {
            if (!OptionValues.TryNumber(NoSignalSeconds, out double noSignal) || !(noSignal > 0))
            {
                error = $"--no-signal-seconds must be a number > 0 (seconds), got '{NoSignalSeconds}'";
                return null;
            }

            options.NoSignalSeconds = noSignal;
        }

        return options;
    }
}
