// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.Device.Gpio, System.Device.Gpio/PinValueChangedEventArgs.cs, tag v1.1.57 (the real class derives from nanoFramework.Runtime.Events.BaseEvent, which Board/ does not use) (written from the signature; no implementation copied).
namespace System.Device.Gpio
{
    /// <summary>Shim of nanoFramework's PinValueChangedEventArgs: Board/ reads which edge it was.</summary>
    public class PinValueChangedEventArgs
    {
        internal PinValueChangedEventArgs()
        {
        }

        /// <summary>Which edge raised the event.</summary>
        public PinEventTypes ChangeType
        {
            get { throw new NotImplementedException("compile-only shim"); }
        }
    }
}
