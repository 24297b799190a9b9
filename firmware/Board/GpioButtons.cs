using System.Device.Gpio;
using FreqReadout.Firmware.Device;
using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// The push button (to ground, internal pull-up) and an optional hold switch (to ground, pull-up) as the loop's button
    /// port: the pins' raw levels (<see cref="IButtonLevelPort"/>) go through <see cref="DebouncedButtons"/> on the
    /// microsecond clock passed in (<see cref="HighResClockPort"/>): a short press asks for a re-baseline, a press held
    /// over a second toggles hold, a wired hold switch replaces the toggle (hardware-notes/peripherals.md).
    /// </summary>
    public sealed class GpioButtons : IButtonPort, IButtonLevelPort
    {
        private readonly GpioPin button;
        private readonly GpioPin holdSwitch;
        private readonly DebouncedButtons debounced;

        /// <summary>Opens the pins with pull-ups; <paramref name="holdPin"/> &lt; 0 when the board has no hold switch. <paramref name="clock"/> reads whole microseconds.</summary>
        public GpioButtons(GpioController controller, int buttonPin, int holdPin, IClockPort clock)
        {
            button = controller.OpenPin(buttonPin, PinMode.InputPullUp);
            holdSwitch = holdPin >= 0 ? controller.OpenPin(holdPin, PinMode.InputPullUp) : null;
            debounced = new DebouncedButtons(this, clock);
        }

        /// <inheritdoc />
        public bool TryTakeRebaselinePress()
        {
            return debounced.TryTakeRebaselinePress();
        }

        /// <inheritdoc />
        public bool TryReadHold(out bool on)
        {
            return debounced.TryReadHold(out on);
        }

        /// <inheritdoc />
        public bool TryReadButtonDown(out bool down)
        {
            down = IsLow(button);
            return true;
        }

        /// <inheritdoc />
        public bool TryReadHoldSwitchOn(out bool on)
        {
            on = holdSwitch != null && IsLow(holdSwitch);
            return holdSwitch != null;
        }

        private static bool IsLow(GpioPin pin)
        {
            // GpioPin.Read() returns the struct PinValue: the API forces one struct per read (called once per loop
            // step); converting it to int at once avoids a second one (PinValue.Low) and the == operator's copies.
            return (int)pin.Read() == 0;
        }
    }
}
