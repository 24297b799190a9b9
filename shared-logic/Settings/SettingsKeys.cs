using FreqReadout.Link;

namespace FreqReadout.Settings
{
    /// <summary>
    /// The names of the settings text (docs/settings-format.md): its first line, its version, its keys in the order
    /// the formatter writes them, and its size limit.
    /// </summary>
    public static class SettingsKeys
    {
        /// <summary>The first line without its version: "# freqreadout settings", then one space and the version.</summary>
        public const string MagicPrefix = "# freqreadout settings";

        /// <summary>The version this code reads and writes.</summary>
        public const int Version = 1;

        /// <summary>The first line this code writes and accepts: "# freqreadout settings 1".</summary>
        public const string MagicLine = MagicPrefix + " 1";

        /// <summary>Largest formatted settings text, bytes of ASCII: one link frame's payload (<see cref="LinkFrameEncoder.MaxPayloadBytes"/>).</summary>
        public const int MaxTextBytes = LinkFrameEncoder.MaxPayloadBytes;

        /// <summary>Time gate, seconds.</summary>
        public const string GateSeconds = "gate_s";

        /// <summary>Frequency estimator.</summary>
        public const string Estimator = "estimator";

        /// <summary>Detection threshold, noise sigmas.</summary>
        public const string ThresholdSigma = "threshold_sigma";

        /// <summary>Sign-to-class polarity.</summary>
        public const string Polarity = "polarity";

        /// <summary>Search oscillator or beat note.</summary>
        public const string Signal = "signal";

        /// <summary>Search above or below the reference (beat mode).</summary>
        public const string BeatSide = "beat_side";

        /// <summary>Nominal search frequency, Hz.</summary>
        public const string SearchHz = "search_hz";

        /// <summary>Search-oscillator tempco, ppm/K.</summary>
        public const string TempcoPpmPerK = "tempco_ppm_per_k";

        /// <summary>What the device sends over the link.</summary>
        public const string LinkMode = "link";

        /// <summary>Pulse-counter read rate, Hz.</summary>
        public const string ReadRateHz = "read_rate_hz";

        /// <summary>Stall limit of the read loop, ms.</summary>
        public const string StallLimitMilliseconds = "stall_ms";

        /// <summary>Number of keys.</summary>
        public const int Count = 11;

        /// <summary>The key at <paramref name="index"/> (0 to <see cref="Count"/> - 1) in the formatter's order; null outside that range.</summary>
        public static string KeyAt(int index)
        {
            switch (index)
            {
                case 0: return GateSeconds;
                case 1: return Estimator;
                case 2: return ThresholdSigma;
                case 3: return Polarity;
                case 4: return Signal;
                case 5: return BeatSide;
                case 6: return SearchHz;
                case 7: return TempcoPpmPerK;
                case 8: return LinkMode;
                case 9: return ReadRateHz;
                case 10: return StallLimitMilliseconds;
                default: return null;
            }
        }

        /// <summary>The index of <paramref name="key"/> (exact, case-sensitive), or -1 for an unknown key.</summary>
        public static int IndexOf(string key)
        {
            for (int i = 0; i < Count; i++)
            {
                if (KeyAt(i) == key)
                {
                    return i;
                }
            }

            return -1;
        }
    }
}
