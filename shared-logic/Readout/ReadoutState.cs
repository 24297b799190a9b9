namespace FreqReadout.Readout
{
    /// <summary>What a reading means.</summary>
    public enum ReadoutState
    {
        /// <summary>No signal: no frequency, nothing to show.</summary>
        NoSignal = 0,

        /// <summary>Waiting for the settling time or capturing a baseline: the shift is not final and must not be shown as one.</summary>
        Settling = 1,

        /// <summary>Baseline tracked, no target.</summary>
        Tracking = 2,

        /// <summary>A target is present (candidate or event): the tracker is held.</summary>
        Target = 3,

        /// <summary>Hold mode is on (automatic re-baselining suspended); a target may or may not be present.</summary>
        Hold = 4,
    }
}
