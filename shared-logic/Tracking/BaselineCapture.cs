using FreqReadout.Numerics;

namespace FreqReadout.Tracking
{
    /// <summary>
    /// Collects the gates of a baseline capture into fixed arrays (allocated once) and estimates level,
    /// slope and robust noise with outlier rejection. Adding a gate is O(1); the estimate, once per
    /// capture, is O(n) expected (in-place selections, see <see cref="RobustStatistics.SelectInPlace(double[], int, int)"/>),
    /// never O(n^2).
    /// <para>
    /// Method: (1) resistant line (Tukey's three-group line): b = (median x_R - median x_L) /
    /// (median t_R - median t_L) over the first and last thirds of the points, a = median(x_i - b t_i)
    /// (fewer than 6 points: b = 0); (2) residuals r_i = x_i - a - b t_i, robust sigma
    /// s = 1.482602218505602 * median |r_i| (MAD scaled to sigma; Hampel 1974, Rousseeuw and Croux 1993);
    /// (3) points with |r_i| &gt; k s (k = OutlierSigma, Hampel's 3-sigma rule by default) are rejected and
    /// steps 1-2 are repeated once on the rest. The level is reported at the last point:
    /// L = a + b t_last. A drift during the capture therefore neither biases the level nor inflates the noise.
    /// </para>
    /// </summary>
    public sealed class BaselineCapture
    {
        private readonly double[] times;
        private readonly double[] values;
        private readonly double[] keptTimes;
        private readonly double[] keptValues;
        private readonly double[] residuals;
        private readonly double[] scratch;
        private int count;
        private int keptCount;
        private double originSeconds;
        private double originHz;
        private double fitA;
        private double fitB;

        /// <summary>Creates a capture buffer.</summary>
        /// <param name="capacity">Most gates one capture holds (&gt;= 1).</param>
        public BaselineCapture(int capacity)
        {
            if (capacity < 1)
            {
                throw new System.ArgumentException("capacity must be >= 1");
            }

            times = new double[capacity];
            values = new double[capacity];
            keptTimes = new double[capacity];
            keptValues = new double[capacity];
            residuals = new double[capacity];
            scratch = new double[capacity];
        }

        /// <summary>Gates held now.</summary>
        public int Count
        {
            get { return count; }
        }

        /// <summary>Most gates one capture holds.</summary>
        public int Capacity
        {
            get { return times.Length; }
        }

        /// <summary>True when no more gates fit.</summary>
        public bool IsFull
        {
            get { return count == times.Length; }
        }

        /// <summary>Starts a new capture.</summary>
        public void Clear()
        {
            count = 0;
            keptCount = 0;
        }

        /// <summary>Adds one gate (time s, frequency Hz). False when full or the value is not finite.</summary>
        public bool Add(double timeSeconds, double valueHz)
        {
            if (count == times.Length || !ScalarMath.IsFinite(valueHz) || !ScalarMath.IsFinite(timeSeconds))
            {
                return false;
            }

            if (count == 0)
            {
                originSeconds = timeSeconds;
                originHz = valueHz;
            }

            // Offsets from the first gate keep the small differences the fit works on free of cancellation against ~1e5 Hz.
            times[count] = timeSeconds - originSeconds;
            values[count] = valueHz - originHz;
            count++;
            return true;
        }

        /// <summary>
        /// Estimates the baseline from the gates held (method in the class summary).
        /// </summary>
        /// <param name="outlierSigma">Rejection limit k in robust sigmas (&gt; 0).</param>
        /// <param name="estimate">Caller-owned; filled with the estimate (unchanged when false is returned).</param>
        /// <returns>False when no gate is held.</returns>
        public bool TryEstimate(double outlierSigma, BaselineEstimate estimate)
        {
            if (count == 0)
            {
                return false;
            }

            for (int i = 0; i < count; i++)
            {
                keptTimes[i] = times[i];
                keptValues[i] = values[i];
            }

            keptCount = count;
            double sigma = Fit();
            int outliers = 0;
            if (sigma > 0)
            {
                double limit = outlierSigma * sigma;
                int n = 0;
                for (int i = 0; i < count; i++)
                {
                    double r = values[i] - fitA - (fitB * times[i]);
                    if (ScalarMath.Abs(r) <= limit)
                    {
                        keptTimes[n] = times[i];
                        keptValues[n] = values[i];
                        n++;
                    }
                }

                outliers = count - n;
                if (outliers > 0 && n > 0)
                {
                    keptCount = n;
                    sigma = Fit();
                }
            }

            double last = times[count - 1];
            estimate.Set(originHz + fitA + (fitB * last), fitB, sigma, last + originSeconds, count, outliers);
            return true;
        }

        /// <summary>Value of the first gate held, Hz (the capture works on offsets from it).</summary>
        public double OriginHz
        {
            get { return originHz; }
        }

