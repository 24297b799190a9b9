using FreqReadout.Host.Replay;

namespace FreqReadout.Host.Demo;

/// <summary>One simulated pass over one target, and the readout event that matched it (if any).</summary>
/// <param name="Target">Target name from the scene.</param>
/// <param name="Pass">Pass number (0-based).</param>
/// <param name="TruthPeakSeconds">When the simulated shift peaks, s from the first edge.</param>
/// <param name="TruthPeakShiftHz">The simulated search-oscillator peak shift, Hz.</param>
/// <param name="MaterialClass">What the part is made of: ferrous or non-ferrous.</param>
/// <param name="SignRuleClass">What the sign rule should call it at this operating frequency.</param>
/// <param name="Event">The readout event whose peak lies nearest the truth's peak (within the match window), or null.</param>
public sealed record DemoPassMatch(
    string Target,
    int Pass,
    double TruthPeakSeconds,
    double TruthPeakShiftHz,
    string MaterialClass,
    string SignRuleClass,
    ReplayEvent? Event)
{
    /// <summary>True when an event was found and its class is what the sign rule should report.</summary>
    public bool ClassAsExpected => Event != null && Event.ClassName == SignRuleClass;

    /// <summary>Found peak over truth peak, or null when missed.</summary>
    public double? PeakRatio => Event == null || TruthPeakShiftHz == 0 ? null : Event.Event.PeakShiftHz / TruthPeakShiftHz;
}
