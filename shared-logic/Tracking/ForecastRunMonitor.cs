using FreqReadout.Numerics;

namespace FreqReadout.Tracking
{
    /// <summary>
    /// Watches the drift tracker's forecast errors on target-free readings for a run that leans to one side: the mean of
    /// the last <see cref="Readings"/> consecutive errors against the scatter such a mean has in quiet times. A wide,
    /// weak coil pass (a second or more, a few sigma a reading, below the threshold at first) shows here long before a
    /// single reading stands out, and the tracker is not fed it (<c>ReadoutPipeline</c>), so it is not learnt as drift.
    /// <para>
    /// Mean: m = (1/K) sum of the last K consecutive errors e = y - forecast (K = <see cref="Readings"/>; a gap of more
    /// than 1.5 spans, or <see cref="ClearRun"/>, starts a new run; no mean before K are held: <see cref="Ready"/>).
    /// </para>
    /// <para>
    /// Its scatter (<see cref="NoiseHz"/>): 1.4826 times the median of |m| over the last window of such means (every
    /// reading that completes a run of K adds its mean). A robust scale, like the readout's other noise figures, and one
    /// that sees whatever correlation the errors have (flicker, a tracker that lags), which sigma / sqrt(K) would not.
    /// Empty: 0, with <see cref="Samples"/> = 0.
    /// </para>
    /// <see cref="Leans"/>: |m| &gt; k NoiseHz, once at least a given number of means are held.
    /// O(log window) per <see cref="Add"/>; nothing allocates after the constructor; no struct is made.
    /// </summary>
    public sealed class ForecastRunMonitor
    {
        /// <summary>Consecutive errors averaged (K).</summary>
        public const int Readings = 5;

        private readonly double[] errors;
        private readonly MedianWindow window;
        private int count;
        private int head;
        private double sum;
        private double lastSeconds;
        private double noiseHz;

        /// <summary>Creates a monitor whose scatter is taken over the last <paramref name="windowMeans"/> means.</summary>
        /// <param name="windowMeans">Means kept for the scatter (&gt;= 1).</param>
        public ForecastRunMonitor(int windowMeans)
        {
            errors = new double[Readings];
            window = new MedianWindow(windowMeans);
        }

        /// <summary>True once K consecutive errors are held.</summary>
        public bool Ready
        {
            get { return count == Readings; }
        }

        /// <summary>Mean of the last K consecutive errors, Hz (0 until <see cref="Ready"/>).</summary>
        public double MeanHz
        {
            get { return count == Readings ? sum / Readings : 0.0; }
        }

        /// <summary>Robust scatter of the mean in the window, Hz (class summary; 0 when empty).</summary>
        public double NoiseHz
        {
            get { return noiseHz; }
        }

        /// <summary>Means the scatter is taken over.</summary>
        public int Samples
        {
            get { return window.Count; }
        }

        /// <summary>Forgets the current run (the tracker that made the forecasts was re-anchored); the scatter stays.</summary>
        public void ClearRun()
        {
            count = 0;
            head = 0;
            sum = 0;
        }

        /// <summary>Forgets the run and the scatter (a new baseline).</summary>
        public void Clear()
        {
            ClearRun();
            window.Clear();
            noiseHz = 0;
        }

        /// <summary>
        /// Adds a target-free reading's forecast error (y - forecast, Hz) at a time; a gap of more than 1.5 spans since the
        /// previous one starts a new run. A non-finite error is ignored.
        /// </summary>
        public void Add(double timeSeconds, double spanSeconds, double errorHz)
        {
            if (!ScalarMath.IsFinite(errorHz))
            {
                return;
            }

            if (count > 0 && !(timeSeconds - lastSeconds <= 1.5 * spanSeconds))
            {
                ClearRun();
            }

            lastSeconds = timeSeconds;
            if (count == Readings)
            {
                sum -= errors[head];
            }
            else
            {
                count++;
            }

            errors[head] = errorHz;
            sum += errorHz;
            head = (head + 1) % Readings;
            if (count < Readings)
            {
                return;
            }

            if (head == 0)
            {
                // Re-sum once a lap, so rounding cannot build up over a long run.
                sum = 0;
                for (int i = 0; i < Readings; i++)
                {
                    sum += errors[i];
                }
            }

            window.Add(ScalarMath.Abs(sum / Readings));
            noiseHz = RobustStatistics.MadToSigma * window.Median();
        }

        /// <summary>True when the current mean lies more than <paramref name="sigmas"/> scatters from zero and the scatter is taken over at least <paramref name="minSamples"/> means.</summary>
        public bool Leans(double sigmas, int minSamples)
        {
            return Ready && window.Count >= minSamples && window.Count > 0 && ScalarMath.Abs(MeanHz) > sigmas * noiseHz;
        }
    }
}
