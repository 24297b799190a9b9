// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.Device.Gpio, System.Device.Gpio/PinValue.cs, tag v1.1.57 (written from the signature; no implementation copied).
using System;

namespace System.Device.Gpio
{
    /// <summary>Shim of nanoFramework's PinValue (a readonly struct over a byte): only the members firmware/Board/ uses.</summary>
    public readonly struct PinValue
    {
        /// <summary>The pin level as 0 (low) or 1 (high) (shim: throws).</summary>
        public static explicit operator int(PinValue value)
        {
            throw new NotImplementedException("compile-only shim");
        }
    }
}
