// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/nanoFramework.Hardware.Esp32, nanoFramework.Hardware.Esp32/Configuration.cs, tag v1.6.34 (written from the signature; no implementation copied).
using System;

namespace nanoFramework.Hardware.Esp32
{
    /// <summary>Shim of nanoFramework's ESP32 pin-function configuration: only SetPinFunction.</summary>
    public class Configuration
    {
        private Configuration()
        {
        }

        /// <summary>Routes a peripheral signal to a GPIO pin (shim: throws).</summary>
        public static void SetPinFunction(int pin, DeviceFunction value)
        {
            throw new NotImplementedException("compile-only shim");
        }
    }
}
