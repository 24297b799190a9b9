namespace FreqReadout.Host.Simulation;

/// <summary>How edges are timestamped; each has a default rms jitter (hardware-notes/timestamp-methods.md).</summary>
public enum TimestampMethod
{
    /// <summary>Hardware timer input capture: clock quantisation only (jitter 0).</summary>
    InputCapture,

    /// <summary>Pulse-width capture peripheral in 12.5 ns ticks: quantisation only (jitter 0).</summary>
    LevelCapture,

    /// <summary>Managed pin-change events stamped in software: 50 us rms (tens to hundreds of microseconds).</summary>
    PinEvent,

    /// <summary>The rms jitter given in <c>jitter_s</c>.</summary>
    Custom,
}
