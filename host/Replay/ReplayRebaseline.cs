using FreqReadout.Tracking;

namespace FreqReadout.Host.Replay;

/// <summary>A re-baseline in a replay report (the first baseline is not listed).</summary>
/// <param name="TimeSeconds">When it began (persistent shift judged, mark or button, signal back), s.</param>
/// <param name="CompletedSeconds">When the new baseline was ready, s; null when the capture ended first.</param>
/// <param name="Reason">auto, manual or signal_restored.</param>
/// <param name="ShiftHz">Shift the new baseline absorbed, search oscillator, Hz; null when the capture ended first.</param>
/// <param name="ShiftPpm">The same in ppm of the search oscillator; null when no ppm reference is known.</param>
public sealed record ReplayRebaseline(double TimeSeconds, double? CompletedSeconds, RebaselineReason Reason, double? ShiftHz, double? ShiftPpm)
{
    /// <summary>The JSON contract's reason text.</summary>
    public string ReasonName => Reason switch
    {
        RebaselineReason.Auto => "auto",
        RebaselineReason.Manual => "manual",
        RebaselineReason.SignalRestored => "signal_restored",
        _ => "initial",
    };
}
