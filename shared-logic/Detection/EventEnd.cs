namespace FreqReadout.Detection
{
    /// <summary>What ended a detection event.</summary>
    public enum EventEnd
    {
        /// <summary>The shift fell below the release level (threshold minus hysteresis).</summary>
        Released = 0,

        /// <summary>The signal was lost.</summary>
        NoSignal = 1,

        /// <summary>A manual re-baseline was requested during the event.</summary>
        Rebaseline = 2,

        /// <summary>Still open at the end of a replay: closed at the last gate.</summary>
        EndOfRun = 3,

        /// <summary>The shift outlasted persistent_shift_s (outside hold mode): reported, then absorbed by an automatic re-baseline.</summary>
        AutoRebaseline = 4,

        /// <summary>Decided afterwards from the readings on both sides of it (a local quadratic baseline): the shift returned like a coil pass.</summary>
        Resolved = 5,
    }
}
