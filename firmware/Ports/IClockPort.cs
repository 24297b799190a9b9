namespace FreqReadout.Firmware.Ports
{
    /// <summary>The timer that stamps edges, read now (for the no-signal timeout).</summary>
    public interface IClockPort
    {
        /// <summary>The timer's current raw value, in the same ticks and width as the edges.</summary>
        bool TryReadNow(out ulong rawTick);
    }
}
