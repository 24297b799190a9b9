using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Readout;

namespace FreqReadout.Settings
{
    /// <summary>
    /// The settings the device keeps in its settings text (docs/settings-format.md), one property per key. The
    /// counting and readout ones take their defaults and ranges from <see cref="CounterSettings"/> and
    /// <see cref="ReadoutSettings"/> (their TryValidate decides; no range is repeated here); the link and read-loop
    /// ones are defined here. Decimal numbers are held to the text's resolution (the *Decimals constants) so that a
    /// valid value survives formatting and reading exactly. Plain settable properties; call <see cref="TryValidate"/>.
    /// </summary>
    public sealed class DeviceSettingsValues
    {
        /// <summary>Decimal places of gate_s (1 us steps: the shortest gate <see cref="CounterSettings.MinGateSeconds"/> is one step).</summary>
        public const int GateSecondsDecimals = 6;

        /// <summary>Decimal places of threshold_sigma (0.01 sigma steps).</summary>
        public const int ThresholdSigmaDecimals = 2;

        /// <summary>Decimal places of search_hz (0.01 Hz steps).</summary>
        public const int SearchHzDecimals = 2;

        /// <summary>Decimal places of tempco_ppm_per_k (0.01 ppm/K steps).</summary>
        public const int TempcoPpmPerKDecimals = 2;

        /// <summary>Slowest pulse-counter read rate, Hz.</summary>
        public const int MinReadRateHz = 100;

        /// <summary>Fastest pulse-counter read rate, Hz.</summary>
        public const int MaxReadRateHz = 2000;

        /// <summary>Default pulse-counter read rate, Hz.</summary>
        public const int DefaultReadRateHz = 1000;

        /// <summary>Shortest stall limit, ms: the read period at <see cref="MinReadRateHz"/>, so the limit is never below the period at any rate.</summary>
        public const int MinStallLimitMilliseconds = 10;

        /// <summary>Longest stall limit, ms (10 s).</summary>
        public const int MaxStallLimitMilliseconds = 10000;

        /// <summary>Default stall limit, ms: five 10 ms system ticks (a rule of thumb, common practice, no source).</summary>
        public const int DefaultStallLimitMilliseconds = 50;

        /// <summary>Values at their defaults (<see cref="ResetToDefaults"/>).</summary>
        public DeviceSettingsValues()
        {
            ResetToDefaults();
        }

        /// <summary>gate_s: time gate length, seconds, in CounterSettings' range [1e-6, 86400], in 1 us steps. Default CounterSettings' 0.1 s.</summary>
        public double GateSeconds { get; set; }

        /// <summary>estimator: reciprocal or regression (edge counting; the snapshot counter always uses snapshot regression). Default CounterSettings' regression.</summary>
        public EstimatorKind Estimator { get; set; }

        /// <summary>threshold_sigma: detection threshold, in ReadoutSettings' range [1, 1000] and above its hysteresis_sigma (default 2), in 0.01 steps. Default ReadoutSettings' 5.</summary>
        public double ThresholdSigma { get; set; }

        /// <summary>polarity: normal or inverted. Default ReadoutSettings' normal.</summary>
        public Polarity Polarity { get; set; }

        /// <summary>signal: search or beat. Default search.</summary>
        public SignalKind Signal { get; set; }

        /// <summary>beat_side: none, above or below; above or below is required when <see cref="Signal"/> is beat, ignored for search. Default none.</summary>
        public BeatSide BeatSide { get; set; }

        /// <summary>search_hz: nominal search-oscillator frequency, Hz, ReadoutSettings' range [0, 1e12] (0 = unknown), in 0.01 Hz steps. Default 0.</summary>
        public double SearchHz { get; set; }

        /// <summary>tempco_ppm_per_k: search-oscillator tempco removed before tracking, ReadoutSettings' range [-1000, 1000] (0 = off; needs search_hz &gt; 0 in beat mode), in 0.01 steps. Default 0.</summary>
        public double TempcoPpmPerK { get; set; }

        /// <summary>link: what the device sends to the PC. Default <see cref="Settings.LinkMode.Capture"/>, so that a device fresh from flashing streams what `record` needs.</summary>
        public LinkMode LinkMode { get; set; }

