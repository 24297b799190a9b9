namespace FreqReadout.Counting
{
    /// <summary>
    /// Gate-by-gate frequency from unwrapped edge timestamps (SKELETON: the counting-core work fills this in).
    /// </summary>
    public sealed class EdgeCounter
    {
        public EdgeCounter(CounterSettings settings)
        {
            Settings = settings;
        }

        public CounterSettings Settings { get; }

        /// <summary>Feeds one recorded edge (unwrapped tick). Returns true when a gate closed, with its result.</summary>
        public bool AddEdge(long tick, out GateResult result)
        {
            throw new System.NotImplementedException();
        }

        /// <summary>Tells the counter the time now (unwrapped tick); returns true with a no-signal result when no edge came within the timeout.</summary>
        public bool Poll(long nowTick, out GateResult result)
        {
            throw new System.NotImplementedException();
        }

        /// <summary>Forgets all state (next edge starts afresh).</summary>
        public void Reset()
        {
            throw new System.NotImplementedException();
        }
    }
}
