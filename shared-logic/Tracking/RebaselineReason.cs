namespace FreqReadout.Tracking
{
    /// <summary>Why a baseline was (re)captured.</summary>
    public enum RebaselineReason
    {
        /// <summary>The first baseline after start (not listed among re-baselines by replay).</summary>
        Initial = 0,

        /// <summary>A shift persisted longer than the persistent-shift timeout outside hold mode: taken as the new baseline.</summary>
        Auto = 1,

        /// <summary>Requested by the user (button, or the capture mark <c>rebaseline</c>).</summary>
        Manual = 2,

        /// <summary>The signal came back after a no-signal period.</summary>
        SignalRestored = 3,
    }
}
