using FreqReadout.Numerics;

namespace FreqReadout.Detection
{
    /// <summary>
    /// Threshold detector with hysteresis and a minimum duration, on the search-oscillator shift in
    /// units of the noise sigma, z = shift / sigma.
    /// <para>
    /// Idle -&gt; candidate when |z| &gt;= threshold; a candidate becomes an event once the gates it covers at
    /// |z| &gt;= release (release = threshold - hysteresis) add up to the minimum duration; a reading with
    /// |z| &lt; release drops a candidate; an event ends once its readings stay below the release level
    /// for the release time (so a noisy dip on a slow edge does not split it). An event's start is its first reading at or
    /// above the threshold, its end its last reading at or above the release level, its peak the
    /// reading with the largest |shift|. While a candidate or event is open, <see cref="TargetPresent"/>
    /// is true and the owner holds the drift tracker.
    /// </para>
    /// <para>
    /// False alarms: for white Gaussian noise a single reading passes k sigmas (either sign) with
    /// probability erfc(k / sqrt 2) (standard normal tail; from memory): k = 5 gives 5.7e-7, so at r readings
    /// per second and a one-gate minimum duration about r x 5.7e-7 false events per second (one per
    /// about 48 h at 10 readings/s); each further gate of minimum duration multiplies by the same order for
    /// independent noise. Drift the tracker fails to follow adds to this.
    /// </para>
    /// Allocation-free; one instance per pipeline.
    /// </summary>
    public sealed class TargetDetector
    {
        private const double TimeEpsilonSeconds = 1e-6;

        private int phase; // 0 idle, 1 candidate, 2 event
        private double startSeconds;
        private double endSeconds;
        private double coveredSeconds;
        private double belowSeconds;
        private double peakSeconds;
        private double peakShiftHz;
        private double peakSigma;
        private double noiseHz;
        private double ppmReferenceHz;
        private bool belowFloor;
        private bool mixedSign;
        private double persistSinceSeconds;
        private bool justStarted;

        /// <summary>Thresholds, hysteresis, minimum duration, unclear band, polarity.</summary>
        public DetectorConfiguration Configuration { get; }

        /// <summary>Creates a detector with the given configuration (validated by its owner).</summary>
        public TargetDetector(DetectorConfiguration configuration)
        {
            Configuration = configuration;
        }

        /// <summary>True while a candidate or an event is open.</summary>
        public bool TargetPresent
        {
            get { return phase != 0; }
        }

        /// <summary>True while a confirmed event is open.</summary>
        public bool EventOpen
        {
            get { return phase == 2; }
        }

        /// <summary>True for the one step in which a candidate opened.</summary>
        public bool JustStarted
        {
            get { return justStarted; }
        }

        /// <summary>Start of the open candidate or event, s.</summary>
        public double StartSeconds
        {
            get { return startSeconds; }
        }

        /// <summary>Since when the open event counts as persisting (its start, or the end of hold mode), s.</summary>
        public double PersistSinceSeconds
        {
            get { return persistSinceSeconds; }
        }

        /// <summary>Some reading of the open candidate or event had the beat note below its floor.</summary>
        public bool BelowFloorSeen
        {
            get { return phase != 0 && belowFloor; }
        }

        /// <summary>Signed peak shift of the open candidate or event, Hz (search oscillator).</summary>
        public double PeakShiftHz
        {
            get { return peakShiftHz; }
        }

        /// <summary>Forgets any open candidate or event (nothing is reported).</summary>
        public void Discard()
        {
            phase = 0;
            justStarted = false;
        }

        /// <summary>Restarts the persistence clock of an open event (at the end of hold mode).</summary>
        public void RestartPersistence(double timeSeconds)
        {
            persistSinceSeconds = timeSeconds;
        }

