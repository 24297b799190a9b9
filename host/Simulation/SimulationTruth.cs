using System.Text.Json;

namespace FreqReadout.Host.Simulation;

/// <summary>The truth file written beside a simulated capture (JSON, snake_case keys with units).</summary>
public sealed class SimulationTruth
{
    public string Scene { get; set; } = "";
    public string? Note { get; set; }
    public long Seed { get; set; }
    public string Kind { get; set; } = "";
    public string Signal { get; set; } = "";
    public string? BeatSide { get; set; }
    public double DurationS { get; set; }
    public double SearchNominalHz { get; set; }
    public double? ReferenceNominalHz { get; set; }
    public double? BeatNominalHz { get; set; }
    public double InductanceWheelerUh { get; set; }
    public double InductanceThinLoopUh { get; set; }
    public string InductanceModel { get; set; } = "";
    public double CapacitanceNf { get; set; }
    public double TempcoPpmPerK { get; set; }
    public double TempStartC { get; set; }
    public double TempEndC { get; set; }

    /// <summary>Search-oscillator drift from temperature over the run (end - start, no targets), Hz.</summary>
    public double DriftSearchHz { get; set; }

    public double ClockHz { get; set; }
    public double ClockErrorPpm { get; set; }
    public int Prescale { get; set; }
    public int TimerBits { get; set; }
    public double JitterS { get; set; }
    [System.Text.Json.Serialization.JsonPropertyName("white_fm_adev_1s")]
    public double WhiteFmAdev1s { get; set; }
    public double FlickerAdev { get; set; }

    /// <summary>Mains pickup: peak deviation of the search oscillator, ppm (null without pickup).</summary>
    public double? MainsDeviationPpm { get; set; }

    /// <summary>Mains pickup: modulation frequency, Hz (null without pickup).</summary>
    public double? MainsHz { get; set; }

    /// <summary>Data rows written (edges or snapshots).</summary>
    public long Rows { get; set; }

    /// <summary>Timer wraps in the capture (timer_bits &lt; 64).</summary>
    public long TimerWraps { get; set; }

    /// <summary>Glitch (double-trigger) times, s (first 10000).</summary>
    public List<double> GlitchTimesS { get; set; } = new();
    public long GlitchCount { get; set; }

    /// <summary>Dropout start times, s (first 10000), each <see cref="DropoutS"/> long.</summary>
    public List<double> DropoutStartTimesS { get; set; } = new();
    public long DropoutCount { get; set; }
    public double DropoutS { get; set; }

    /// <summary>Times the beat fell below 1 Hz and the oscillators were taken as locked (no edges until it rose again), s (first 10000).</summary>
    public List<double> LockedStartTimesS { get; set; } = new();
    public long LockedCount { get; set; }

    /// <summary>Edges whose jittered stamp would not have increased and were placed one tick after the previous.</summary>
    public long JitterClamps { get; set; }

    /// <summary>Pass start and end times, s.</summary>
    public List<double[]> PassTimesS { get; set; } = new();

    public List<TargetTruth> Targets { get; set; } = new();

    /// <summary>The complete scene that produced the capture (after command-line overrides).</summary>
    public Scene? Parameters { get; set; }

    /// <summary>Warnings about the scene (dipole model stretched, beat near zero, ...).</summary>
    public List<string> Warnings { get; set; } = new();

    /// <summary>
    /// Indented JSON with the scene options (snake_case), every key present: what does not apply is null, never left out
    /// (docs/json-output.md); <c>parameters</c> is the scene with its unset optional settings as null.
    /// </summary>
    public string ToJson() => JsonSerializer.Serialize(this, WriteOptions);

    private static readonly JsonSerializerOptions WriteOptions = new(Simulation.Scene.JsonOptions)
    {
        DefaultIgnoreCondition = System.Text.Json.Serialization.JsonIgnoreCondition.Never,
    };

    /// <summary>Parses a truth file.</summary>
    public static SimulationTruth Parse(string json) => JsonSerializer.Deserialize<SimulationTruth>(json, Simulation.Scene.JsonOptions)
        ?? throw new JsonException("empty truth file");
}
