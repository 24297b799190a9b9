namespace FreqReadout.Tracking
{
    /// <summary>
    /// A completed baseline capture. Shifts are of the search oscillator (beat side applied):
    /// new baseline minus the previous tracked baseline extrapolated to <see cref="CompletedSeconds"/>.
    /// </summary>
    public sealed class RebaselineNotice
    {
        /// <summary>An empty notice (every field 0) for the core to fill.</summary>
        public RebaselineNotice()
        {
        }

        /// <summary>Fills every field; each argument is stored in the property of the same name.</summary>
        public void Set(
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
            int outliers,
            bool disturbed,
            int recaptures,
            bool overMetalHint)
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
            Disturbed = disturbed;
            Recaptures = recaptures;
            OverMetalHint = overMetalHint;
        }

        /// <summary>Why.</summary>
        public RebaselineReason Reason { get; private set; }

        /// <summary>When the re-baseline began (trigger, request, or signal return), s.</summary>
        public double RequestedSeconds { get; private set; }

        /// <summary>When the new baseline was ready (last captured gate), s.</summary>
        public double CompletedSeconds { get; private set; }

        /// <summary>New baseline of the counted signal (temperature-compensated), Hz.</summary>
        public double BaselineHz { get; private set; }

        /// <summary>Robust noise of the capture (with floors applied), Hz of the counted signal.</summary>
        public double NoiseHz { get; private set; }

        /// <summary>False for the first baseline (there was nothing before it).</summary>
        public bool HasShift { get; private set; }

        /// <summary>The shift the new baseline absorbed, search oscillator, Hz.</summary>
        public double ShiftHz { get; private set; }

        /// <summary>False when no ppm reference is known (beat mode without search_hz).</summary>
        public bool HasPpm { get; private set; }

        /// <summary>The absorbed shift, ppm of the search oscillator.</summary>
        public double ShiftPpm { get; private set; }

        /// <summary>Gates captured.</summary>
        public int Gates { get; private set; }

        /// <summary>Gates rejected as outliers in the capture.</summary>
        public int Outliers { get; private set; }

        /// <summary>
        /// The capture that gave this baseline was disturbed (a step or a run of outliers inside it: metal
        /// moved, or the coil did) and was kept as the best of several attempts.
        /// </summary>
        public bool Disturbed { get; private set; }

        /// <summary>Disturbed captures discarded (and captured again) before this baseline.</summary>
        public int Recaptures { get; private set; }

        /// <summary>
        /// This automatic re-baseline absorbed a lasting shift opposite in sign to a disturbance seen in an
        /// earlier capture: a hint that that baseline was taken with metal near the coil.
        /// </summary>
        public bool OverMetalHint { get; private set; }

        /// <summary>Copies every field of <paramref name="other"/> into this object.</summary>
        public void CopyFrom(RebaselineNotice other)
        {
            Set(
                other.Reason,
                other.RequestedSeconds,
                other.CompletedSeconds,
                other.BaselineHz,
                other.NoiseHz,
                other.HasShift,
                other.ShiftHz,
                other.HasPpm,
                other.ShiftPpm,
                other.Gates,
                other.Outliers,
                other.Disturbed,
                other.Recaptures,
                other.OverMetalHint);
        }
    }
}
