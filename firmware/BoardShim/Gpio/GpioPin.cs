// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.Device.Gpio, System.Device.Gpio/GpioPin.cs, tag v1.1.57 (the real source spells the class name with a zero-width space after 'Gpio', which the C# compiler drops from the metadata name: checked by compiling such a name with the SDK's csc) (written from the signature; no implementation copied).
using System;

namespace System.Device.Gpio
{
    /// <summary>Shim of nanoFramework's GpioPin: only the members firmware/Board/ calls.</summary>
    public sealed class GpioPin
    {
        private GpioPin()
        {
        }

        /// <summary>Reads the pin (shim: throws). The real method returns the struct PinValue.</summary>
        public PinValue Read()
        {
            throw new NotImplementedException("compile-only shim");
        }
    }
}
