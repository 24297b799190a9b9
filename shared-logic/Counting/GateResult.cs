namespace FreqReadout.Counting
{
    /// <summary>
    /// One gate's estimate, an object the caller owns and the counter fills in place (on the device a
    /// struct would be a heap object per gate and per copy; see DEVELOPERS.md). Frequencies are of the
    /// input signal before the prescaler (prescale x recorded-edge rate). Times are seconds from the
    /// first accepted edge. When <see cref="HasFrequency"/> is false (no signal) every frequency field
    /// is 0 and must not be shown. A new object reads as an empty no-signal result (every field 0).
    /// </summary>
    public sealed class GateResult
    {
        /// <summary>An empty result (State Ok, every number 0, HasFrequency false) for a counter to fill.</summary>
        public GateResult()
        {
        }

        /// <summary>What this result means (ok, no signal, glitch, dropout).</summary>
        public GateState State { get; private set; }

        /// <summary>The estimator whose value is in <see cref="FrequencyHz"/>.</summary>
        public EstimatorKind Estimator { get; private set; }

        /// <summary>Search oscillator or beat note.</summary>
        public SignalKind Signal { get; private set; }

        /// <summary>False when there is no frequency (no signal): never show a stale number.</summary>
        public bool HasFrequency { get; private set; }

        /// <summary>The chosen estimator's frequency of the counted input signal, Hz (before the prescaler).</summary>
        public double FrequencyHz { get; private set; }

        /// <summary>
        /// The chosen estimator's predicted 1-sigma error, Hz: the rms the gate is expected to scatter by
        /// at this frequency ratio. Where the timer's quantisation is not dithered by jitter (below about
        /// 0.3 tick rms) its errors are deterministic, not white, and the figure is a conservative one:
        /// it covers the worst phase of the quantisation pattern, not only its average (see the counters'
        /// notes and <see cref="QuantisationErrorModel"/>).
        /// </summary>
        public double ErrorHz { get; private set; }

        /// <summary>The reciprocal (first/last edge) estimate from the same edges, Hz (0 for snapshot gates).</summary>
        public double ReciprocalHz { get; private set; }

        /// <summary>The least-squares estimate from the same edges or snapshots, Hz.</summary>
        public double RegressionHz { get; private set; }

        /// <summary>Recorded edges (or snapshots) used, both boundary edges included.</summary>
        public int Edges { get; private set; }

        /// <summary>Input edges per recorded edge.</summary>
        public int Prescale { get; private set; }

        /// <summary>Unwrapped tick of the gate's opening edge.</summary>
        public long StartTick { get; private set; }

        /// <summary>Unwrapped tick of the gate's closing edge.</summary>
        public long EndTick { get; private set; }

        /// <summary>Opening time, seconds from the first accepted edge.</summary>
        public double StartSeconds { get; private set; }

        /// <summary>Closing time, seconds from the first accepted edge.</summary>
        public double EndSeconds { get; private set; }

        /// <summary>Gate span, seconds.</summary>
        public double SpanSeconds
        {
            get { return EndSeconds - StartSeconds; }
        }

        /// <summary>Double-triggered edges rejected inside this gate.</summary>
        public int Glitches { get; private set; }

        /// <summary>Dropouts (gaps of many expected periods) that closed this gate (0 or 1).</summary>
        public int Dropouts { get; private set; }

        /// <summary>
        /// Input-signal edges the gate spans (before the prescaler): for an edge gate the periods it
        /// spans x Prescale ((Edges - 1 + InferredEdges) x Prescale), for a snapshot gate the count
        /// difference between its first and last read; 0 without a frequency.
        /// </summary>
        public long InputEdges { get; private set; }

        /// <summary>
        /// Recorded edges the gate inferred as missed: an interval near m running periods (m = 2..8)
        /// counted as m periods adds m - 1 (see <see cref="EdgeCounter"/>). 0 for snapshot gates and
        /// without a frequency. The estimate already uses the true period count; this says it happened.
        /// </summary>
        public int InferredEdges { get; private set; }

        /// <summary>Fills every field; each argument is stored in the property of the same name.</summary>
        public void Set(
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
            int dropouts,
            long inputEdges,
            int inferredEdges)
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
            InputEdges = inputEdges;
            InferredEdges = inferredEdges;
        }

        /// <summary>Copies every field of <paramref name="other"/> into this object.</summary>
        public void CopyFrom(GateResult other)
        {
            Set(
                other.State,
                other.Estimator,
                other.Signal,
                other.HasFrequency,
                other.FrequencyHz,
                other.ErrorHz,
                other.ReciprocalHz,
                other.RegressionHz,
                other.Edges,
                other.Prescale,
                other.StartTick,
                other.EndTick,
                other.StartSeconds,
                other.EndSeconds,
                other.Glitches,
                other.Dropouts,
                other.InputEdges,
                other.InferredEdges);
        }
    }
}
