using FreqReadout.Numerics;

namespace FreqReadout.Tracking
{
    /// <summary>
    /// Slow-drift tracker: a Kalman filter on level L (Hz), rate b (Hz/s) and acceleration a (Hz/s^2)
    /// driven by white jerk, whose jerk density adapts to how well it forecast the target-free readings.
    /// <para>
    /// Model: x(t) = L + b dt + a dt^2 / 2 between updates; the jerk is white with density q (Hz^2/s^5), so
    /// over dt the state moves by F = [[1, dt, dt^2/2], [0, 1, dt], [0, 0, 1]] and its covariance gains
    /// Q = q [[dt^5/20, dt^4/8, dt^3/6], [dt^4/8, dt^3/3, dt^2/2], [dt^3/6, dt^2/2, dt]]
    /// (the standard discretisation of a white-jerk model: Bar-Shalom, Li and Kirubarajan, Estimation
    /// with Applications to Tracking and Navigation, 2001, section 6.2.3). A reading y with noise
    /// variance R updates it: innovation v = y - L, S = P_00 + R, K = P e_0 / S, state += K v,
    /// P -= K K^T S (the textbook Kalman update, same source, section 5.2).
    /// </para>
    /// <para>
    /// Forecast of a reading at time t: P(t) = L + b dt + a dt^2 / 2 with variance
    /// V(t) = g P g^T + q dt^5 / 20, g = [1, dt, dt^2/2], dt = t - t_L (what a held target gap costs).
    /// </para>
    /// <para>
    /// Adaptation (<see cref="Learn"/>): the owner reports, for each target-free reading it feeds, the
    /// normalised squared error of the forecast it made for that reading when the reading arrived,
    /// e = (y - P)^2 / (V + R), clipped to <see cref="MaxNormalisedError"/>. A running mean m over about
    /// <see cref="LearnReadings"/> readings (m = 1 when the model fits) steers q: q *= clamp(1 + gamma (m - 1),
    /// 0.95, 1.05) per reading, gamma = <see cref="LearnGain"/>, within the memory bounds: the filter's memory is about
    /// tau = (R w / q)^(1/6) (w the gate span; the bandwidth of a white-jerk tracker scales as the sixth
    /// root of the ratio of process to measurement noise density), kept in [<see cref="MinMemorySeconds"/>,
    /// <see cref="MaxMemorySeconds"/>]. Fast thermal settling (forecasts lag: m &gt;&gt; 1) shortens the
    /// memory within a few seconds (q up tenfold in 47 readings); quiet drift lengthens it at a like pace, which lowers
    /// the forecast noise. The rise is bounded that tightly on purpose: a coil pass too weak to open a candidate
    /// lasts 0.2-3 s, and a faster rise let one such pass teach the tracker to follow noise for the rest of the run
    /// (measured on the tuning seeds of <c>bench quality</c>); a change of drift rate that the tracker cannot follow
    /// that fast is caught by the two-sided check instead.
    /// </para>
    /// The tracker never decides whether a reading is a target: its owner feeds it only target-free readings.
    /// All work is O(1) per call, nothing allocates, and no struct is made.
    /// </summary>
    public sealed class DriftTracker
    {
        /// <summary>Shortest time constant of thermal settling assumed: the acceleration is kept within (|b| + 3 sigma_b) / tau_min, s.</summary>
        public const double MinSettlingSeconds = 30.0;

        /// <summary>Shortest memory the adaptation allows, s.</summary>
        public const double MinMemorySeconds = 0.4;

        /// <summary>Longest memory the adaptation allows, s.</summary>
        public const double MaxMemorySeconds = 120.0;

        /// <summary>Readings averaged by the running mean of normalised forecast errors.</summary>
        public const double LearnReadings = 30.0;

        /// <summary>Gain gamma of the per-reading step of q: q *= clamp(1 + gamma (m - 1), <see cref="MinStep"/>, <see cref="MaxStep"/>).</summary>
        public const double LearnGain = 0.1;

        /// <summary>Least factor of one step of q.</summary>
        public const double MinStep = 0.95;

        /// <summary>Largest factor of one step of q (why so small: class summary).</summary>
        public const double MaxStep = 1.05;

        /// <summary>Largest normalised squared error one reading may contribute.</summary>
        public const double MaxNormalisedError = 9.0;

        private double levelHz;
        private double slopeHzPerSecond;
        private double accelerationHzPerSecond2;
        private double timeSeconds;
        private double p00;
        private double p01;
        private double p02;
        private double p11;
        private double p12;
        private double p22;
        private double jerkDensity;
        private double meanError;
        private bool initialised;

