namespace FreqReadout.Host.Planning;

/// <summary>What <c>plan</c> reports. Property names become the JSON keys (docs/json-output.md, keys: plan).</summary>
public sealed class PlanReport
{
    /// <summary>Counted signal: search or beat.</summary>
    public string Signal { get; set; } = "search";

    /// <summary>Search-oscillator frequency, Hz.</summary>
    public double SearchHz { get; set; }

    /// <summary>Beat-note frequency, Hz.</summary>
    public double BeatHz { get; set; }

    /// <summary>Prescaler before the search oscillator.</summary>
    public int SearchPrescale { get; set; }

    /// <summary>Prescaler before the beat note.</summary>
    public int BeatPrescale { get; set; }

    /// <summary>The gate of the beat comparison and the depth answer, s.</summary>
    public double GateS { get; set; }

    /// <summary>The methods compared, with the figures used.</summary>
    public List<TimestampPreset> Methods { get; set; } = new();

    /// <summary>Resolution table of the counted signal.</summary>
    public List<PlanRow> Rows { get; set; } = new();

    /// <summary>Beat note against search oscillator at the chosen gate.</summary>
    public List<BeatGainRow> BeatGains { get; set; } = new();

    /// <summary>Warnings about the inputs as a whole (near zero beat, a prescaler before the pulse counter, quantisation alone).</summary>
    public List<string> Warnings { get; set; } = new();

    /// <summary>Depth answer; null without a target.</summary>
    public PlanDepthReport? Depth { get; set; }
}
