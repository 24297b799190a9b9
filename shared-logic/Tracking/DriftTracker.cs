using FreqReadout.Numerics;

namespace FreqReadout.Tracking
{
    /// <summary>
    /// Slow-drift tracker: Holt's linear (double exponential) smoothing of level L (Hz) and slope b
    /// (Hz/s) with gains set from time constants, so that it behaves the same at any gate rate.
    /// <para>
    /// Update with a reading x at time t that averages the last w seconds (its gate span),
    /// dt = t - t_L since the last update: forecast F = L + b dt; alpha = 1 - exp(-w / tau_L);
    /// beta = 1 - exp(-w / tau_b); L' = F + alpha (x - F); b' = b + beta ((L' - L) / dt - b); t_L = t.
    /// The gains follow the reading's own span w, not the gap dt: after a held stretch (a target) one
    /// noisy reading must not move the level further than any other reading does; the gap is bridged by
    /// the forecast along the slope.
    /// Prediction at any time: P(t) = L + b (t - t_L) (used while the tracker is held).
    /// </para>
    /// <para>
    /// In the continuous limit (dt &lt;&lt; tau) this is dL/dt = b + (x - L)/tau_L, db/dt = (x - L)/(tau_L tau_b):
    /// a type-2 loop, so a constant drift rate (linear ramp) is followed with zero steady-state lag and a
    /// constant acceleration a (curvature of an exponential settling) with a lag of a tau_L tau_b
    /// (derived from those equations). White reading noise of sigma leaks into the level with about
    /// sigma sqrt(alpha / 2) for small alpha. Defaults (see ReadoutSettings): tau_L = 2 s, tau_b = 10 s.
    /// </para>
    /// <para>
    /// Curvature: an acceleration a (Hz/s^2), set only by <see cref="Reset"/> (the pipeline re-anchors the
    /// tracker on a local quadratic fit when it re-acquires lock), decays with tau_a = 3 tau_b (thermal
    /// settling has time constants of tens of seconds and more, so its curvature fades). It enters the
    /// forecast as the exact double integral of a e^(-s / tau_a): over dt the level gains
    /// a tau_a (dt - tau_a (1 - e^(-dt / tau_a))) and the slope a tau_a (1 - e^(-dt / tau_a)); the Holt
    /// update then corrects level and slope as above. With a = 0 this is plain Holt smoothing.
    /// </para>
    /// The tracker never decides whether a reading is a target: its owner feeds it only target-free readings.
    /// </summary>
    public sealed class DriftTracker
    {
        private double levelHz;
        private double slopeHzPerSecond;
        private double timeSeconds;
        private double accelerationHzPerSecond2;
        private bool initialised;

        /// <summary>Creates a tracker.</summary>
        /// <param name="levelSeconds">Level time constant tau_L, s (&gt; 0).</param>
        /// <param name="slopeSeconds">Slope time constant tau_b, s (&gt; 0).</param>
        public DriftTracker(double levelSeconds, double slopeSeconds)
        {
            if (!(levelSeconds > 0) || !(slopeSeconds > 0))
            {
                throw new System.ArgumentException("tracker time constants must be > 0");
            }

            LevelSeconds = levelSeconds;
            SlopeSeconds = slopeSeconds;
            AccelerationSeconds = 3.0 * slopeSeconds;
        }

        /// <summary>Decay time constant of the acceleration, tau_a = 3 tau_b, s.</summary>
        public double AccelerationSeconds { get; }

        /// <summary>Acceleration at <see cref="TimeSeconds"/>, Hz/s^2 (0 unless set by <see cref="Reset"/>).</summary>
        public double AccelerationHzPerSecond2
        {
            get { return accelerationHzPerSecond2; }
        }

        /// <summary>Level time constant tau_L, s.</summary>
        public double LevelSeconds { get; }

        /// <summary>Slope time constant tau_b, s.</summary>
        public double SlopeSeconds { get; }

        /// <summary>True once <see cref="Reset"/> gave it a starting point.</summary>
        public bool IsInitialised
        {
            get { return initialised; }
        }

        /// <summary>Level at <see cref="TimeSeconds"/>, Hz.</summary>
        public double LevelHz
        {
            get { return levelHz; }
        }

