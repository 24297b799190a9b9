using FreqReadout.Detection;

namespace FreqReadout.Readout
{
    /// <summary>
    /// One reading per gate. Shifts are of the search oscillator (beat side applied, polarity not
    /// applied), from the tracked baseline, after temperature compensation. Baseline and drift are of
    /// the counted signal.
    /// </summary>
    public sealed class Reading
    {
        /// <summary>An empty reading (every field 0) for the core to fill.</summary>
        public Reading()
        {
        }

        /// <summary>Fills every field; each argument is stored in the property of the same name.</summary>
        public void Set(
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
            TargetClass targetClass,
            bool baselineDisturbed)
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
            BaselineDisturbed = baselineDisturbed;
        }

        /// <summary>State of the readout at this reading.</summary>
        public ReadoutState State { get; private set; }

        /// <summary>Gate end, seconds from the first edge.</summary>
        public double TimeSeconds { get; private set; }

        /// <summary>Gate span, s.</summary>
        public double SpanSeconds { get; private set; }

        /// <summary>False when there is no signal.</summary>
        public bool HasFrequency { get; private set; }

        /// <summary>Counted frequency as measured (before temperature compensation), Hz.</summary>
        public double FrequencyHz { get; private set; }

        /// <summary>True once a baseline is tracked (states Tracking, Target, Hold).</summary>
        public bool HasShift { get; private set; }

        /// <summary>Tracked baseline of the counted signal at this time, Hz (0 without a baseline).</summary>
        public double BaselineHz { get; private set; }

        /// <summary>Search-oscillator shift from the baseline, Hz.</summary>
        public double ShiftHz { get; private set; }

        /// <summary>False when no ppm reference is known.</summary>
        public bool HasPpm { get; private set; }

        /// <summary>Shift, ppm of the search oscillator.</summary>
        public double ShiftPpm { get; private set; }

        /// <summary>|Shift| / noise sigma.</summary>
        public double ShiftSigma { get; private set; }

        /// <summary>Noise sigma in use, Hz.</summary>
        public double NoiseHz { get; private set; }

        /// <summary>Tracked drift rate of the counted signal, Hz/s.</summary>
        public double DriftHzPerSecond { get; private set; }

        /// <summary>Temperature correction subtracted from the counted frequency, Hz (0 when off).</summary>
        public double TemperatureCorrectionHz { get; private set; }

        /// <summary>A target (candidate or event) is open.</summary>
        public bool TargetPresent { get; private set; }

        /// <summary>Hold mode is on.</summary>
        public bool HoldActive { get; private set; }

        /// <summary>Beat mode and the beat note is below its floor: the sign is unclear.</summary>
        public bool BelowBeatFloor { get; private set; }

        /// <summary>Live class of the open target by the sign rule (None without a target).</summary>
        public TargetClass Class { get; private set; }

        /// <summary>The last baseline capture was disturbed (being captured again, or kept as the best of several disturbed attempts).</summary>
        public bool BaselineDisturbed { get; private set; }

        /// <summary>True when this reading is a target-free residual (baseline tracked, no target open).</summary>
        public bool IsTargetFree
        {
            get { return HasShift && !TargetPresent; }
        }

        /// <summary>Copies every field of <paramref name="other"/> into this object.</summary>
        public void CopyFrom(Reading other)
        {
            Set(
                other.State,
                other.TimeSeconds,
                other.SpanSeconds,
                other.HasFrequency,
                other.FrequencyHz,
                other.HasShift,
                other.BaselineHz,
                other.ShiftHz,
                other.HasPpm,
                other.ShiftPpm,
                other.ShiftSigma,
                other.NoiseHz,
                other.DriftHzPerSecond,
                other.TemperatureCorrectionHz,
                other.TargetPresent,
                other.HoldActive,
                other.BelowBeatFloor,
                other.Class,
                other.BaselineDisturbed);
        }
    }
}
