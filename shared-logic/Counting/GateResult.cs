namespace FreqReadout.Counting
{
    /// <summary>
    /// One gate's estimate. Frequencies are of the input signal before the prescaler
    /// (prescale x recorded-edge rate). Times are seconds from the first accepted edge.
    /// When <see cref="HasFrequency"/> is false (no signal) every frequency field is 0 and must not be shown.
    /// </summary>
    public struct GateResult
    {
        /// <summary>Makes a result; every argument is stored in the property of the same name.</summary>
        public GateResult(
            GateState state,
            EstimatorKind estimator,
            SignalKind signal,
            bool hasFrequency,
            double frequencyHz,
            double errorHz,
            double reciprocalHz,
            double regressionHz,
            int edges,
            int prescale,
            long startTick,
            long endTick,
            double startSeconds,
            double endSeconds,
            int glitches,
            int dropouts)
        {
            State = state;
            Estimator = estimator;
            Signal = signal;
            HasFrequency = hasFrequency;
            FrequencyHz = frequencyHz;
            ErrorHz = errorHz;
            ReciprocalHz = reciprocalHz;
            RegressionHz = regressionHz;
            Edges = edges;
            Prescale = prescale;
            StartTick = startTick;
            EndTick = endTick;
            StartSeconds = startSeconds;
            EndSeconds = endSeconds;
            Glitches = glitches;
            Dropouts = dropouts;
        }

        /// <summary>What this result means (ok, no signal, glitch, dropout).</summary>
        public GateState State { get; }

        /// <summary>The estimator whose value is in <see cref="FrequencyHz"/>.</summary>
        public EstimatorKind Estimator { get; }

        /// <summary>Search oscillator or beat note.</summary>
        public SignalKind Signal { get; }

        /// <summary>False when there is no frequency (no signal): never show a stale number.</summary>
        public bool HasFrequency { get; }

        /// <summary>The chosen estimator's frequency of the counted input signal, Hz (before the prescaler).</summary>
        public double FrequencyHz { get; }

        /// <summary>The chosen estimator's predicted 1-sigma error, Hz (white-noise model: q^2/12 plus configured jitter).</summary>
        public double ErrorHz { get; }

        /// <summary>The reciprocal (first/last edge) estimate from the same edges, Hz (0 for snapshot gates).</summary>
        public double ReciprocalHz { get; }

        /// <summary>The least-squares estimate from the same edges or snapshots, Hz.</summary>
        public double RegressionHz { get; }

        /// <summary>Recorded edges (or snapshots) used, both boundary edges included.</summary>
        public int Edges { get; }

        /// <summary>Input edges per recorded edge.</summary>
        public int Prescale { get; }

        /// <summary>Unwrapped tick of the gate's opening edge.</summary>
        public long StartTick { get; }

        /// <summary>Unwrapped tick of the gate's closing edge.</summary>
        public long EndTick { get; }

        /// <summary>Opening time, seconds from the first accepted edge.</summary>
        public double StartSeconds { get; }

        /// <summary>Closing time, seconds from the first accepted edge.</summary>
        public double EndSeconds { get; }

        /// <summary>Gate span, seconds.</summary>
        public double SpanSeconds
        {
            get { return EndSeconds - StartSeconds; }
        }

        /// <summary>Double-triggered edges rejected inside this gate.</summary>
        public int Glitches { get; }

        /// <summary>Dropouts (gaps of many expected periods) that closed this gate (0 or 1).</summary>
        public int Dropouts { get; }
    }
}
