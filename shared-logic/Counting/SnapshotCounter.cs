namespace FreqReadout.Counting
{
    /// <summary>
    /// Gate-by-gate frequency from hardware pulse-counter snapshots (SKELETON: the counting-core work fills this in).
    /// </summary>
    public sealed class SnapshotCounter
    {
        public SnapshotCounter(CounterSettings settings)
        {
            Settings = settings;
        }

        public CounterSettings Settings { get; }

        /// <summary>Feeds one snapshot: unwrapped read tick and unwrapped cumulative count. True when a gate closed.</summary>
        public bool AddSnapshot(long tick, long count, out GateResult result)
        {
            throw new System.NotImplementedException();
        }
    }
}
