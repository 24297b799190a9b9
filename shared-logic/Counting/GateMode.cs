namespace FreqReadout.Counting
{
    /// <summary>How a gate's length is set.</summary>
    public enum GateMode
    {
        /// <summary>The gate closes on the first edge at or after GateSeconds from its opening edge.</summary>
        Time = 0,

        /// <summary>The gate closes after GateEdges recorded intervals.</summary>
        Edges = 1,
    }
}
