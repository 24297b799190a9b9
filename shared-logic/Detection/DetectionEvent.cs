namespace FreqReadout.Detection
{
    /// <summary>
    /// One detected target. Shifts are of the search oscillator (beat side applied, polarity not
    /// applied); times are seconds from the first edge (gate end times).
    /// </summary>
    public struct DetectionEvent
    {
        public DetectionEvent(
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
        public double StartSeconds { get; }

        /// <summary>Last reading at or above the release level, s.</summary>
        public double EndSeconds { get; }

        /// <summary>Reading with the largest |shift|, s.</summary>
        public double PeakSeconds { get; }

        /// <summary>Signed search-oscillator shift with the largest magnitude, Hz.</summary>
        public double PeakShiftHz { get; }

        /// <summary>False when no ppm reference is known (beat mode without search_hz).</summary>
        public bool HasPpm { get; }

        /// <summary>Peak shift, ppm of the search oscillator.</summary>
        public double PeakShiftPpm { get; }

        /// <summary>|Peak shift| in noise sigmas.</summary>
        public double PeakSigma { get; }

        /// <summary>Noise sigma used for the event, Hz.</summary>
        public double NoiseHz { get; }

        /// <summary>Class by the sign rule.</summary>
        public TargetClass Class { get; }

        /// <summary>Some reading of the event had the beat note below its floor.</summary>
        public bool BelowBeatFloor { get; }

        /// <summary>Readings beyond the threshold had both signs.</summary>
        public bool MixedSign { get; }

        /// <summary>What ended the event.</summary>
        public EventEnd End { get; }
    }
}
