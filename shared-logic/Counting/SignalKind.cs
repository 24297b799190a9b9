namespace FreqReadout.Counting
{
    /// <summary>Which signal the counter sees: the search oscillator itself or the beat note.</summary>
    public enum SignalKind
    {
        /// <summary>The search oscillator (possibly divided by a prescaler).</summary>
        Search = 0,

        /// <summary>The beat note |f_search - f_ref|.</summary>
        Beat = 1,
    }
}
