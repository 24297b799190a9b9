// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.Device.Gpio, System.Device.Gpio/PinMode.cs, tag v1.1.57 (values by declaration order: Input 0, InputPullDown 1, InputPullUp 2) (written from the signature; no implementation copied).
namespace System.Device.Gpio
{
    /// <summary>Shim of nanoFramework's PinMode: only the values firmware/Board/ uses, with the real numbers.</summary>
    public enum PinMode
    {
        /// <summary>Input, floating.</summary>
        Input = 0,

        /// <summary>Input with the internal pull-up.</summary>
        InputPullUp = 2,
    }
}