        /// <summary>Creates a tracker.</summary>
        /// <param name="memorySeconds">Memory to start from after a reset, s (within the bounds).</param>
        public DriftTracker(double memorySeconds)
        {
            if (!(memorySeconds > 0))
            {
                throw new System.ArgumentException("tracker memory must be > 0");
            }

            StartMemorySeconds = ScalarMath.Clamp(memorySeconds, MinMemorySeconds, MaxMemorySeconds);
        }

        /// <summary>Memory the tracker starts from after a reset, s.</summary>
        public double StartMemorySeconds { get; }

        /// <summary>The jerk density q now, Hz^2/s^5.</summary>
        public double JerkDensity
        {
            get { return jerkDensity; }
        }

        /// <summary>Running mean of the normalised squared forecast errors (1 when the model fits).</summary>
        public double MeanNormalisedError
        {
            get { return meanError; }
        }

        /// <summary>Level at <see cref="TimeSeconds"/>, Hz.</summary>
        public double LevelHz
        {
            get { return levelHz; }
        }

        /// <summary>Tracked drift rate at <see cref="TimeSeconds"/>, Hz/s.</summary>
        public double SlopeHzPerSecond
        {
            get { return slopeHzPerSecond; }
        }

        /// <summary>Tracked acceleration, Hz/s^2.</summary>
        public double AccelerationHzPerSecond2
        {
            get { return accelerationHzPerSecond2; }
        }

        /// <summary>Time of the last update (or of the reset), s.</summary>
        public double TimeSeconds
        {
            get { return timeSeconds; }
        }

        /// <summary>
        /// Starts from a known state and its uncertainty (standard deviations; a captured baseline or a local fit).
        /// The jerk density is set from the start memory for the given measurement noise and gate span.
        /// </summary>
        public void Reset(double levelHz, double slopeHzPerSecond, double accelerationHzPerSecond2, double timeSeconds, double levelSigmaHz, double slopeSigmaHzPerSecond, double accelerationSigmaHzPerSecond2, double noiseHz, double spanSeconds)
        {
            this.levelHz = levelHz;
            this.slopeHzPerSecond = ScalarMath.IsFinite(slopeHzPerSecond) ? slopeHzPerSecond : 0.0;
            this.accelerationHzPerSecond2 = ScalarMath.IsFinite(accelerationHzPerSecond2) ? accelerationHzPerSecond2 : 0.0;
            this.timeSeconds = timeSeconds;
            p00 = levelSigmaHz * levelSigmaHz;
            p11 = slopeSigmaHzPerSecond * slopeSigmaHzPerSecond;
            p22 = accelerationSigmaHzPerSecond2 * accelerationSigmaHzPerSecond2;
            p01 = 0;
            p02 = 0;
            p12 = 0;
            jerkDensity = DensityForMemory(StartMemorySeconds, noiseHz, spanSeconds);
            meanError = 1.0;
            initialised = true;
        }

        /// <summary>Makes this tracker a copy of another's state (a snapshot to return to; nothing allocates).</summary>
        public void CopyFrom(DriftTracker other)
        {
            levelHz = other.levelHz;
            slopeHzPerSecond = other.slopeHzPerSecond;
            accelerationHzPerSecond2 = other.accelerationHzPerSecond2;
            timeSeconds = other.timeSeconds;
            p00 = other.p00;
            p01 = other.p01;
            p02 = other.p02;
            p11 = other.p11;
            p12 = other.p12;
            p22 = other.p22;
            jerkDensity = other.jerkDensity;
            meanError = other.meanError;
            initialised = other.initialised;
        }

        /// <summary>P(t) = L + b dt + a dt^2 / 2, dt = t - t_L, Hz. Returns 0 before <see cref="Reset"/>.</summary>
        public double Predict(double timeSeconds)
        {
            double dt = timeSeconds - this.timeSeconds;
            return levelHz + (slopeHzPerSecond * dt) + (0.5 * accelerationHzPerSecond2 * dt * dt);
        }

        /// <summary>The forecast rate at a time, b + a dt, Hz/s.</summary>
        public double PredictSlope(double timeSeconds)
        {
            double dt = timeSeconds - this.timeSeconds;
            return slopeHzPerSecond + (accelerationHzPerSecond2 * dt);
        }

