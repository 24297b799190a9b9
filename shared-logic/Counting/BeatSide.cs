namespace FreqReadout.Counting
{
    /// <summary>Where the search oscillator is tuned relative to the reference (beat mode only).</summary>
    public enum BeatSide
    {
        /// <summary>Not given (search mode).</summary>
        None = 0,

        /// <summary>Search above reference: a beat rise is a search rise.</summary>
        Above = 1,

        /// <summary>Search below reference: a beat rise is a search fall.</summary>
        Below = 2,
    }
}
