namespace FreqReadout.Readout
{
    /// <summary>What <see cref="ExcursionResolver"/> decided about an open candidate (caller-owned, filled in place).</summary>
    internal sealed class ExcursionVerdict
    {
        public const int Pending = 0;
        public const int Drift = 1;
        public const int Pass = 2;
        public const int NoTarget = 3;

        /// <summary>Pending, Drift, Pass or NoTarget.</summary>
        public int Kind;

        /// <summary>Baseline (relative to the pipeline's origin) at the decision time, Hz of the counted signal.</summary>
        public double LevelHz;

        /// <summary>Baseline slope at the decision time, Hz/s.</summary>
        public double SlopeHzPerSecond;

        /// <summary>Baseline second derivative at the decision time, Hz/s^2.</summary>
        public double AccelerationHzPerSecond2;

        /// <summary>1-sigma uncertainty of <see cref="LevelHz"/> from the fit, Hz.</summary>
        public double LevelSigmaHz;

        /// <summary>1-sigma uncertainty of <see cref="SlopeHzPerSecond"/> from the fit, Hz/s.</summary>
        public double SlopeSigmaHzPerSecond;

        /// <summary>1-sigma uncertainty of <see cref="AccelerationHzPerSecond2"/> from the fit, Hz/s^2.</summary>
        public double AccelerationSigmaHzPerSecond2;

        /// <summary>Drift: start of the window the new drift was fitted to, s.</summary>
        public double StartSeconds;

        /// <summary>Most passes one verdict holds (a lock loss can hide several).</summary>
        public const int MaxPasses = 4;

        /// <summary>Pass: how many passes the middle held (1 to <see cref="MaxPasses"/>), in time order.</summary>
        public int PassCount;

        /// <summary>Pass: each pass's first reading at or above the threshold, s.</summary>
        public readonly double[] PassStartSeconds = new double[MaxPasses];

        /// <summary>Pass: each pass's last reading at or above the release level, s.</summary>
        public readonly double[] PassEndSeconds = new double[MaxPasses];

        /// <summary>Pass: each pass's reading with the largest |shift|, s.</summary>
        public readonly double[] PassPeakSeconds = new double[MaxPasses];

        /// <summary>Pass: each pass's signed peak shift of the counted signal from the two-sided baseline, Hz.</summary>
        public readonly double[] PassPeakCountedHz = new double[MaxPasses];

        /// <summary>Pass: the two-sided baseline at each pass's peak (relative to the origin), Hz.</summary>
        public readonly double[] PassPeakBaselineHz = new double[MaxPasses];

        /// <summary>Pass: each pass's readings beyond the threshold had both signs.</summary>
        public readonly bool[] PassMixedSign = new bool[MaxPasses];
    }
}
