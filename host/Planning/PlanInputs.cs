namespace FreqReadout.Host.Planning;

/// <summary>Everything <c>plan</c> is asked, checked by the command before it gets here.</summary>
public sealed class PlanInputs
{
    /// <summary>The signal the device counts: search or beat.</summary>
    public string Signal { get; init; } = "search";

    /// <summary>Search-oscillator frequency, Hz.</summary>
    public double SearchHz { get; init; } = 100_000;

    /// <summary>Beat-note frequency, Hz.</summary>
    public double BeatHz { get; init; } = 1_000;

    /// <summary>Prescaler before the search oscillator when it is counted.</summary>
    public int SearchPrescale { get; init; } = 1;

    /// <summary>Prescaler before the beat note when it is counted.</summary>
    public int BeatPrescale { get; init; } = 1;

    /// <summary>Methods to compare.</summary>
    public IReadOnlyList<TimestampPreset> Methods { get; init; } = TimestampPresets.All();

    /// <summary>Gate times of the resolution table, s.</summary>
    public IReadOnlyList<double> GatesS { get; init; } = new[] { 0.01, 0.03, 0.1, 0.3, 1.0 };

    /// <summary>The gate of the beat comparison and of the depth answer, s.</summary>
    public double GateS { get; init; } = 0.1;

    /// <summary>Coil, target and sweep for the depth answer; null for none.</summary>
    public PlanTarget? Target { get; init; }
}
