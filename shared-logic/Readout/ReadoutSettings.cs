using FreqReadout.Counting;
using FreqReadout.Detection;

namespace FreqReadout.Readout
{
    /// <summary>
    /// Settings of <see cref="ReadoutPipeline"/>: plain settable properties with documented defaults.
    /// Call <see cref="TryValidate"/> before use; its error names the setting (snake_case, as the host
    /// CLI and device settings spell it) and the allowed range. Times are seconds, levels are in noise sigmas.
    /// </summary>
    public sealed class ReadoutSettings
    {
        /// <summary>signal: search (default) or beat. Must match the counter.</summary>
        public SignalKind Signal { get; set; } = SignalKind.Search;

        /// <summary>beat_side: above or below (required in beat mode; ignored for search).</summary>
        public BeatSide BeatSide { get; set; } = BeatSide.None;

        /// <summary>search_hz: nominal search-oscillator frequency for ppm in beat mode and for the tempco; 0 = unknown (default). In search mode the tracked baseline is the ppm reference.</summary>
        public double SearchHz { get; set; }

        /// <summary>settling_s: wait after start or a re-baseline request before capturing, [0, 3600]. Default 1 s.</summary>
        public double SettlingSeconds { get; set; } = 1.0;

        /// <summary>baseline_s: length of the baseline capture, (0, 600]. Default 5 s.</summary>
        public double BaselineSeconds { get; set; } = 5.0;

        /// <summary>baseline_max_gates: capture buffer size (a capture also ends when full), [8, 8192]. Default 512.</summary>
        public int BaselineMaxGates { get; set; } = 512;

        /// <summary>outlier_sigma: capture points beyond this many robust sigmas are rejected, [2, 20]. Default 3 (Hampel's rule).</summary>
        public double OutlierSigma { get; set; } = 3.0;

        /// <summary>noise_window_gates: running robust noise over the last target-free residuals, [16, 4096]. Default 512 (relative standard error of the MAD about 1.17 / sqrt(512) = 5 %).</summary>
        public int NoiseWindowGates { get; set; } = 512;

        /// <summary>noise_floor_hz: least noise sigma used (the gate's predicted error is a floor too), (0, 1e6]. Default 0.001 Hz.</summary>
        public double NoiseFloorHz { get; set; } = 0.001;

        /// <summary>tracker_memory_s: memory the drift tracker (Kalman level, rate and acceleration) starts from after a baseline; it then adapts within [0.4, 120] s, [0.4, 120]. Default 5 s.</summary>
        public double TrackerMemorySeconds { get; set; } = 5.0;

        /// <summary>tracker_delay_gates: readings reach the tracker this many gates late, so the rising edge of a target found later is never absorbed (and as many after an event are skipped), [0, 1000]. Default 5.</summary>
        public int TrackerDelayGates { get; set; } = 5;

        /// <summary>guard_sigma: a residual fed to the tracker is clipped to +-guard sigmas, (0, 100]. Default 3.</summary>
        public double GuardSigma { get; set; } = 3.0;

        /// <summary>threshold_sigma: detection threshold on |shift| / sigma, [1, 1000]. Default 5 (about 5.7e-7 false crossings per reading for white Gaussian noise).</summary>
        public double ThresholdSigma { get; set; } = 5.0;

        /// <summary>hysteresis_sigma: an event ends below threshold - hysteresis, [0, threshold_sigma). Default 2.</summary>
        public double HysteresisSigma { get; set; } = 2.0;

        /// <summary>min_duration_s: gate time at or above the release level needed to confirm an event, [0, 60]. Default 0.1 s.</summary>
        public double MinDurationSeconds { get; set; } = 0.1;

        /// <summary>release_s: gate time below the release level that ends an event, [0, 60]. Default 0.2 s.</summary>
        public double ReleaseSeconds { get; set; } = 0.2;

        /// <summary>unclear_band_sigma: peaks below threshold + band are classed unclear, [0, 1000]. Default 0.5 (white noise flips the sign of a 5.5-sigma peak with odds of about 1 in 50 million: the normal tail beyond 5.5, from memory).</summary>
        public double UnclearBandSigma { get; set; } = 0.5;

        /// <summary>polarity: normal (positive search shift = non-ferrous, default) or inverted.</summary>
        public Polarity Polarity { get; set; } = Polarity.Normal;

