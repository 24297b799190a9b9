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

            return true;
        }
    }
}
