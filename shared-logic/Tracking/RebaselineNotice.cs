namespace FreqReadout.Tracking
{
    /// <summary>
    /// A completed baseline capture. Shifts are of the search oscillator (beat side applied):
    /// new baseline minus the previous tracked baseline extrapolated to <see cref="CompletedSeconds"/>.
    /// </summary>
    public struct RebaselineNotice
    {
        public RebaselineNotice(
            RebaselineReason reason,
            double requestedSeconds,
            double completedSeconds,
            double baselineHz,
            double noiseHz,
            bool hasShift,
            double shiftHz,
            bool hasPpm,
            double shiftPpm,
            int gates,
            int outliers)
        {
            Reason = reason;
            RequestedSeconds = requestedSeconds;
            CompletedSeconds = completedSeconds;
            BaselineHz = baselineHz;
            NoiseHz = noiseHz;
            HasShift = hasShift;
            ShiftHz = shiftHz;
            HasPpm = hasPpm;
            ShiftPpm = shiftPpm;
            Gates = gates;
            Outliers = outliers;
        }

        /// <summary>Why.</summary>
        public RebaselineReason Reason { get; }

        /// <summary>When the re-baseline began (trigger, request, or signal return), s.</summary>
        public double RequestedSeconds { get; }

        /// <summary>When the new baseline was ready (last captured gate), s.</summary>
        public double CompletedSeconds { get; }

        /// <summary>New baseline of the counted signal (temperature-compensated), Hz.</summary>
        public double BaselineHz { get; }

        /// <summary>Robust noise of the capture (with floors applied), Hz of the counted signal.</summary>
        public double NoiseHz { get; }

        /// <summary>False for the first baseline (there was nothing before it).</summary>
        public bool HasShift { get; }

        /// <summary>The shift the new baseline absorbed, search oscillator, Hz.</summary>
        public double ShiftHz { get; }

        /// <summary>False when no ppm reference is known (beat mode without search_hz).</summary>
        public bool HasPpm { get; }

        /// <summary>The absorbed shift, ppm of the search oscillator.</summary>
        public double ShiftPpm { get; }

        /// <summary>Gates captured.</summary>
        public int Gates { get; }

        /// <summary>Gates rejected as outliers in the capture.</summary>
        public int Outliers { get; }
    }
}
