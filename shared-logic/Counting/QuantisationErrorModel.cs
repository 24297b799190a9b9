using FreqReadout.Numerics;

namespace FreqReadout.Counting
{
    /// <summary>
    /// Error model of a quantised, periodic sampling: the timer tick of an edge (or the whole count of a
    /// pulse-counter read) is floor(tau + n) of a true value tau that advances by a step p per index
    /// (ticks per period, counts per read), n being Gaussian dither of rms J quanta (the configured
    /// jitter). Units are quanta (ticks or counts) and indices; one object is reused (no allocation).
    /// <para>
    /// Without dither the quantisation errors are not white: e_i = floor(tau_i) - tau_i is a sawtooth of
    /// the phase tau_0 + i p, fixed by the ratio p. Its Fourier series, 1/2 - frac(x) =
    /// sum_m sin(2 pi m x) / (pi m), split by Gaussian dither (the expectation over n attenuates harmonic
    /// m by exp(-2 pi^2 m^2 J^2)) gives, per index, a deterministic part
    /// d(tau) = sum_m A_m sin(2 pi m tau), A_m = exp(-2 pi^2 m^2 J^2) / (pi m), and an independent (white)
    /// rest of variance sigma_w^2 = J^2 + 1/12 - sum_m A_m^2 / 2 = J^2 + 1/12 - S(4 pi^2 J^2) / (2 pi^2),
    /// S(a) = sum_m exp(-a m^2) / m^2 (= pi^2/6 - sqrt(pi a) + a/2 up to terms below exp(-pi^2 / a), by
    /// Poisson summation, used below J = 0.1; a direct sum above). J = 0: sigma_w^2 = 0, all of the
    /// error is deterministic; J = 1: the deterministic part is below 1e-8 of it.
    /// </para>
    /// <para>
    /// A linear estimate sum_i c_i e_i (c_i the estimator's weights) sees harmonic m at the frequency
    /// nu_m = || m p || (distance to the nearest integer) through its gain |C(nu)|,
    /// C(nu) = sum_i c_i exp(2 pi i nu i). Reciprocal (c = +-1/span at the two ends): the span error is
    /// d(tau_end) - d(tau_0) plus white; with the start phase moving from gate to gate its worst case
    /// over the span's fractional part is 2 sigma_w^2 + 2 sum_(m odd) A_m^2 (= 1/4 tick^2 at J = 0, the
    /// largest alpha (1 - alpha) of a quantised difference; 1/6 for white quantisation); with the phase
    /// held at a tick boundary by a span of whole ticks, a little jitter decides both quantisations at
    /// random, up to 2 max_tau Var(floor(tau + n)) &lt;= 2 (J^2 + 1/12 + exp(-6 J^2) / 6) (the bound is
    /// checked against the exact maximum in the tests); the span variance is the larger of the two. Regression (least-squares slope over N
    /// equally spaced indices, c_i = (i - mean) / Sxx, Sxx = sum (i - mean)^2):
    /// Var = sigma_w^2 / Sxx + sum_(m &lt;= K) A_m^2 E(nu_m)^2 + (sum_(m &gt; K) A_m^2) / Sxx, where E bounds the
    /// gain: E(nu) = min(2 pi nu, ((N/2) / sin(pi nu) + 1 / (2 sin^2(pi nu))) / Sxx) (the first from
    /// |sin x| &lt;= |x|, the second from |d/dtheta of the Dirichlet kernel sin(N theta/2) / sin(theta/2)|),
    /// evaluated at its largest value within 1.5 / N (plus m x 3 sigma of the white part of the slope) of
    /// nu_m, since nu_m comes from the gate's own estimate of p: near a fraction a/q the sawtooth seen
    /// over q indices at a time has a quantum of 1/q, so the estimate of p is off by up to
    /// (1/2) (1/q) sum |c_i| = 1.5 / (q N), which moves nu_q by up to 1.5 / N (near a whole tick a gate
    /// may see no quantisation step at all and read p as exactly whole). Harmonics beyond
    /// K = ceil(sqrt(N)) + 4 are counted as white. The deterministic part is taken
    /// at its peak over the start phase (A_m^2 E^2, not its phase average A_m^2 E^2 / 2): consecutive gates
    /// can keep one phase when the gate spans a whole number of steps, and then every gate repeats that
    /// phase's error. It is capped by the rigorous bound sup|d| x sum |c_i| = sup|d| x floor(N^2/4) / Sxx
    /// (sup|d| = 1/2 at J = 0). So the figure is a conservative 1-sigma: at ratios p where the sawtooth
    /// lines up over the gate (p near a fraction a/q with small q) it follows the real, larger scatter;
    /// at other ratios it is up to about twice the real rms.
    /// </para>
    /// <para>
    /// Cost: O(1) for the reciprocal; for the regression up to K harmonics per gate (one sine each), far
    /// fewer with dither (harmonics below 1e-12 of the first are dropped: 8 at J = 0.1, 3 at J = 0.3).
    /// </para>
    /// </summary>
    public sealed class QuantisationErrorModel
    {
        /// <summary>Most harmonics summed explicitly for one regression gate.</summary>
        public const int MaxHarmonics = 2048;

