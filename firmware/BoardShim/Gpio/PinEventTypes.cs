// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.Device.Gpio, System.Device.Gpio/PinEventTypes.cs, tag v1.1.57 (written from the signature; no implementation copied).
using System;

namespace System.Device.Gpio
{
    /// <summary>Shim of nanoFramework's PinEventTypes (flags): only the values firmware/Board/ uses, with the real numbers.</summary>
    [Flags]
    public enum PinEventTypes
    {
        /// <summary>A rising edge.</summary>
        Rising = 1,
    }
}
