// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.Device.I2c, System.Device.I2c/I2cConnectionSettings.cs, tag v1.1.29 (written from the signature; no implementation copied).
using System;

namespace System.Device.I2c
{
    /// <summary>Shim of nanoFramework's I2cConnectionSettings: only the constructor firmware/Board/ uses.</summary>
    public sealed class I2cConnectionSettings
    {
        /// <summary>Bus, 7-bit address and speed (shim: throws).</summary>
        public I2cConnectionSettings(int busId, int deviceAddress, I2cBusSpeed busSpeed)
        {
            throw new NotImplementedException("compile-only shim");
        }
    }
}
