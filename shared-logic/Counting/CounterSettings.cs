namespace FreqReadout.Counting
{
    /// <summary>
    /// Settings of <see cref="EdgeCounter"/> and <see cref="SnapshotCounter"/>. Plain settable
    /// properties with documented defaults; call <see cref="TryValidate"/> before use.
    /// </summary>
    public sealed class CounterSettings
    {
        /// <summary>Shortest time gate, seconds (1 us: shorter gates hold no more than one interval of any countable signal).</summary>
        public const double MinGateSeconds = 1e-6;

        /// <summary>Longest time gate, seconds (one day).</summary>
        public const double MaxGateSeconds = 86400;

        /// <summary>Largest configurable timestamp jitter, rms ticks (a jitter beyond this swamps every estimate; it also keeps the error model finite).</summary>
        public const double MaxJitterTicks = 1e9;

        /// <summary>Shortest no-signal timeout, seconds (1 ms: shorter would poll faster than a device loop runs).</summary>
        public const double MinNoSignalSeconds = 1e-3;

        /// <summary>Longest no-signal timeout, seconds (one hour).</summary>
        public const double MaxNoSignalSeconds = 3600;

        /// <summary>Timer clock, Hz (&gt; 0; may be fractional for a calibrated crystal). Required.</summary>
        public double ClockHz { get; set; }

        /// <summary>Input edges per recorded edge (integer &gt;= 1). Default 1.</summary>
        public int Prescale { get; set; } = 1;

        /// <summary>Search oscillator or beat note; carried through to every result. Default search.</summary>
        public SignalKind Signal { get; set; } = SignalKind.Search;

        /// <summary>Gate by time or by edge count. Default time.</summary>
        public GateMode Mode { get; set; } = GateMode.Time;

        /// <summary>Time gate length, seconds, in [<see cref="MinGateSeconds"/>, <see cref="MaxGateSeconds"/>]. Default 0.1 s.</summary>
        public double GateSeconds { get; set; } = 0.1;

        /// <summary>Edge gate length in recorded intervals (&gt;= 1). Default 100.</summary>
        public int GateEdges { get; set; } = 100;

        /// <summary>Estimator reported in <see cref="GateResult.FrequencyHz"/> by <see cref="EdgeCounter"/> (reciprocal or regression; the snapshot counter always uses snapshot regression). Default regression.</summary>
        public EstimatorKind Estimator { get; set; } = EstimatorKind.Regression;

        /// <summary>Configured white timestamp jitter, rms ticks, in [0, <see cref="MaxJitterTicks"/>], added to the quantisation q^2/12 in the error model (for snapshots: the read jitter of the recorded tick). Default 0.</summary>
        public double JitterTicks { get; set; }

        /// <summary>An interval shorter than this fraction of the running period is a double-triggered edge and is rejected (0..1, exclusive). Default 0.5. Edges only.</summary>
        public double GlitchFraction { get; set; } = 0.5;

        /// <summary>A gap longer than this many running periods is a dropout that closes the gate (&gt; 1). Default 8.</summary>
        public double DropoutPeriods { get; set; } = 8;

        /// <summary>No edge within this many seconds gives the no-signal state, in [<see cref="MinNoSignalSeconds"/>, <see cref="MaxNoSignalSeconds"/>]. Default 0.5 s.</summary>
        public double NoSignalSeconds { get; set; } = 0.5;

        /// <summary>
        /// Missed-edge inference (edges only): an interval within a quarter period of m running periods
        /// (m = 2..8) counts as the m periods it spans instead of one long interval (see
        /// <see cref="EdgeCounter"/>). Default on.
        /// </summary>
        public bool InferMissedEdges { get; set; } = true;

        /// <summary>
        /// Beat mode only: no missed-edge inference while the running beat frequency (before the
        /// prescaler) is below this, Hz (&gt;= 0). Near the beat floor the two oscillators pull toward
        /// lock and the beat period really can change by a large factor within a few periods, so an
        /// interval of about two periods may be a real one. Default 200 Hz: four times the readout's
        /// default beat floor of 50 Hz (a rule of thumb, common practice, no source); hosts that take
        /// a beat floor set it to <see cref="InferBeatFloorFactor"/> x that floor.
        /// </summary>
        public double InferMinBeatHz { get; set; } = InferBeatFloorFactor * 50.0;

        /// <summary>The factor between the beat floor and <see cref="InferMinBeatHz"/> that hosts use (4).</summary>
        public const double InferBeatFloorFactor = 4.0;

        /// <summary>
        /// Mains frequency whose frequency modulation a time gate should cancel, Hz: 0 = off (default),
        /// else 10..1000 (50 or 60 for the public supply). The time gate is then set to the length that
        /// nulls a sinusoidal modulation at this frequency for the estimator in use, nearest to
        /// GateSeconds (see <see cref="MainsGate"/>). Ignored for edge gates.
        /// </summary>
        public double MainsHz { get; set; }

        /// <summary>
        /// Checks every setting against its allowed range.
        /// </summary>
        /// <param name="error">The first bad setting, named with its allowed range; null when all are valid.</param>
        /// <returns>True when every setting is valid.</returns>
        public bool TryValidate(out string error)
        {
            error = null;
            if (!(ClockHz > 0) || double.IsInfinity(ClockHz))
            {
                error = "clock_hz must be a finite number > 0";
                return false;
            }

            if (Prescale < 1)
            {
                error = "prescale must be an integer >= 1";
                return false;
            }

            if (!(GateSeconds >= MinGateSeconds && GateSeconds <= MaxGateSeconds))
            {
                error = "gate seconds must be in [1e-6, 86400] s";
                return false;
            }

            if (GateEdges < 1)
            {
                error = "gate edges must be an integer >= 1";
                return false;
            }

            if (!(JitterTicks >= 0 && JitterTicks <= MaxJitterTicks))
            {
                error = "jitter ticks must be in [0, 1e9] ticks";
                return false;
            }

            if (!(GlitchFraction > 0 && GlitchFraction < 1))
            {
                error = "glitch fraction must be between 0 and 1 (exclusive)";
                return false;
            }

            if (!(DropoutPeriods > 1) || double.IsInfinity(DropoutPeriods))
            {
                error = "dropout periods must be a finite number > 1";
                return false;
            }

            if (!(NoSignalSeconds >= MinNoSignalSeconds && NoSignalSeconds <= MaxNoSignalSeconds))
            {
                error = "no-signal seconds must be in [0.001, 3600] s";
                return false;
            }

            if (!(InferMinBeatHz >= 0) || double.IsInfinity(InferMinBeatHz))
            {
                error = "infer min beat hz must be a finite number >= 0";
                return false;
            }

            if (!(MainsHz == 0 || (MainsHz >= MainsGate.MinMainsHz && MainsHz <= MainsGate.MaxMainsHz)))
            {
                error = "mains hz must be 0 (off) or from 10 to 1000 (50 or 60 for the public supply)";
                return false;
            }

            return true;
        }
    }
}
