// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/nanoFramework.Hardware.Esp32, nanoFramework.Hardware.Esp32/Gpio/Gpio(U+200B)PulseCounter.cs, tag v1.6.34 (1c9a241; file and class name hold a zero-width space that the C# compiler drops from the metadata name); the class is in namespace System.Device.Gpio but ships in nanoFramework.Hardware.Esp32 (written from the signature; no implementation copied).
using System;

namespace System.Device.Gpio
{
    /// <summary>Shim of nanoFramework's ESP32 GpioPulseCounter: only the members firmware/Board/ uses.</summary>
    public sealed class GpioPulseCounter : IDisposable
    {
        /// <summary>Claims a pulse-counter unit for a pin (shim: throws).</summary>
        public GpioPulseCounter(int pinNumberA, int pinNumberB = -1)
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Edges counted (shim: throws).</summary>
        public GpioPulsePolarity Polarity
        {
            get { throw new NotImplementedException("compile-only shim"); }
            set { throw new NotImplementedException("compile-only shim"); }
        }

        /// <summary>Glitch filter (shim: throws). The real native side passes it to ESP-IDF as max_glitch_ns.</summary>
        public ushort FilterPulses
        {
            get { throw new NotImplementedException("compile-only shim"); }
            set { throw new NotImplementedException("compile-only shim"); }
        }

        /// <summary>Reads count and time (shim: throws). The real method returns the struct GpioPulseCount.</summary>
        public GpioPulseCount Read()
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Starts counting (shim: throws).</summary>
        public void Start()
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Stops counting (shim: throws).</summary>
        public void Stop()
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Releases the unit (shim: throws).</summary>
        public void Dispose()
        {
            throw new NotImplementedException("compile-only shim");
        }
    }
}
