namespace FreqReadout.Detection
{
    /// <summary>The detector's part of the readout settings (made once by its owner, read in place every gate; validated by ReadoutSettings).</summary>
    public sealed class DetectorConfiguration
    {
        public DetectorConfiguration(double thresholdSigma, double hysteresisSigma, double minDurationSeconds, double releaseSeconds, double unclearBandSigma, Polarity polarity)
        {
            ThresholdSigma = thresholdSigma;
            HysteresisSigma = hysteresisSigma;
            MinDurationSeconds = minDurationSeconds;
            ReleaseSeconds = releaseSeconds;
            UnclearBandSigma = unclearBandSigma;
            Polarity = polarity;
        }

        /// <summary>Threshold on |shift| / sigma.</summary>
        public double ThresholdSigma { get; }

        /// <summary>Release level = threshold - hysteresis, sigmas.</summary>
        public double HysteresisSigma { get; }

        /// <summary>Gate time at or above release needed to confirm an event, s.</summary>
        public double MinDurationSeconds { get; }

        /// <summary>Gate time below the release level needed to end an event, s (a dip shorter than this does not split an event).</summary>
        public double ReleaseSeconds { get; }

        /// <summary>Peaks below threshold + band are unclear, sigmas.</summary>
        public double UnclearBandSigma { get; }

        /// <summary>Sign-to-class mapping.</summary>
        public Polarity Polarity { get; }
    }
}
