namespace FreqReadout.Firmware.Ports
{
    /// <summary>A small text display (board adapter). Lines are short ASCII strings.</summary>
    public interface IDisplayPort
    {
        /// <summary>Number of characters a line can show.</summary>
        int LineWidth { get; }

        /// <summary>Shows the given lines, replacing what was shown.</summary>
        void Show(string line1, string line2, string line3);
    }
}
