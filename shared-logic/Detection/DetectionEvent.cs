namespace FreqReadout.Detection
{
    /// <summary>
    /// One detected target. Shifts are of the search oscillator (beat side applied, polarity not
    /// applied); times are seconds from the first edge (gate end times).
    /// </summary>
    public sealed class DetectionEvent
    {
        /// <summary>An empty event (every field 0) for the core to fill.</summary>
        public DetectionEvent()
        {
        }

        /// <summary>Fills every field; each argument is stored in the property of the same name.</summary>
        public void Set(
            double startSeconds,
            double endSeconds,
            double peakSeconds,
            double peakShiftHz,
            bool hasPpm,
            double peakShiftPpm,
            double peakSigma,
            double noiseHz,
            TargetClass targetClass,
            bool belowBeatFloor,
            bool mixedSign,
            EventEnd end)
        {
            StartSeconds = startSeconds;
            EndSeconds = endSeconds;
            PeakSeconds = peakSeconds;
            PeakShiftHz = peakShiftHz;
            HasPpm = hasPpm;
            PeakShiftPpm = peakShiftPpm;
            PeakSigma = peakSigma;
            NoiseHz = noiseHz;
            Class = targetClass;
            BelowBeatFloor = belowBeatFloor;
            MixedSign = mixedSign;
            End = end;
        }

        /// <summary>First reading at or above the threshold, s.</summary>
        public double StartSeconds { get; private set; }

        /// <summary>Last reading at or above the release level, s.</summary>
        public double EndSeconds { get; private set; }

        /// <summary>Reading with the largest |shift|, s.</summary>
        public double PeakSeconds { get; private set; }

        /// <summary>Signed search-oscillator shift with the largest magnitude, Hz.</summary>
        public double PeakShiftHz { get; private set; }

        /// <summary>False when no ppm reference is known (beat mode without search_hz).</summary>
        public bool HasPpm { get; private set; }

        /// <summary>Peak shift, ppm of the search oscillator.</summary>
        public double PeakShiftPpm { get; private set; }

        /// <summary>|Peak shift| in noise sigmas.</summary>
        public double PeakSigma { get; private set; }

        /// <summary>Noise sigma used for the event, Hz.</summary>
        public double NoiseHz { get; private set; }

        /// <summary>Class by the sign rule.</summary>
        public TargetClass Class { get; private set; }

        /// <summary>Some reading of the event had the beat note below its floor.</summary>
        public bool BelowBeatFloor { get; private set; }

        /// <summary>Readings beyond the threshold had both signs.</summary>
        public bool MixedSign { get; private set; }

        /// <summary>What ended the event.</summary>
        public EventEnd End { get; private set; }

        /// <summary>Copies every field of <paramref name="other"/> into this object.</summary>
        public void CopyFrom(DetectionEvent other)
        {
            Set(
                other.StartSeconds,
                other.EndSeconds,
                other.PeakSeconds,
                other.PeakShiftHz,
                other.HasPpm,
                other.PeakShiftPpm,
                other.PeakSigma,
                other.NoiseHz,
                other.Class,
                other.BelowBeatFloor,
                other.MixedSign,
                other.End);
        }
    }
}
