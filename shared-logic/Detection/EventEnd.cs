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
    }
}
