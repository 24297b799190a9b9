namespace FreqReadout.Firmware.Ports
{
    /// <summary>
    /// A source of recorded rising edges (board adapter: pin events stamped in software, or a capture peripheral).
    /// </summary>
    public interface IEdgeSource
    {
        /// <summary>Takes the next pending edge's raw timer value; false when none is pending (never blocks).</summary>
        bool TryReadEdge(out ulong rawTick);
    }
}
