// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.Device.Gpio, System.Device.Gpio/GpioController.cs, tag v1.1.57 (8b832b8) (written from the signature; no implementation copied).
using System;

namespace System.Device.Gpio
{
    /// <summary>Shim of nanoFramework's GpioController: only the members firmware/Board/ calls.</summary>
    public sealed class GpioController
    {
        /// <summary>Opens the controller (shim: throws).</summary>
        public GpioController()
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Opens a pin in a mode (shim: throws).</summary>
        public GpioPin OpenPin(int pinNumber, PinMode mode)
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Closes a pin (shim: throws).</summary>
        public void ClosePin(int pinNumber)
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Registers a pin-change callback (shim: throws).</summary>
        public void RegisterCallbackForPinValueChangedEvent(int pinNumber, PinEventTypes eventTypes, PinChangeEventHandler callback)
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Unregisters a pin-change callback (shim: throws).</summary>
        public void UnregisterCallbackForPinValueChangedEvent(int pinNumber, PinChangeEventHandler callback)
        {
            throw new NotImplementedException("compile-only shim");
        }
    }
}
