using System.Device.Gpio;
using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Board
{
    /// <summary>Re-baseline push button (to ground, pull-up) and an optional hold switch (to ground, pull-up).</summary>
    public sealed class GpioButtons : IButtonPort
    {
        private readonly GpioPin rebaseline;
        private readonly GpioPin hold;
        private bool wasDown;

        /// <summary>Opens the button pins with pull-ups; <paramref name="holdPin"/> &lt; 0 when the board has no hold switch.</summary>
        public GpioButtons(GpioController controller, int rebaselinePin, int holdPin)
        {
            rebaseline = controller.OpenPin(rebaselinePin, PinMode.InputPullUp);
            hold = holdPin >= 0 ? controller.OpenPin(holdPin, PinMode.InputPullUp) : null;
        }

        /// <inheritdoc />
        public bool TryTakeRebaselinePress()
        {
            bool down = IsLow(rebaseline);
            bool pressed = down && !wasDown;
            wasDown = down;
            return pressed;
        }

        /// <inheritdoc />
        public bool TryReadHold(out bool on)
        {
            on = hold != null && IsLow(hold);
            return hold != null;
        }

        private static bool IsLow(GpioPin pin)
        {
            // GpioPin.Read() returns the struct PinValue: the API forces one struct per read (called once per loop
            // step); converting it to int at once avoids a second one (PinValue.Low) and the == operator's copies.
            return (int)pin.Read() == 0;
        }
    }
}
