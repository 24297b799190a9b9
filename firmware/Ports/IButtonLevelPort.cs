namespace FreqReadout.Firmware.Ports
{
    /// <summary>The raw, undebounced levels of the push button and the optional hold switch (board adapter over GPIO pins).</summary>
    public interface IButtonLevelPort
    {
        /// <summary>Reads the push button's level now: true while pressed (bouncing included); false when it cannot be read.</summary>
        bool TryReadButtonDown(out bool down);

        /// <summary>Reads the hold switch's level now: true while on; false when the board has none or it cannot be read.</summary>
        bool TryReadHoldSwitchOn(out bool on);
    }
}
