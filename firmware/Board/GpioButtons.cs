// Board adapter (builds only with -p:FreqReadoutBoard=true, where nanoFramework.System.Device.Gpio restores).
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

        public GpioButtons(GpioController controller, int rebaselinePin, int holdPin)
        {
            rebaseline = controller.OpenPin(rebaselinePin, PinMode.InputPullUp);
            hold = holdPin >= 0 ? controller.OpenPin(holdPin, PinMode.InputPullUp) : null;
        }

        public bool TryTakeRebaselinePress()
        {
            bool down = rebaseline.Read() == PinValue.Low;
            bool pressed = down && !wasDown;
            wasDown = down;
            return pressed;
        }

        public bool TryReadHold(out bool on)
        {
            on = hold != null && hold.Read() == PinValue.Low;
            return hold != null;
        }
    }
}