        /// <summary>read_rate_hz: pulse-counter reads per second, integer in [<see cref="MinReadRateHz"/>, <see cref="MaxReadRateHz"/>]. Default <see cref="DefaultReadRateHz"/>.</summary>
        public int ReadRateHz { get; set; }

        /// <summary>stall_ms: a gap between two reads longer than this is counted as a stall of the device loop, integer ms in [<see cref="MinStallLimitMilliseconds"/>, <see cref="MaxStallLimitMilliseconds"/>]. Default <see cref="DefaultStallLimitMilliseconds"/>.</summary>
        public int StallLimitMilliseconds { get; set; }

        /// <summary>Sets every value to its default: the counting and readout ones from fresh <see cref="CounterSettings"/> and <see cref="ReadoutSettings"/>, the others from the Default* constants.</summary>
        public void ResetToDefaults()
        {
            CounterSettings counter = new CounterSettings();
            ReadoutSettings readout = new ReadoutSettings();
            CopyFromSettings(counter, readout);
            LinkMode = LinkMode.Capture;
            ReadRateHz = DefaultReadRateHz;
            StallLimitMilliseconds = DefaultStallLimitMilliseconds;
        }

        /// <summary>Copies every value of <paramref name="other"/> into this one.</summary>
        public void CopyFrom(DeviceSettingsValues other)
        {
            GateSeconds = other.GateSeconds;
            Estimator = other.Estimator;
            ThresholdSigma = other.ThresholdSigma;
            Polarity = other.Polarity;
            Signal = other.Signal;
            BeatSide = other.BeatSide;
            SearchHz = other.SearchHz;
            TempcoPpmPerK = other.TempcoPpmPerK;
            LinkMode = other.LinkMode;
            ReadRateHz = other.ReadRateHz;
            StallLimitMilliseconds = other.StallLimitMilliseconds;
        }

        /// <summary>
        /// Writes the values the two settings objects hold (gate, estimator and signal into the counter; signal, beat
        /// side, search frequency, tempco, threshold and polarity into the readout) and leaves their other settings
        /// as they are. LinkMode, ReadRateHz and StallLimitMilliseconds belong to the device loop and stay here.
        /// Validates nothing: check the result with their TryValidate (the threshold must stay above the readout's
        /// hysteresis_sigma).
        /// </summary>
        public void ApplyTo(CounterSettings counter, ReadoutSettings readout)
        {
            counter.GateSeconds = GateSeconds;
            counter.Estimator = Estimator;
            counter.Signal = Signal;
            readout.Signal = Signal;
            readout.BeatSide = BeatSide;
            readout.SearchHz = SearchHz;
            readout.TempcoPpmPerK = TempcoPpmPerK;
            readout.ThresholdSigma = ThresholdSigma;
            readout.Polarity = Polarity;
        }

        /// <summary>
        /// Takes the current values from the settings objects (the reverse of <see cref="ApplyTo"/>; the signal is the
        /// readout's), the decimal ones rounded to the text's steps (halves away from zero), keeping this object's
        /// link and read-loop values. When the result is not valid, this object is left unchanged.
        /// </summary>
        /// <param name="counter">Counting settings to read.</param>
        /// <param name="readout">Readout settings to read.</param>
        /// <param name="error">Why the values cannot be taken (the first bad one and its allowed values); null on success.</param>
        /// <returns>True when the values were taken.</returns>
        public bool TryTakeFrom(CounterSettings counter, ReadoutSettings readout, out string error)
        {
            if (counter == null || readout == null)
            {
                error = "counter and readout settings are required";
                return false;
            }

            DeviceSettingsValues taken = new DeviceSettingsValues();
            taken.CopyFrom(this);
            taken.CopyFromSettings(counter, readout);
            // A value too large or not finite for the text's steps is kept as it is: TryValidate names its range.
            taken.GateSeconds = RoundToStep(taken.GateSeconds, GateSecondsDecimals);
            taken.ThresholdSigma = RoundToStep(taken.ThresholdSigma, ThresholdSigmaDecimals);
            taken.SearchHz = RoundToStep(taken.SearchHz, SearchHzDecimals);
            taken.TempcoPpmPerK = RoundToStep(taken.TempcoPpmPerK, TempcoPpmPerKDecimals);
            if (counter.Signal != readout.Signal)
            {
                error = "signal: the counter and the readout settings disagree";
                return false;
            }

            if (!taken.TryValidate(out error))
            {
                return false;
            }

            CopyFrom(taken);
            return true;
        }

