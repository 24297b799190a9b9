using System;
using System.Device.Gpio;
using FreqReadout.Firmware.Device;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// Rising edges from managed pin-change events, stamped in software with DateTime ticks (100 ns,
    /// so the capture's clock_hz is 10 MHz). Managed events carry no hardware timestamp and are slow:
    /// use only for a heavily divided signal or a low beat note (see hardware-notes/timestamp-methods.md).
    /// </summary>
    public sealed class PinEventEdgeSource : IDisposable
    {
        /// <summary>Tick rate of the stamps, Hz.</summary>
        public const double ClockHz = 10000000.0;

        private readonly GpioController controller;
        private readonly int pin;
        private readonly EdgeRing ring;

        /// <summary>Opens <paramref name="pin"/> as an input and adds the stamp of every rising edge to <paramref name="ring"/>.</summary>
        public PinEventEdgeSource(GpioController controller, int pin, EdgeRing ring)
        {
            this.controller = controller;
            this.pin = pin;
            this.ring = ring;
            controller.OpenPin(pin, PinMode.Input);
            controller.RegisterCallbackForPinValueChangedEvent(pin, PinEventTypes.Rising, OnEdge);
        }

        private void OnEdge(object sender, PinValueChangedEventArgs e)
        {
            ring.Add((ulong)DateTime.UtcNow.Ticks);
        }

        /// <summary>Stops the events and closes the pin.</summary>
        public void Dispose()
        {
            controller.UnregisterCallbackForPinValueChangedEvent(pin, OnEdge);
            controller.ClosePin(pin);
        }
    }
}
