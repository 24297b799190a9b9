namespace FreqReadout.Firmware.Ports
{
    /// <summary>The re-baseline push button and the optional hold switch (board adapter).</summary>
    public interface IButtonPort
    {
        /// <summary>Takes a pending press of the re-baseline button; true once per press.</summary>
        bool TryTakeRebaselinePress();

        /// <summary>Reads the hold switch; false when the board has none or it cannot be read.</summary>
        bool TryReadHold(out bool hold);
    }
}
