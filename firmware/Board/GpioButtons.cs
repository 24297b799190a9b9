using System.Device.Gpio;
using FreqReadout.Firmware.Device;
using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// The push button (to ground, internal pull-up) through a <see cref="ButtonDebouncer"/>: a short press asks for a
    /// re-baseline, a press held over a second toggles hold. An optional hold switch (to ground, pull-up), debounced
    /// the same way, replaces the toggled hold when wired. Times come from the clock passed in (us,
    /// <see cref="HighResClockPort"/>).
    /// </summary>
    public sealed class GpioButtons : IButtonPort
    {
        private readonly GpioPin button;
        private readonly GpioPin holdSwitch;
        private readonly IClockPort clock;
        private readonly ButtonDebouncer buttonDebouncer = new ButtonDebouncer();
        private readonly ButtonDebouncer switchDebouncer = new ButtonDebouncer();

        /// <summary>Opens the pins with pull-ups; <paramref name="holdPin"/> &lt; 0 when the board has no hold switch. <paramref name="clock"/> reads whole microseconds.</summary>
        public GpioButtons(GpioController controller, int buttonPin, int holdPin, IClockPort clock)
        {
            if (clock == null)
            {
                throw new System.ArgumentNullException("clock");
            }

            this.clock = clock;
            button = controller.OpenPin(buttonPin, PinMode.InputPullUp);
            holdSwitch = holdPin >= 0 ? controller.OpenPin(holdPin, PinMode.InputPullUp) : null;
        }

        /// <inheritdoc />
        public bool TryTakeRebaselinePress()
        {
            // The loop calls this once a step, before TryReadHold: both pins are sampled here.
            ulong now;
            if (clock.TryReadNow(out now))
            {
                buttonDebouncer.Update(IsLow(button), (long)now);
                if (holdSwitch != null)
                {
                    switchDebouncer.Update(IsLow(holdSwitch), (long)now);
                }
            }

            return buttonDebouncer.TryTakeShortPress();
        }

        /// <inheritdoc />
        public bool TryReadHold(out bool on)
        {
            on = holdSwitch != null ? switchDebouncer.IsDown : buttonDebouncer.HoldOn;
            return true;
        }

        private static bool IsLow(GpioPin pin)
        {
            // GpioPin.Read() returns the struct PinValue: the API forces one struct per read (called once per loop
            // step); converting it to int at once avoids a second one (PinValue.Low) and the == operator's copies.
            return (int)pin.Read() == 0;
        }
    }
}
