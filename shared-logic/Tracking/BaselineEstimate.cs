namespace FreqReadout.Tracking
{
    /// <summary>The result of one baseline capture (counted signal, after temperature compensation).</summary>
    public sealed class BaselineEstimate
    {
        /// <summary>An empty estimate (every field 0) for the core to fill.</summary>
        public BaselineEstimate()
        {
        }

        /// <summary>Fills every field; each argument is stored in the property of the same name.</summary>
        public void Set(double levelHz, double slopeHzPerSecond, double noiseHz, double timeSeconds, int gates, int outliers)
        {
            LevelHz = levelHz;
            SlopeHzPerSecond = slopeHzPerSecond;
            NoiseHz = noiseHz;
            TimeSeconds = timeSeconds;
            Gates = gates;
            Outliers = outliers;
        }

        /// <summary>Baseline level at <see cref="TimeSeconds"/> (the last captured gate), Hz.</summary>
        public double LevelHz { get; private set; }

        /// <summary>Drift rate over the capture (resistant line), Hz/s.</summary>
        public double SlopeHzPerSecond { get; private set; }

        /// <summary>Robust sigma of the residuals about the line (MAD scaled to sigma), Hz; 0 if the capture was constant.</summary>
        public double NoiseHz { get; private set; }

        /// <summary>Time of the last captured gate, s.</summary>
        public double TimeSeconds { get; private set; }

        /// <summary>Gates captured.</summary>
        public int Gates { get; private set; }

        /// <summary>Gates rejected as outliers (beyond OutlierSigma robust sigmas of the first fit).</summary>
        public int Outliers { get; private set; }
    }
}