        /// <summary>How far (x 1/N cycles per index) a harmonic's frequency may lie from the gate's own estimate (1.5).</summary>
        public const double ReachIndices = 1.5;

        private const double PoissonBelowDither = 0.1;
        private const double PiSquared = ScalarMath.Pi * ScalarMath.Pi;

        private double _dither;
        private double _white;
        private double _quantWhite;
        private double _harmonicPowerTotal;
        private double _reciprocalSpan;
        private double _peak;
        private double _firstDecay;
        private double _decayStep;

        /// <summary>A model for Gaussian dither of <paramref name="ditherRms"/> quanta rms (see <see cref="Configure"/>).</summary>
        /// <param name="ditherRms">Dither (jitter) before the quantiser, rms quanta, &gt;= 0.</param>
        public QuantisationErrorModel(double ditherRms)
        {
            Configure(ditherRms);
        }

        /// <summary>The dither the model was last configured with, rms quanta.</summary>
        public double DitherRms
        {
            get { return _dither; }
        }

        /// <summary>sigma_w^2: the white variance per index, quanta^2 (J^2 + 1/12 - sum A_m^2 / 2; 0 at J = 0).</summary>
        public double WhiteVariance
        {
            get { return _white; }
        }

        /// <summary>
        /// The white part of the quantisation alone, quanta^2: 1/12 - sum A_m^2 / 2 (WhiteVariance less
        /// J^2). For a pulse counter whose dither is the real irregularity of its latch times, which is
        /// no error of the count, this is the white count error.
        /// </summary>
        public double QuantisationWhiteVariance
        {
            get { return _quantWhite; }
        }

        /// <summary>
        /// Worst-case variance of a span (difference of two samples), quanta^2: the larger of
        /// 2 sigma_w^2 + 2 sum_(m odd) A_m^2 (phases that move from gate to gate; 1/4 at J = 0) and
        /// 2 (J^2 + 1/12 + exp(-6 J^2) / 6) (both ends held at the worst phase, a tick boundary, where the
        /// dither decides each quantisation alone; 1/2 for small J; 2 J^2 + 1/6 for large J).
        /// </summary>
        public double ReciprocalSpanVariance
        {
            get { return _reciprocalSpan; }
        }

        /// <summary>sup |d|: the largest deterministic error of one sample, quanta (1/2 at J = 0).</summary>
        public double PeakDeterministic
        {
            get { return _peak; }
        }