        /// <summary>Tracked drift rate, Hz/s.</summary>
        public double SlopeHzPerSecond
        {
            get { return slopeHzPerSecond; }
        }

        /// <summary>Time of the last update (or of the reset), s.</summary>
        public double TimeSeconds
        {
            get { return timeSeconds; }
        }

        /// <summary>Starts from a known level and slope (a captured baseline), no acceleration.</summary>
        public void Reset(double levelHz, double slopeHzPerSecond, double timeSeconds)
        {
            Reset(levelHz, slopeHzPerSecond, 0.0, timeSeconds);
        }

        /// <summary>Starts from a known level, slope and acceleration (a local quadratic fit).</summary>
        public void Reset(double levelHz, double slopeHzPerSecond, double accelerationHzPerSecond2, double timeSeconds)
        {
            this.levelHz = levelHz;
            this.slopeHzPerSecond = slopeHzPerSecond;
            this.accelerationHzPerSecond2 = ScalarMath.IsFinite(accelerationHzPerSecond2) ? accelerationHzPerSecond2 : 0.0;
            this.timeSeconds = timeSeconds;
            initialised = true;
        }

        /// <summary>Forgets the state.</summary>
        public void Clear()
        {
            levelHz = 0;
            slopeHzPerSecond = 0;
            accelerationHzPerSecond2 = 0;
            timeSeconds = 0;
            initialised = false;
        }

        /// <summary>P(t) = L + b dt + a tau_a (dt - tau_a (1 - e^(-dt / tau_a))), dt = t - t_L, Hz. Returns 0 before <see cref="Reset"/>.</summary>
        public double Predict(double timeSeconds)
        {
            double dt = timeSeconds - this.timeSeconds;
            return levelHz + (slopeHzPerSecond * dt) + AccelerationLevel(dt);
        }

        /// <summary>The forecast slope at a time, b + a tau_a (1 - e^(-dt / tau_a)), Hz/s.</summary>
        public double PredictSlope(double timeSeconds)
        {
            double dt = timeSeconds - this.timeSeconds;
            return slopeHzPerSecond + AccelerationSlope(dt);
        }

        private double AccelerationLevel(double dt)
        {
            if (accelerationHzPerSecond2 == 0 || dt == 0)
            {
                return 0.0;
            }

            double tau = AccelerationSeconds;
            return accelerationHzPerSecond2 * tau * (dt - (tau * (1.0 - ScalarMath.Exp(-dt / tau))));
        }

        private double AccelerationSlope(double dt)
        {
            if (accelerationHzPerSecond2 == 0 || dt == 0)
            {
                return 0.0;
            }

            double tau = AccelerationSeconds;
            return accelerationHzPerSecond2 * tau * (1.0 - ScalarMath.Exp(-dt / tau));
        }

        /// <summary>
        /// One Holt update with reading x (Hz) at time t averaging the last w = spanSeconds (formulas in
        /// the class summary). A reading not later than the last update (dt &lt;= 0), with w &lt;= 0, or not
        /// finite changes nothing.
        /// </summary>
        public void Update(double timeSeconds, double valueHz, double spanSeconds)
        {
            double dt = timeSeconds - this.timeSeconds;
            if (!initialised || !(dt > 0) || !(spanSeconds > 0) || !ScalarMath.IsFinite(valueHz))
            {
                return;
            }

            double w = ScalarMath.Min(spanSeconds, dt);
            double alpha = 1.0 - ScalarMath.Exp(-w / LevelSeconds);
            double beta = 1.0 - ScalarMath.Exp(-w / SlopeSeconds);
            double curve = AccelerationLevel(dt);
            double forecast = levelHz + (slopeHzPerSecond * dt) + curve;
            double newLevel = forecast + (alpha * (valueHz - forecast));
            double slopeForecast = slopeHzPerSecond + AccelerationSlope(dt);
            slopeHzPerSecond = slopeForecast + (beta * (((newLevel - levelHz - curve) / dt) - slopeHzPerSecond));
            if (accelerationHzPerSecond2 != 0)
            {
                accelerationHzPerSecond2 *= ScalarMath.Exp(-dt / AccelerationSeconds);
            }

            levelHz = newLevel;
            this.timeSeconds = timeSeconds;
        }
    }
}
