using FreqReadout.Counting;
using FreqReadout.Readout;

namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// Everything the device loop needs: the counter and readout settings the host tools use too,
    /// plus the board's timer and counter widths and the loop's work limits.
    /// </summary>
    public sealed class DeviceSettings
    {
        public DeviceSettings(CounterSettings counter, ReadoutSettings readout)
        {
            Counter = counter;
            Readout = readout;
        }

        /// <summary>Counting settings (clock, prescaler, gate, estimator, guards).</summary>
        public CounterSettings Counter { get; }

        /// <summary>Baseline, tracker and detection settings.</summary>
        public ReadoutSettings Readout { get; }

        /// <summary>Edges or pulse-counter snapshots. Default edges.</summary>
        public InputKind Input { get; set; } = InputKind.Edges;

        /// <summary>Width of the timer that stamps edges or snapshots: 16, 24, 32 or 64. Default 32.</summary>
        public int TimerBits { get; set; } = 32;

        /// <summary>Width of the pulse counter (snapshots): 16, 24, 32 or 64. Default 32.</summary>
        public int CountBits { get; set; } = 32;

        /// <summary>At most this many edges are taken per <see cref="DeviceLoop.Step"/> (&gt;= 1), so buttons and the display stay responsive. Default 256.</summary>
        public int MaxEdgesPerStep { get; set; } = 256;

        /// <summary>
        /// The display is refreshed at most this often, seconds of capture time ([0, 60]; 0 = every gate),
        /// and at once when the state or the target class changes. The display lines are strings, so
        /// this bounds the device's per-second allocations whatever the gate rate. Default 0.5 s.
        /// </summary>
        public double DisplayIntervalSeconds { get; set; } = 0.5;

        /// <summary>Checks every setting; the first bad one is named with its allowed range.</summary>
        public bool TryValidate(out string error)
        {
            if (Counter == null || Readout == null)
            {
                error = "counter and readout settings are required";
                return false;
            }

            if (!Counter.TryValidate(out error))
            {
                return false;
            }

            if (!Readout.TryValidate(out error))
            {
                return false;
            }

            if (!IsWidth(TimerBits))
            {
                error = "timer bits must be 16, 24, 32 or 64";
                return false;
            }

            if (!IsWidth(CountBits))
            {
                error = "count bits must be 16, 24, 32 or 64";
                return false;
            }

            if (!(DisplayIntervalSeconds >= 0 && DisplayIntervalSeconds <= 60))
            {
                error = "display interval seconds must be in [0, 60]";
                return false;
            }

            if (MaxEdgesPerStep < 1)
            {
                error = "max edges per step must be an integer >= 1";
                return false;
            }

            error = null;
            return true;
        }

        private static bool IsWidth(int bits)
        {
            return bits == 16 || bits == 24 || bits == 32 || bits == 64;
        }
    }
}