        /// <summary>
        /// Sets the dither and recomputes the per-dither constants (O(1): at most 64 terms each).
        /// Negative or NaN dither counts as 0.
        /// </summary>
        /// <param name="ditherRms">Gaussian dither before the quantiser, rms quanta.</param>
        public void Configure(double ditherRms)
        {
            if (!(ditherRms > 0))
            {
                ditherRms = 0;
            }

            _dither = ditherRms;
            double a = 4.0 * PiSquared * ditherRms * ditherRms;
            double s1 = HarmonicSum(ditherRms);
            double s4 = HarmonicSum(2.0 * ditherRms);
            _harmonicPowerTotal = s1 / PiSquared;
            double quantWhite = (1.0 / 12.0) - (s1 / (2.0 * PiSquared));
            _quantWhite = quantWhite > 0 ? quantWhite : 0;
            _white = (ditherRms * ditherRms) + _quantWhite;
            double odd = (s1 - (0.25 * s4)) / PiSquared;
            double moving = (2.0 * _white) + (2.0 * (odd > 0 ? odd : 0));
            double stuck = 2.0 * ((ditherRms * ditherRms) + (1.0 / 12.0) + (ScalarMath.Exp(-6.0 * ditherRms * ditherRms) / 6.0));
            _reciprocalSpan = moving > stuck ? moving : stuck;
            _peak = 0.5;
            if (ditherRms >= PoissonBelowDither)
            {
                double sumA = 0;
                for (int m = 1; m <= 64; m++)
                {
                    double term = ScalarMath.Exp(-0.5 * a * m * m) / (ScalarMath.Pi * m);
                    sumA += term;
                    if (term < 1e-18)
                    {
                        break;
                    }
                }

                _peak = sumA < 0.5 ? sumA : 0.5;
            }

            _firstDecay = ScalarMath.Exp(-a);
            _decayStep = ScalarMath.Exp(-2.0 * a);
        }

        /// <summary>
        /// S = sum_(m &gt;= 1) exp(-4 pi^2 m^2 J^2) / m^2: below J = 0.1 by pi^2/6 - 2 pi^1.5 J + 2 pi^2 J^2
        /// (Poisson summation; the neglected terms are below exp(-1 / (4 J^2)), under 1e-10 there), else
        /// summed directly until a term is below 1e-18 (at most 64 terms). pi^2/6 at J = 0.
        /// </summary>
        /// <param name="ditherRms">J, rms quanta (&gt;= 0).</param>
        /// <returns>The sum.</returns>
        public static double HarmonicSum(double ditherRms)
        {
            if (!(ditherRms > 0))
            {
                return PiSquared / 6.0;
            }

            if (ditherRms < PoissonBelowDither)
            {
                double piPow15 = ScalarMath.Pi * ScalarMath.Sqrt(ScalarMath.Pi);
                return (PiSquared / 6.0) - (2.0 * piPow15 * ditherRms) + (2.0 * PiSquared * ditherRms * ditherRms);
            }

            double a = 4.0 * PiSquared * ditherRms * ditherRms;
            double sum = 0;
            for (int m = 1; m <= 64; m++)
            {
                double term = ScalarMath.Exp(-a * m * m) / ((double)m * m);
                sum += term;
                if (term < 1e-18)
                {
                    break;
                }
            }

            return sum;
        }

