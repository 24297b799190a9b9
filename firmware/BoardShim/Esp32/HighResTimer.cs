// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/nanoFramework.Hardware.Esp32, nanoFramework.Hardware.Esp32/HighResTimer.cs, tag v1.6.34 (1c9a241) (written from the signature; no implementation copied).
using System;

namespace nanoFramework.Hardware.Esp32
{
    /// <summary>Shim of nanoFramework's ESP32 HighResTimer: only the static clock read firmware/Board/ uses.</summary>
    public class HighResTimer
    {
        private HighResTimer()
        {
        }

        /// <summary>Microseconds since boot (shim: throws). On the board: esp_timer_get_time().</summary>
        public static ulong GetCurrent()
        {
            throw new NotImplementedException("compile-only shim");
        }
    }
}
