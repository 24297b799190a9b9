using System;
using System.Device.Gpio;
using FreqReadout.Firmware.Device;
using nanoFramework.Hardware.Esp32;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// Rising edges from managed pin-change events, stamped in software with <c>HighResTimer.GetCurrent()</c> (whole
    /// microseconds, so the capture's clock_hz is 1 MHz and the time is 64 bits) when the handler runs. Managed events
    /// carry no hardware timestamp (the native side stamps them with the 10 ms tick and the listener drops it) and
    /// arrive milliseconds late through a native queue shared with every other event; both edges are queued whatever
    /// the event type asks, so the handler skips the falling ones. Use only for a heavily divided signal or a low beat
    /// note (see
    /// hardware-notes/timestamp-methods.md). The stamp was DateTime.UtcNow's ticks before; reading the microsecond timer
    /// instead holds no struct per edge (DateTime is one) and is the same clock as the pulse counter's.
    /// </summary>
    public sealed class PinEventEdgeSource : IDisposable
    {
        /// <summary>Tick rate of the stamps, Hz: whole microseconds.</summary>
        public const double ClockHz = 1000000.0;

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
            // nanoFramework arms both edges whatever the event type asked for (and queues both): skip the falling ones.
            if (e.ChangeType != PinEventTypes.Rising)
            {
                return;
            }

            ring.Add(HighResTimer.GetCurrent());
        }

        /// <summary>Stops the events and closes the pin.</summary>
        public void Dispose()
        {
            controller.UnregisterCallbackForPinValueChangedEvent(pin, OnEdge);
            controller.ClosePin(pin);
        }
    }
}