        /// <summary>
        /// Checks every value: each on its own (the Check* methods) and then the two rules between keys: beat_side must
        /// be above or below when signal is beat; a non-zero tempco in beat mode needs search_hz &gt; 0 (ReadoutSettings' rule).
        /// </summary>
        /// <param name="error">The first bad value, named by its key with what is allowed; null when all are valid.</param>
        /// <returns>True when every value is valid.</returns>
        public bool TryValidate(out string error)
        {
            return TryCheckGateSeconds(GateSeconds, out error)
                && TryCheckEstimator(Estimator, out error)
                && TryCheckThresholdSigma(ThresholdSigma, out error)
                && TryCheckPolarity(Polarity, out error)
                && TryCheckSignal(Signal, out error)
                && TryCheckBeatSide(BeatSide, out error)
                && TryCheckSearchHz(SearchHz, out error)
                && TryCheckTempcoPpmPerK(TempcoPpmPerK, out error)
                && TryCheckLinkMode(LinkMode, out error)
                && TryCheckReadRateHz(ReadRateHz, out error)
                && TryCheckStallLimitMilliseconds(StallLimitMilliseconds, out error)
                && TryCheckBeatRules(Signal, BeatSide, SearchHz, TempcoPpmPerK, out error);
        }

        /// <summary>gate_s on its own: CounterSettings' gate range (its TryValidate) and a whole number of 1 us steps.</summary>
        public static bool TryCheckGateSeconds(double value, out string error)
        {
            CounterSettings probe = new CounterSettings();
            probe.ClockHz = 1; // any valid clock: only the gate is checked here
            probe.GateSeconds = value;
            if (!probe.TryValidate(out error))
            {
                return false;
            }

            return OnStep(value, GateSecondsDecimals, "gate_s", out error);
        }

        /// <summary>estimator on its own: reciprocal or regression.</summary>
        public static bool TryCheckEstimator(EstimatorKind value, out string error)
        {
            error = value == EstimatorKind.Reciprocal || value == EstimatorKind.Regression ? null : "estimator must be reciprocal or regression";
            return error == null;
        }

        /// <summary>threshold_sigma on its own: ReadoutSettings' range with its default hysteresis (its TryValidate), in 0.01 steps.</summary>
        public static bool TryCheckThresholdSigma(double value, out string error)
        {
            ReadoutSettings probe = new ReadoutSettings();
            probe.ThresholdSigma = value;
            if (!probe.TryValidate(out error))
            {
                return false;
            }

            return OnStep(value, ThresholdSigmaDecimals, "threshold_sigma", out error);
        }

        /// <summary>polarity on its own: normal or inverted (ReadoutSettings' TryValidate).</summary>
        public static bool TryCheckPolarity(Polarity value, out string error)
        {
            ReadoutSettings probe = new ReadoutSettings();
            probe.Polarity = value;
            return probe.TryValidate(out error);
        }

        /// <summary>signal on its own: search or beat (ReadoutSettings' TryValidate; beat_side is checked by <see cref="TryCheckBeatRules"/>).</summary>
        public static bool TryCheckSignal(SignalKind value, out string error)
        {
            if (value != SignalKind.Search && value != SignalKind.Beat)
            {
                ReadoutSettings probe = new ReadoutSettings();
                probe.Signal = value;
                return probe.TryValidate(out error);
            }

            error = null;
            return true;
        }

        /// <summary>beat_side on its own: none, above or below.</summary>
        public static bool TryCheckBeatSide(BeatSide value, out string error)
        {
            error = value == BeatSide.None || value == BeatSide.Above || value == BeatSide.Below ? null : "beat_side must be none, above or below";
            return error == null;
        }