        /// <summary>persistent_shift_s: an event lasting this long outside hold mode is reported (end auto_rebaseline) and its level becomes the new baseline, re-acquired from the readings already held (auto re-baseline), [1, 86400]. Default 30 s.</summary>
        public double PersistentShiftSeconds { get; set; } = 30.0;

        /// <summary>
        /// lock_check_s: a target candidate that has lasted this long and that one smooth local quadratic
        /// (drift) explains together with the fit_window_s before it is taken as drift the tracker failed
        /// to follow: no event, and the tracker re-anchors on that fit (lock recovered without settling),
        /// [0.5, 600]. Default 2.5 s (a coil pass lasts 0.2-3 s; drift time constants are tens of seconds).
        /// </summary>
        public double LockCheckSeconds { get; set; } = 2.5;

        /// <summary>fit_window_s: target-free readings before a candidate that the local quadratic baseline is fitted to, [1, 600]. Default 8 s (the curvature of a shorter window is too uncertain to extrapolate across a pass).</summary>
        public double FitWindowSeconds { get; set; } = 8.0;

        /// <summary>history_gates: recent readings kept for deciding a candidate afterwards (baseline on both sides of it), [64, 16384]. Default 256: 25.6 s of 0.1 s gates, enough for fit_window_s + 3 lock_check_s + 2 s at the defaults (with shorter gates raise it, or the decision falls back to the causal tracker for want of readings before a candidate). The decision costs O(history_gates) when it runs, at most every 0.2 s while a candidate is open.</summary>
        public int HistoryGates { get; set; } = 256;

        /// <summary>beat_floor_hz: in beat mode a beat note below this is flagged and its sign unclear, [0, 1e9]. Default 50 Hz.</summary>
        public double BeatFloorHz { get; set; } = 50.0;

        /// <summary>tempco_ppm_per_k: search-oscillator tempco removed before tracking; 0 = off (default), [-1000, 1000]. Needs search_hz in beat mode.</summary>
        public double TempcoPpmPerK { get; set; }

        /// <summary>
        /// Checks every setting against its allowed range.
        /// </summary>
        /// <param name="error">The first bad setting, named with its allowed range and the value given; null when all are valid.</param>
        /// <returns>True when every setting is valid.</returns>
        public bool TryValidate(out string error)
        {
            error = null;
            if (Signal != SignalKind.Search && Signal != SignalKind.Beat)
            {
                error = "signal must be search or beat";
                return false;
            }

            if (Signal == SignalKind.Beat && BeatSide != BeatSide.Above && BeatSide != BeatSide.Below)
            {
                error = "beat_side must be above or below when signal = beat";
                return false;
            }

            if (!InRange(SearchHz, 0, 1e12))
            {
                return Bad(out error, "search_hz", "[0, 1e12] (0 = unknown)", SearchHz);
            }

            if (!InRange(SettlingSeconds, 0, 3600))
            {
                return Bad(out error, "settling_s", "[0, 3600]", SettlingSeconds);
            }

            if (!InRange(BaselineSeconds, 0, 600) || BaselineSeconds == 0)
            {
                return Bad(out error, "baseline_s", "(0, 600]", BaselineSeconds);
            }

            if (BaselineMaxGates < 8 || BaselineMaxGates > 8192)
            {
                return BadInteger(out error, "baseline_max_gates", "[8, 8192]", BaselineMaxGates);
            }

            if (!InRange(OutlierSigma, 2, 20))
            {
                return Bad(out error, "outlier_sigma", "[2, 20]", OutlierSigma);
            }

            if (NoiseWindowGates < 16 || NoiseWindowGates > 4096)
            {
                return BadInteger(out error, "noise_window_gates", "[16, 4096]", NoiseWindowGates);
            }

            if (!InRange(NoiseFloorHz, 0, 1e6) || NoiseFloorHz == 0)
            {
                return Bad(out error, "noise_floor_hz", "(0, 1e6]", NoiseFloorHz);
            }

            if (!InRange(TrackerMemorySeconds, 0.4, 120))
            {
                return Bad(out error, "tracker_memory_s", "[0.4, 120]", TrackerMemorySeconds);
            }

            if (TrackerDelayGates < 0 || TrackerDelayGates > 1000)
            {
                return BadInteger(out error, "tracker_delay_gates", "[0, 1000]", TrackerDelayGates);
            }

            if (!InRange(GuardSigma, 0, 100) || GuardSigma == 0)
            {
                return Bad(out error, "guard_sigma", "(0, 100]", GuardSigma);
            }

            if (!InRange(ThresholdSigma, 1, 1000))
            {
                return Bad(out error, "threshold_sigma", "[1, 1000]", ThresholdSigma);
            }

            if (!InRange(HysteresisSigma, 0, 1000) || !(HysteresisSigma < ThresholdSigma))
            {
                return Bad(out error, "hysteresis_sigma", "[0, threshold_sigma) (threshold_sigma = " + ThresholdSigma.ToString() + ")", HysteresisSigma);
            }

            if (!InRange(MinDurationSeconds, 0, 60))
            {
                return Bad(out error, "min_duration_s", "[0, 60]", MinDurationSeconds);
            }

            if (!InRange(ReleaseSeconds, 0, 60))
            {
                return Bad(out error, "release_s", "[0, 60]", ReleaseSeconds);
            }

            if (!InRange(UnclearBandSigma, 0, 1000))
            {
                return Bad(out error, "unclear_band_sigma", "[0, 1000]", UnclearBandSigma);
            }

            if (Polarity != Polarity.Normal && Polarity != Polarity.Inverted)
            {
                error = "polarity must be normal or inverted";
                return false;
            }

            if (!InRange(PersistentShiftSeconds, 1, 86400))
            {
                return Bad(out error, "persistent_shift_s", "[1, 86400]", PersistentShiftSeconds);
            }

            if (!InRange(LockCheckSeconds, 0.5, 600))
            {
                return Bad(out error, "lock_check_s", "[0.5, 600]", LockCheckSeconds);
            }

            if (!InRange(FitWindowSeconds, 1, 600))
            {
                return Bad(out error, "fit_window_s", "[1, 600]", FitWindowSeconds);
            }

            if (HistoryGates < 64 || HistoryGates > 16384)
            {
                return BadInteger(out error, "history_gates", "[64, 16384]", HistoryGates);
            }

            if (!InRange(BeatFloorHz, 0, 1e9))
            {
                return Bad(out error, "beat_floor_hz", "[0, 1e9]", BeatFloorHz);
            }

            if (!InRange(TempcoPpmPerK, -1000, 1000))
            {
                return Bad(out error, "tempco_ppm_per_k", "[-1000, 1000] (0 = off)", TempcoPpmPerK);
            }

            if (TempcoPpmPerK != 0 && Signal == SignalKind.Beat && SearchHz == 0)
            {
                error = "tempco_ppm_per_k needs search_hz > 0 when signal = beat (the tempco is relative to the search frequency)";
                return false;
            }

            return true;
        }