        /// <summary>
        /// Feeds one reading.
        /// </summary>
        /// <param name="timeSeconds">Reading time (gate end), s.</param>
        /// <param name="spanSeconds">Gate span, s (counts towards the minimum duration).</param>
        /// <param name="shiftHz">Search-oscillator shift from the tracked baseline, Hz.</param>
        /// <param name="sigmaHz">Noise sigma, Hz (&gt; 0).</param>
        /// <param name="ppmReferenceHz">Search frequency for ppm, Hz; 0 when unknown.</param>
        /// <param name="readingBelowBeatFloor">This reading's beat note is below the floor.</param>
        /// <param name="closed">Caller-owned; filled with the event that this reading ended (unchanged when false is returned).</param>
        /// <returns>True when an event ended (released).</returns>
        public bool Step(double timeSeconds, double spanSeconds, double shiftHz, double sigmaHz, double ppmReferenceHz, bool readingBelowBeatFloor, DetectionEvent closed)
        {
            justStarted = false;
            DetectorConfiguration c = Configuration;
            double z = ScalarMath.Abs(shiftHz) / sigmaHz;
            if (phase == 0)
            {
                if (z >= c.ThresholdSigma)
                {
                    phase = 1;
                    justStarted = true;
                    startSeconds = timeSeconds;
                    endSeconds = timeSeconds;
                    coveredSeconds = spanSeconds;
                    belowSeconds = 0;
                    peakSeconds = timeSeconds;
                    peakShiftHz = shiftHz;
                    peakSigma = z;
                    noiseHz = sigmaHz;
                    this.ppmReferenceHz = ppmReferenceHz;
                    belowFloor = readingBelowBeatFloor;
                    mixedSign = false;
                    persistSinceSeconds = timeSeconds;
                    Confirm();
                }

                return false;
            }

            if (z < c.ThresholdSigma - c.HysteresisSigma)
            {
                if (phase == 1)
                {
                    phase = 0;
                    return false;
                }

                belowSeconds += spanSeconds;
                if (belowSeconds + TimeEpsilonSeconds < c.ReleaseSeconds)
                {
                    return false;
                }

                Build(EventEnd.Released, closed);
                phase = 0;
                return true;
            }

            belowSeconds = 0;
            endSeconds = timeSeconds;
            coveredSeconds += spanSeconds;
            if (readingBelowBeatFloor)
            {
                belowFloor = true;
            }

            if (z >= c.ThresholdSigma && ((shiftHz > 0) != (peakShiftHz > 0)))
            {
                mixedSign = true;
            }

            if (ScalarMath.Abs(shiftHz) > ScalarMath.Abs(peakShiftHz))
            {
                peakShiftHz = shiftHz;
                peakSeconds = timeSeconds;
                peakSigma = z;
                if (ppmReferenceHz > 0)
                {
                    this.ppmReferenceHz = ppmReferenceHz;
                }
            }

            Confirm();
            return false;
        }

        /// <summary>
        /// Closes an open event now (no signal, manual re-baseline, end of run) at its last reading at or
        /// above the release level. An unconfirmed candidate is dropped.
        /// </summary>
        /// <param name="end">What ended it.</param>
        /// <param name="closed">Caller-owned; filled with the closed event (unchanged when false is returned).</param>
        /// <returns>True when an event was open.</returns>
        public bool ForceClose(EventEnd end, DetectionEvent closed)
        {
            bool open = phase == 2;
            if (open)
            {
                Build(end, closed);
            }

            phase = 0;
            justStarted = false;
            return open;
        }

        private void Confirm()
        {
            if (phase == 1 && coveredSeconds + TimeEpsilonSeconds >= Configuration.MinDurationSeconds)
            {
                phase = 2;
            }
        }

        private void Build(EventEnd end, DetectionEvent into)
        {
            DetectorConfiguration c = Configuration;
            bool hasPpm = ppmReferenceHz > 0;
            double ppm = hasPpm ? peakShiftHz / ppmReferenceHz * 1e6 : 0.0;
            TargetClass cls = SignRule.Classify(peakShiftHz, peakSigma, c.ThresholdSigma, c.UnclearBandSigma, c.Polarity, belowFloor || mixedSign);
            into.Set(startSeconds, endSeconds, peakSeconds, peakShiftHz, hasPpm, ppm, peakSigma, noiseHz, cls, belowFloor, mixedSign, end);
        }
    }
}
