namespace FreqReadout.Firmware.Ports
{
    /// <summary>
    /// A hardware pulse counter (board adapter over the ESP32 pulse-counter unit). One read is a
    /// snapshot: the cumulative edge count and the time of the read.
    /// </summary>
    public interface IPulseCounterPort
    {
        /// <summary>Reads a snapshot; false when the counter cannot be read now.</summary>
        /// <param name="count">Cumulative count (wrapping at the counter's width).</param>
        /// <param name="timeTicks">Time of the read in timer ticks (wrapping at the timer's width).</param>
        bool TryReadSnapshot(out ulong count, out ulong timeTicks);
    }
}
