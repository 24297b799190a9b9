// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/nanoFramework.Hardware.Esp32, nanoFramework.Hardware.Esp32/Gpio/GpioPulseCount.cs, tag v1.6.34 (written from the signature; no implementation copied).
using System;

namespace System.Device.Gpio
{
    /// <summary>Shim of nanoFramework's GpioPulseCount: a struct with two public fields, as the native side fills them.</summary>
    public struct GpioPulseCount
    {
        /// <summary>Cumulative count.</summary>
        public long Count;

        /// <summary>Time of the read (on the ESP32 the microsecond timer, as TimeSpan ticks).</summary>
        public TimeSpan RelativeTime;
    }
}
