using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// The loop's button port over raw pin levels and the microsecond clock: the push button through a
    /// <see cref="ButtonDebouncer"/> (a short press asks for a re-baseline, a press held 1 s toggles hold), and an
    /// optional hold switch, debounced the same way, which replaces the toggled hold when the board has one. Both levels
    /// are sampled in <see cref="TryTakeRebaselinePress"/>, which the loop calls once a step before
    /// <see cref="TryReadHold"/>. O(1) per step, nothing allocated.
    /// </summary>
    public sealed class DebouncedButtons : IButtonPort
    {
        private readonly IButtonLevelPort levels;
        private readonly IClockPort clock;
        private readonly ButtonDebouncer button;
        private readonly ButtonDebouncer holdSwitch;
        private bool switchSeen;

        /// <summary>Debounces <paramref name="levels"/> on <paramref name="clock"/> (whole microseconds) with the default times.</summary>
        public DebouncedButtons(IButtonLevelPort levels, IClockPort clock)
            : this(levels, clock, new ButtonDebouncer(), new ButtonDebouncer())
        {
        }

        /// <summary>Debounces <paramref name="levels"/> on <paramref name="clock"/> (whole microseconds) with the given debouncers.</summary>
        public DebouncedButtons(IButtonLevelPort levels, IClockPort clock, ButtonDebouncer button, ButtonDebouncer holdSwitch)
        {
            if (levels == null || clock == null || button == null || holdSwitch == null)
            {
                throw new System.ArgumentNullException("levels");
            }

            this.levels = levels;
            this.clock = clock;
            this.button = button;
            this.holdSwitch = holdSwitch;
        }

        /// <summary>The push button's debouncer (its state: pressed, toggled hold).</summary>
        public ButtonDebouncer Button
        {
            get { return button; }
        }

        /// <inheritdoc />
        public bool TryTakeRebaselinePress()
        {
            ulong now;
            if (clock.TryReadNow(out now))
            {
                bool down;
                if (levels.TryReadButtonDown(out down))
                {
                    button.Update(down, (long)now);
                }

                bool on;
                if (levels.TryReadHoldSwitchOn(out on))
                {
                    switchSeen = true;
                    holdSwitch.Update(on, (long)now);
                }
            }

            return button.TryTakeShortPress();
        }

        /// <inheritdoc />
        public bool TryReadHold(out bool hold)
        {
            hold = switchSeen ? holdSwitch.IsDown : button.HoldOn;
            return true;
        }
    }
}