        /// <summary>Variance of the forecast level at a time, V(t) = g P g^T + q dt^5 / 20 (class summary), Hz^2; 0 before <see cref="Reset"/>.</summary>
        public double PredictVariance(double timeSeconds)
        {
            double dt = timeSeconds - this.timeSeconds;
            if (!(dt > 0))
            {
                return p00;
            }

            double dt2 = dt * dt;
            double v = p00 + (2.0 * dt * p01) + (dt2 * (p02 + p11)) + (dt2 * dt * p12) + (0.25 * dt2 * dt2 * p22);
            return v + (jerkDensity * dt2 * dt2 * dt / 20.0);
        }

        /// <summary>
        /// One Kalman update with reading y (Hz) at time t whose noise variance is noiseHz^2 (formulas in the class
        /// summary). A reading not later than the last update, or not finite, or with noise &lt;= 0 changes nothing.
        /// </summary>
        public void Update(double timeSeconds, double valueHz, double noiseHz)
        {
            double dt = timeSeconds - this.timeSeconds;
            if (!initialised || !(dt > 0) || !(noiseHz > 0) || !ScalarMath.IsFinite(valueHz))
            {
                return;
            }

            // Propagate: x = F x; P = F P F^T + Q (its first element is the forecast variance).
            double dt2 = dt * dt;
            double half = 0.5 * dt2;
            double n00 = PredictVariance(timeSeconds);
            levelHz += (slopeHzPerSecond * dt) + (accelerationHzPerSecond2 * half);
            slopeHzPerSecond += accelerationHzPerSecond2 * dt;

            double n01 = p01 + (dt * (p02 + p11)) + (1.5 * dt2 * p12) + (0.5 * dt2 * dt * p22);
            double n02 = p02 + (dt * p12) + (half * p22);
            double n11 = p11 + (2.0 * dt * p12) + (dt2 * p22);
            double n12 = p12 + (dt * p22);
            double n22 = p22;
            double q = jerkDensity;
            n01 += q * dt2 * dt2 / 8.0;
            n02 += q * dt2 * dt / 6.0;
            n11 += q * dt2 * dt / 3.0;
            n12 += q * half;
            n22 += q * dt;

            // Update with the reading.
            double s = n00 + (noiseHz * noiseHz);
            double k0 = n00 / s;
            double k1 = n01 / s;
            double k2 = n02 / s;
            double v = valueHz - levelHz;
            levelHz += k0 * v;
            slopeHzPerSecond += k1 * v;
            accelerationHzPerSecond2 += k2 * v;
            p00 = n00 - (k0 * n00);
            p01 = n01 - (k0 * n01);
            p02 = n02 - (k0 * n02);
            p11 = n11 - (k1 * n01);
            p12 = n12 - (k1 * n02);
            p22 = n22 - (k2 * n02);
            LimitAcceleration();
            this.timeSeconds = timeSeconds;
        }

        /// <summary>
        /// Adapts the jerk density from one target-free reading's forecast (class summary): errorHz = y - P made when
        /// the reading arrived, varianceHz2 = V + R of that forecast. Non-finite or non-positive input changes nothing.
        /// </summary>
        public void Learn(double errorHz, double varianceHz2, double noiseHz, double spanSeconds)
        {
            if (!initialised || !(varianceHz2 > 0) || !ScalarMath.IsFinite(errorHz) || !(noiseHz > 0) || !(spanSeconds > 0))
            {
                return;
            }

            double e = ScalarMath.Min((errorHz * errorHz) / varianceHz2, MaxNormalisedError);
            meanError += (e - meanError) / LearnReadings;
            double step = ScalarMath.Clamp(1.0 + (LearnGain * (meanError - 1.0)), MinStep, MaxStep);
            double q = jerkDensity * step;
            double low = DensityForMemory(MaxMemorySeconds, noiseHz, spanSeconds);
            double high = DensityForMemory(MinMemorySeconds, noiseHz, spanSeconds);
            jerkDensity = ScalarMath.Clamp(q, low, high);
        }

        // Thermal drift bends no faster than a settling of the shortest time constant: |a| <= (|b| + 3 sigma_b) / tau_min.
        private void LimitAcceleration()
        {
            double limit = (ScalarMath.Abs(slopeHzPerSecond) + (3.0 * ScalarMath.Sqrt(p11 > 0 ? p11 : 0.0))) / MinSettlingSeconds;
            accelerationHzPerSecond2 = ScalarMath.Clamp(accelerationHzPerSecond2, -limit, limit);
        }

        // q = R w / tau^6.
        private static double DensityForMemory(double memorySeconds, double noiseHz, double spanSeconds)
        {
            double m2 = memorySeconds * memorySeconds;
            double w = spanSeconds > 0 ? spanSeconds : 0.1;
            return noiseHz * noiseHz * w / (m2 * m2 * m2);
        }
    }
}
