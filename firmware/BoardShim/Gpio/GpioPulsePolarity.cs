// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/nanoFramework.Hardware.Esp32, nanoFramework.Hardware.Esp32/Gpio/GpioPulsePolarity.cs, tag v1.6.34 (values by declaration order: Both 0, Falling 1, Rising 2) (written from the signature; no implementation copied).
namespace System.Device.Gpio
{
    /// <summary>Shim of nanoFramework's GpioPulsePolarity: only the values firmware/Board/ uses, with the real numbers.</summary>
    public enum GpioPulsePolarity
    {
        /// <summary>Count rising edges.</summary>
        Rising = 2,
    }
}
