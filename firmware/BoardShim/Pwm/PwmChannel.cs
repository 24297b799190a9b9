// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signatures as declared in nanoframework/System.Device.Pwm, System.Device.Pwm/PwmChannel.cs, tag v1.1.23 (8f14504) (written from the signatures; no implementation copied). The real class is sealed and IDisposable; Dispose and the members firmware/Board/ does not use are left out.
using System;

namespace System.Device.Pwm
{
    /// <summary>Shim of nanoFramework's PwmChannel: only the members firmware/Board/ uses.</summary>
    public sealed class PwmChannel
    {
        private PwmChannel()
        {
        }

        /// <summary>The frequency, Hz (shim: throws).</summary>
        public int Frequency
        {
            get { throw new NotImplementedException("compile-only shim"); }
            set { throw new NotImplementedException("compile-only shim"); }
        }

        /// <summary>Starts the output (shim: throws).</summary>
        public void Start()
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Stops the output (shim: throws).</summary>
        public void Stop()
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Opens a channel on a pin (shim: throws). On an ESP32 the pin is first given a PWM function with Configuration.SetPinFunction; the real method returns null when no channel fits.</summary>
        public static PwmChannel CreateFromPin(int pin, int frequency = 400, double dutyCyclePercentage = 0.5)
        {
            throw new NotImplementedException("compile-only shim");
        }
    }
}
