namespace FreqReadout.Host.Bench;

/// <summary>The kinds of drift scene the tracking-quality bench draws (names in output: settling, ramp, onset, mains).</summary>
public enum BenchKind
{
    /// <summary>Exponential settling from t = 0 (a coil carried from a warm car into cold air, or back).</summary>
    Settling,

    /// <summary>A linear ramp from t = 0.</summary>
    Ramp,

    /// <summary>Flat, then a ramp that starts at a random time after the baseline.</summary>
    Onset,

    /// <summary>Mains pickup (50 or 60 Hz frequency modulation) on top of one of the three drifts above.</summary>
    Mains,
}
