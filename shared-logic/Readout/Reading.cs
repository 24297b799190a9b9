using FreqReadout.Detection;

namespace FreqReadout.Readout
{
    /// <summary>
    /// One reading per gate. Shifts are of the search oscillator (beat side applied, polarity not
    /// applied), from the tracked baseline, after temperature compensation. Baseline and drift are of
    /// the counted signal.
    /// </summary>
    public struct Reading
    {
        public Reading(
            ReadoutState state,
            double timeSeconds,
            double spanSeconds,
            bool hasFrequency,
            double frequencyHz,
            bool hasShift,
            double baselineHz,
            double shiftHz,
            bool hasPpm,
            double shiftPpm,
            double shiftSigma,
            double noiseHz,
            double driftHzPerSecond,
            double temperatureCorrectionHz,
            bool targetPresent,
            bool holdActive,
            bool belowBeatFloor,
            TargetClass targetClass)
        {
            State = state;
            TimeSeconds = timeSeconds;
            SpanSeconds = spanSeconds;
            HasFrequency = hasFrequency;
            FrequencyHz = frequencyHz;
            HasShift = hasShift;
            BaselineHz = baselineHz;
            ShiftHz = shiftHz;
            HasPpm = hasPpm;
            ShiftPpm = shiftPpm;
            ShiftSigma = shiftSigma;
            NoiseHz = noiseHz;
            DriftHzPerSecond = driftHzPerSecond;
            TemperatureCorrectionHz = temperatureCorrectionHz;
            TargetPresent = targetPresent;
            HoldActive = holdActive;
            BelowBeatFloor = belowBeatFloor;
            Class = targetClass;
        }

        /// <summary>State of the readout at this reading.</summary>
        public ReadoutState State { get; }

        /// <summary>Gate end, seconds from the first edge.</summary>
        public double TimeSeconds { get; }

        /// <summary>Gate span, s.</summary>
        public double SpanSeconds { get; }

        /// <summary>False when there is no signal.</summary>
        public bool HasFrequency { get; }

        /// <summary>Counted frequency as measured (before temperature compensation), Hz.</summary>
        public double FrequencyHz { get; }

        /// <summary>True once a baseline is tracked (states Tracking, Target, Hold).</summary>
        public bool HasShift { get; }

        /// <summary>Tracked baseline of the counted signal at this time, Hz (0 without a baseline).</summary>
        public double BaselineHz { get; }

        /// <summary>Search-oscillator shift from the baseline, Hz.</summary>
        public double ShiftHz { get; }

        /// <summary>False when no ppm reference is known.</summary>
        public bool HasPpm { get; }

        /// <summary>Shift, ppm of the search oscillator.</summary>
        public double ShiftPpm { get; }

        /// <summary>|Shift| / noise sigma.</summary>
        public double ShiftSigma { get; }

        /// <summary>Noise sigma in use, Hz.</summary>
        public double NoiseHz { get; }

        /// <summary>Tracked drift rate of the counted signal, Hz/s.</summary>
        public double DriftHzPerSecond { get; }

        /// <summary>Temperature correction subtracted from the counted frequency, Hz (0 when off).</summary>
        public double TemperatureCorrectionHz { get; }

        /// <summary>A target (candidate or event) is open.</summary>
        public bool TargetPresent { get; }

        /// <summary>Hold mode is on.</summary>
        public bool HoldActive { get; }

        /// <summary>Beat mode and the beat note is below its floor: the sign is unclear.</summary>
        public bool BelowBeatFloor { get; }

        /// <summary>Live class of the open target by the sign rule (None without a target).</summary>
        public TargetClass Class { get; }

        /// <summary>True when this reading is a target-free residual (baseline tracked, no target open).</summary>
        public bool IsTargetFree
        {
            get { return HasShift && !TargetPresent; }
        }
    }
}