        /// <summary>
        /// Least-squares quadratic through the gates held (offsets from <see cref="OriginHz"/>, time origin at the
        /// last gate), refitted once without the gates beyond outlierSigma robust sigmas of the first fit; returns
        /// the robust sigma (MadToSigma * median |r|) of the kept gates about it, or -1 when no quadratic is
        /// determined (fewer than 6 gates). Used when the drift curves within the capture.
        /// </summary>
        public double FitQuadratic(double outlierSigma, QuadraticFit fit)
        {
            if (count < 6)
            {
                return -1.0;
            }

            double last = times[count - 1];
            fit.Clear(last + originSeconds);
            for (int i = 0; i < count; i++)
            {
                fit.Add(times[i] + originSeconds, values[i]);
            }

            if (!fit.TrySolve())
            {
                return -1.0;
            }

            double sigma = QuadraticResidualSigma(fit, 0.0);
            if (sigma > 0)
            {
                double limit = outlierSigma * sigma;
                fit.Clear(last + originSeconds);
                for (int i = 0; i < count; i++)
                {
                    double t = times[i] + originSeconds;
                    if (ScalarMath.Abs(values[i] - fit.Evaluate(t)) <= limit)
                    {
                        fit.Add(t, values[i]);
                    }
                }

                if (!fit.TrySolve())
                {
                    return -1.0;
                }

                sigma = QuadraticResidualSigma(fit, limit);
            }

            return sigma;
        }

        // Robust sigma of the residuals about the fit (only those within limit when limit > 0).
        private double QuadraticResidualSigma(QuadraticFit fit, double limit)
        {
            int n = 0;
            for (int i = 0; i < count; i++)
            {
                double r = values[i] - fit.Evaluate(times[i] + originSeconds);
                if (limit <= 0 || ScalarMath.Abs(r) <= limit * 2.0)
                {
                    residuals[n] = r;
                    n++;
                }
            }

            return RobustStatistics.MadSigma(residuals, n, 0.0, scratch);
        }

        /// <summary>Time of the i-th gate held, s (0 = oldest).</summary>
        public double TimeSecondsAt(int i)
        {
            return times[i] + originSeconds;
        }

        /// <summary>Value of the i-th gate held, Hz.</summary>
        public double ValueHzAt(int i)
        {
            return values[i] + originHz;
        }

        /// <summary>
        /// Noise from successive differences: MadToSigma * median |x_i - x_(i-1)| / sqrt 2 over the gates held
        /// (a step or a slow drift moves one difference or all of them by a little, so this stays near the
        /// white noise while the residuals about a line do not). 0 for fewer than 2 gates.
        /// </summary>
        public double DifferenceNoiseHz()
        {
            int n = count - 1;
            if (n < 1)
            {
                return 0.0;
            }

            for (int i = 0; i < n; i++)
            {
                residuals[i] = values[i + 1] - values[i];
            }

            return RobustStatistics.MadSigma(residuals, n, 0.0, scratch) / ScalarMath.Sqrt(2.0);
        }

        /// <summary>
        /// Signed size of a step inside the capture: median of the last third minus median of the first third
        /// of the values, less what the fitted slope explains; 0 for fewer than 6 gates.
        /// </summary>
        public double StepHz(double slopeHzPerSecond)
        {
            int third = count / 3;
            if (third < 2)
            {
                return 0.0;
            }

            double first = RobustStatistics.Median(values, third, scratch);
            double firstTime = MedianOfAscending(times, 0, third);
            for (int i = 0; i < third; i++)
            {
                residuals[i] = values[count - third + i];
            }

            double last = RobustStatistics.Median(residuals, third, scratch);
            double lastTime = MedianOfAscending(times, count - third, third);
            return (last - first) - (slopeHzPerSecond * (lastTime - firstTime));
        }

        /// <summary>
        /// Copies scale * |x_i - 3 x_(i-1) + 3 x_(i-2) - x_(i-3)| of the gates held into a running window (third
        /// differences cancel a quadratic drift; scale = 1 / sqrt 20 makes them white-noise sigmas). Nothing for fewer than 4 gates.
        /// </summary>
        public void CopyAbsoluteThirdDifferences(MedianWindow window, double scale)
        {
            for (int i = 3; i < count; i++)
            {
                window.Add(ScalarMath.Abs(values[i] - (3.0 * values[i - 1]) + (3.0 * values[i - 2]) - values[i - 3]) * scale);
            }
        }

        // Median of a[start .. start + n), which is in ascending order (gate times always are): no selection needed.
        private static double MedianOfAscending(double[] a, int start, int n)
        {
            int mid = start + (n / 2);
            return (n & 1) == 1 ? a[mid] : 0.5 * (a[mid - 1] + a[mid]);
        }

        // Resistant line over keptTimes/keptValues[0..keptCount); sets fitA, fitB; returns the robust sigma.
        private double Fit()
        {
            int n = keptCount;
            fitB = 0;
            if (n >= 6)
            {
                int third = n / 3;
                double tLeft = MedianOfAscending(keptTimes, 0, third);
                double xLeft = RobustStatistics.Median(keptValues, third, scratch);
                double tRight = MedianOfAscending(keptTimes, n - third, third);
                for (int i = 0; i < third; i++)
                {
                    residuals[i] = keptValues[n - third + i];
                }

                double xRight = RobustStatistics.Median(residuals, third, scratch);
                if (tRight > tLeft)
                {
                    fitB = (xRight - xLeft) / (tRight - tLeft);
                }
            }

            for (int i = 0; i < n; i++)
            {
                residuals[i] = keptValues[i] - (fitB * keptTimes[i]);
            }

            fitA = RobustStatistics.Median(residuals, n, scratch);
            for (int i = 0; i < n; i++)
            {
                residuals[i] -= fitA;
            }

            return RobustStatistics.MadSigma(residuals, n, 0.0, scratch);
        }
    }
}
