// Board adapter: the microsecond timer the pulse counter stamps its reads with.
using FreqReadout.Firmware.Ports;
using nanoFramework.Hardware.Esp32;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// <c>HighResTimer.GetCurrent()</c> as the device loop's clock: whole microseconds since start, 64 bits (never wraps
    /// in practice), the same time base as the pulse counter's read times, so the loop paces its reads on it.
    /// </summary>
    public sealed class HighResClockPort : IClockPort
    {
        /// <inheritdoc/>
        public bool TryReadNow(out ulong rawTick)
        {
            rawTick = HighResTimer.GetCurrent();
            return true;
        }
    }
}
