using FreqReadout.Counting;

namespace FreqReadout.Host.Counting;

/// <summary>
/// One gate of a capture replay: the counter's result plus what the capture's rows carried inside
/// that gate (rows after the gate's opening edge up to and including its closing edge; the very
/// first gate also includes its opening row).
/// </summary>
public readonly struct CaptureGate
{
    private static readonly string[] NoMarks = Array.Empty<string>();

    public CaptureGate(GateResult gate, double? temperatureC, double? latestTemperatureC, IReadOnlyList<string>? marks, long lastLineNumber, double? scatterHz = null)
    {
        ScatterHz = scatterHz;
        Gate = gate;
        TemperatureC = temperatureC;
        LatestTemperatureC = latestTemperatureC;
        Marks = marks ?? NoMarks;
        LastLineNumber = lastLineNumber;
    }

    /// <summary>The counter's result for this gate (frequency of the counted signal before the prescaler, state, error).</summary>
    public GateResult Gate { get; }

    /// <summary>Mean of the <c>temp_c</c> samples that fell in this gate, deg C; null when no new sample fell in it.</summary>
    public double? TemperatureC { get; }

    /// <summary>The most recent <c>temp_c</c> sample at or before this gate's end (carried forward), deg C; null before the first sample.</summary>
    public double? LatestTemperatureC { get; }

    /// <summary>The marks of the rows in this gate, in row order (<c>rebaseline</c>, <c>hold</c>, <c>release</c> or free text); empty when none.</summary>
    public IReadOnlyList<string> Marks { get; }

    /// <summary>
    /// Measured scatter of consecutive gates up to this one, Hz (see <see cref="ConsecutiveGateScatter"/>):
    /// what the frequency really did from gate to gate, beside the predicted <see cref="GateResult.ErrorHz"/>.
    /// Null until two consecutive gates with a frequency. Informational only: it never feeds the detection sigma.
    /// </summary>
    public double? ScatterHz { get; }

    /// <summary>Line (text) or row ordinal (binary) of the last row fed before this gate was reported, for messages.</summary>
    public long LastLineNumber { get; }
}
