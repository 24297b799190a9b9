namespace FreqReadout.Counting
{
    /// <summary>The estimator that produced a gate's frequency.</summary>
    public enum EstimatorKind
    {
        /// <summary>First and last edge of the gate: f = N / (t_last - t_first) (the "Pi" counter).</summary>
        Reciprocal = 0,

        /// <summary>Least-squares slope of edge time on edge index over every edge of the gate (the "Omega" counter).</summary>
        Regression = 1,

        /// <summary>Least-squares slope of pulse-counter count on read time over the gate's snapshots.</summary>
        SnapshotRegression = 2,
    }
}
