// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.Device.Gpio, System.Device.Gpio/PinChangeEventHandler.cs, tag v1.1.57 (written from the signature; no implementation copied).
namespace System.Device.Gpio
{
    /// <summary>Shim of nanoFramework's pin-change callback delegate.</summary>
    public delegate void PinChangeEventHandler(object sender, PinValueChangedEventArgs pinValueChangedEventArgs);
}
