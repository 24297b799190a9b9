using FreqReadout.Detection;
using FreqReadout.Readout;

namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// The three numeric display lines for a reading. Called once per gate (a few times a second),
    /// never per edge, so the strings it builds do not load the device's garbage collector.
    /// Line 1: the counted frequency; line 2: the search-oscillator shift in Hz and ppm, or the
    /// settling / no-signal state; line 3: the class of a present target, or the tracker state.
    /// </summary>
    public static class DisplayText
    {
        /// <summary>Line 1: "F 130012.4 Hz", or "F --- no signal".</summary>
        public static string FrequencyLine(Reading reading)
        {
            if (!reading.HasFrequency)
            {
                return "F --- no signal";
            }

            return "F " + reading.FrequencyHz.ToString("F1") + " Hz";
        }

        /// <summary>Line 2: "d +12.35 Hz +95 ppm", "settling..." before the baseline, or "check input" without signal.</summary>
        public static string ShiftLine(Reading reading)
        {
            if (reading.State == ReadoutState.NoSignal)
            {
                return "check input";
            }

            if (!reading.HasShift)
            {
                return "settling...";
            }

            string line = "d " + Signed(reading.ShiftHz, "F2") + " Hz";
            if (reading.HasPpm)
            {
                line += " " + Signed(reading.ShiftPpm, "F1") + " ppm";
            }

            return line;
        }

        /// <summary>Line 3: the target class while a target is present, else the state.</summary>
        public static string StatusLine(Reading reading)
        {
            string status;
            if (reading.TargetPresent)
            {
                status = ClassWord(reading.Class);
            }
            else
            {
                switch (reading.State)
                {
                    case ReadoutState.NoSignal: status = "NO SIGNAL"; break;
                    case ReadoutState.Settling: status = "BASELINE"; break;
                    case ReadoutState.Hold: status = "HOLD"; break;
                    default: status = "tracking"; break;
                }
            }

            if (reading.BaselineDisturbed)
            {
                status += " BASELINE MOVED";
            }

            if (reading.BelowBeatFloor)
            {
                status += " beat low!";
            }
            else if (reading.HoldActive && reading.State != ReadoutState.Hold)
            {
                status += " (hold)";
            }

            return status;
        }

        /// <summary>The word shown for a class.</summary>
        public static string ClassWord(TargetClass targetClass)
        {
            switch (targetClass)
            {
                case TargetClass.Ferrous: return "FERROUS";
                case TargetClass.NonFerrous: return "NON-FERROUS";
                case TargetClass.Unclear: return "UNCLEAR";
                default: return "TARGET";
            }
        }

        private static string Signed(double value, string format)
        {
            string text = value.ToString(format);
            return value >= 0 ? "+" + text : text;
        }
    }
}