        /// <summary>A copy with the same values.</summary>
        public ReadoutSettings Clone()
        {
            ReadoutSettings c = new ReadoutSettings();
            c.Signal = Signal;
            c.BeatSide = BeatSide;
            c.SearchHz = SearchHz;
            c.SettlingSeconds = SettlingSeconds;
            c.BaselineSeconds = BaselineSeconds;
            c.BaselineMaxGates = BaselineMaxGates;
            c.OutlierSigma = OutlierSigma;
            c.NoiseWindowGates = NoiseWindowGates;
            c.NoiseFloorHz = NoiseFloorHz;
            c.TrackerMemorySeconds = TrackerMemorySeconds;
            c.TrackerDelayGates = TrackerDelayGates;
            c.GuardSigma = GuardSigma;
            c.ThresholdSigma = ThresholdSigma;
            c.HysteresisSigma = HysteresisSigma;
            c.MinDurationSeconds = MinDurationSeconds;
            c.ReleaseSeconds = ReleaseSeconds;
            c.UnclearBandSigma = UnclearBandSigma;
            c.Polarity = Polarity;
            c.PersistentShiftSeconds = PersistentShiftSeconds;
            c.LockCheckSeconds = LockCheckSeconds;
            c.FitWindowSeconds = FitWindowSeconds;
            c.HistoryGates = HistoryGates;
            c.BeatFloorHz = BeatFloorHz;
            c.TempcoPpmPerK = TempcoPpmPerK;
            return c;
        }

        private static bool InRange(double value, double lo, double hi)
        {
            return value >= lo && value <= hi;
        }

        private static bool BadInteger(out string error, string name, string range, int value)
        {
            error = name + " must be an integer in " + range + ", got " + value.ToString();
            return false;
        }

        private static bool Bad(out string error, string name, string range, double value)
        {
            error = name + " must be in " + range + ", got " + value.ToString();
            return false;
        }
    }
}