        /// <summary>search_hz on its own: ReadoutSettings' range (its TryValidate), in 0.01 Hz steps.</summary>
        public static bool TryCheckSearchHz(double value, out string error)
        {
            ReadoutSettings probe = new ReadoutSettings();
            probe.SearchHz = value;
            if (!probe.TryValidate(out error))
            {
                return false;
            }

            return OnStep(value, SearchHzDecimals, "search_hz", out error);
        }

        /// <summary>tempco_ppm_per_k on its own: ReadoutSettings' range (its TryValidate, search mode), in 0.01 steps.</summary>
        public static bool TryCheckTempcoPpmPerK(double value, out string error)
        {
            ReadoutSettings probe = new ReadoutSettings();
            probe.TempcoPpmPerK = value;
            if (!probe.TryValidate(out error))
            {
                return false;
            }

            return OnStep(value, TempcoPpmPerKDecimals, "tempco_ppm_per_k", out error);
        }

        /// <summary>link on its own: off, readings or capture.</summary>
        public static bool TryCheckLinkMode(LinkMode value, out string error)
        {
            error = value == LinkMode.Off || value == LinkMode.Readings || value == LinkMode.Capture ? null : "link must be off, readings or capture";
            return error == null;
        }

        /// <summary>read_rate_hz on its own: [<see cref="MinReadRateHz"/>, <see cref="MaxReadRateHz"/>].</summary>
        public static bool TryCheckReadRateHz(int value, out string error)
        {
            error = value >= MinReadRateHz && value <= MaxReadRateHz ? null : "read_rate_hz must be an integer in [" + SettingsDecimal.FormatScaled(MinReadRateHz, 0) + ", " + SettingsDecimal.FormatScaled(MaxReadRateHz, 0) + "]";
            return error == null;
        }

        /// <summary>stall_ms on its own: [<see cref="MinStallLimitMilliseconds"/>, <see cref="MaxStallLimitMilliseconds"/>].</summary>
        public static bool TryCheckStallLimitMilliseconds(int value, out string error)
        {
            error = value >= MinStallLimitMilliseconds && value <= MaxStallLimitMilliseconds ? null : "stall_ms must be an integer in [" + SettingsDecimal.FormatScaled(MinStallLimitMilliseconds, 0) + ", " + SettingsDecimal.FormatScaled(MaxStallLimitMilliseconds, 0) + "]";
            return error == null;
        }

        /// <summary>
        /// The rules between keys, with ReadoutSettings' TryValidate on these four values: beat_side above or below
        /// when signal = beat; tempco_ppm_per_k != 0 in beat mode needs search_hz &gt; 0.
        /// </summary>
        public static bool TryCheckBeatRules(SignalKind signal, BeatSide beatSide, double searchHz, double tempcoPpmPerK, out string error)
        {
            ReadoutSettings probe = new ReadoutSettings();
            probe.Signal = signal;
            probe.BeatSide = beatSide;
            probe.SearchHz = searchHz;
            probe.TempcoPpmPerK = tempcoPpmPerK;
            return probe.TryValidate(out error);
        }

        private void CopyFromSettings(CounterSettings counter, ReadoutSettings readout)
        {
            GateSeconds = counter.GateSeconds;
            Estimator = counter.Estimator;
            ThresholdSigma = readout.ThresholdSigma;
            Polarity = readout.Polarity;
            Signal = readout.Signal;
            BeatSide = readout.BeatSide;
            SearchHz = readout.SearchHz;
            TempcoPpmPerK = readout.TempcoPpmPerK;
        }

        private static bool OnStep(double value, int decimals, string key, out string error)
        {
            if (SettingsDecimal.IsOnGrid(value, decimals))
            {
                error = null;
                return true;
            }

            error = key + " must be a whole number of steps of " + SettingsDecimal.FormatScaled(1, decimals) + " (the settings text keeps " + SettingsDecimal.FormatScaled(decimals, 0) + " decimal places)";
            return false;
        }

        private static double RoundToStep(double value, int decimals)
        {
            long m;
            return SettingsDecimal.TryToScaled(value, decimals, out m) ? SettingsDecimal.ToValue(m, decimals) : value;
        }
    }
}
