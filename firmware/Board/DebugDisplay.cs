// Board adapter (builds only with -p:FreqReadoutBoard=true).
using System.Diagnostics;
using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Board
{
    /// <summary>Shows the readout lines on the debug output; replace with the board's display driver.</summary>
    public sealed class DebugDisplay : IDisplayPort
    {
        public int LineWidth
        {
            get { return 21; }
        }

        public void Show(string line1, string line2, string line3)
        {
            Debug.WriteLine(line1 + " | " + line2 + " | " + line3);
        }
    }
}