        /// <summary>
        /// The deterministic part of the variance of a least-squares slope over N indices, quanta^2 per
        /// index^2: sum_(m &lt;= K) A_m^2 E(nu_m)^2 + (sum_(m &gt; K) A_m^2) / Sxx, capped at
        /// (sup|d| floor(N^2/4) / Sxx)^2 (see the class notes). Add <see cref="WhiteVariance"/> / Sxx for the total.
        /// </summary>
        /// <param name="stepFraction">Fractional part of the step p per index, quanta, in [0, 1).</param>
        /// <param name="indices">N: the indices the gate spans (first to last, both included; &gt;= 2).</param>
        /// <param name="sxx">sum (i - mean i)^2 over the indices used (&gt; 0).</param>
        /// <returns>The deterministic variance; 0 for fewer than 2 indices or sxx not positive.</returns>
        public double RegressionDeterministicVariance(double stepFraction, long indices, double sxx)
        {
            if (indices < 2 || !(sxx > 0))
            {
                return 0;
            }

            double n = indices;
            long limit = (long)ScalarMath.Sqrt(n) + 5;
            if (limit > MaxHarmonics)
            {
                limit = MaxHarmonics;
            }

            if (!(stepFraction >= 0 && stepFraction < 1))
            {
                stepFraction = 0;
            }

            if (_firstDecay < 1e-12)
            {
                // Dither above 0.84 quanta (exp(-4 pi^2 J^2) below 1e-12): the deterministic part is negligible.
                return _harmonicPowerTotal / sxx;
            }

            // nu_m comes from the gate's own estimate of p; take the largest gain within reach of it:
            // 1.5 / N (see the class notes) plus m times 3 sigma of the white part.
            double bound = _peak * ScalarMath.Floor(0.25 * n * n) / sxx;
            double slack = ReachIndices / n;
            double whiteStep = 3.0 * ScalarMath.Sqrt(_white / sxx);
            double peakNu = PeakGainFrequency(n, sxx);
            double det = 0;
            double used = 0;
            double decay = _firstDecay;
            double ratio = _firstDecay * _decayStep;
            double phase = 0;
            for (long m = 1; m <= limit; m++)
            {
                phase += stepFraction;
                if (phase >= 1)
                {
                    phase -= 1;
                }

                double nu = phase < 0.5 ? phase : 1.0 - phase;
                double lo = nu - slack - (m * whiteStep);
                double hi = nu + slack + (m * whiteStep);
                double at = peakNu < lo ? lo : (peakNu > hi ? hi : peakNu);
                if (at > 0.5)
                {
                    at = 0.5;
                }

                double power = decay / (PiSquared * m * m);
                double gain = Gain(at, n, sxx);
                det += power * gain * gain;
                used += power;
                if (decay < 1e-12)
                {
                    break;
                }

                decay *= ratio;
                ratio *= _decayStep;
            }

            double tail = _harmonicPowerTotal - used;
            if (tail > 0)
            {
                det += tail / sxx;
            }

            double cap = bound * bound;
            return det < cap ? det : cap;
        }

        /// <summary>
        /// The frequency where the gain bound <see cref="Gain"/> peaks (its rising and falling branches
        /// cross; about 0.67 / N), by 60 bisection steps on [0, 1/2].
        /// </summary>
        /// <param name="n">N, indices spanned.</param>
        /// <param name="sxx">sum (i - mean i)^2.</param>
        /// <returns>The peak frequency, cycles per index.</returns>
        public static double PeakGainFrequency(double n, double sxx)
        {
            double lo = 0;
            double hi = 0.5;
            for (int k = 0; k < 40; k++)
            {
                double mid = 0.5 * (lo + hi);
                double s = ScalarMath.SinPi(mid);
                double falling = ((0.5 * n / s) + (0.5 / (s * s))) / sxx;
                if (2.0 * ScalarMath.Pi * mid < falling)
                {
                    lo = mid;
                }
                else
                {
                    hi = mid;
                }
            }

            return 0.5 * (lo + hi);
        }

        /// <summary>
        /// E(nu) = min(2 pi nu, ((N/2) / sin(pi nu) + 1 / (2 sin^2(pi nu))) / Sxx): an upper bound on the gain
        /// |C(nu)| of the least-squares slope at frequency nu (cycles per index, in [0, 1/2]); 0 at nu = 0.
        /// </summary>
        /// <param name="nu">Frequency, cycles per index, [0, 1/2].</param>
        /// <param name="n">N, indices spanned.</param>
        /// <param name="sxx">sum (i - mean i)^2.</param>
        /// <returns>The bound.</returns>
        public static double Gain(double nu, double n, double sxx)
        {
            if (!(nu > 0))
            {
                return 0;
            }

            double low = 2.0 * ScalarMath.Pi * nu;
            double s = ScalarMath.SinPi(nu);
            double high = ((0.5 * n / s) + (0.5 / (s * s))) / sxx;
            return low < high ? low : high;
        }
    }
}
