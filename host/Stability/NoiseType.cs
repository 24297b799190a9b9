namespace FreqReadout.Host.Stability;

/// <summary>The power-law noise types of frequency stability analysis (NIST SP 1065, section 5.2), by the slope of the deviations against tau.</summary>
public enum NoiseType
{
    /// <summary>Not identified (too few points, or a slope between the types).</summary>
    Unknown = 0,

    /// <summary>White phase noise: ADEV slope -1, MDEV slope -3/2.</summary>
    WhitePhase,

    /// <summary>Flicker phase noise: ADEV slope about -1, MDEV slope -1.</summary>
    FlickerPhase,

    /// <summary>White frequency noise: slope -1/2.</summary>
    WhiteFrequency,

    /// <summary>Flicker frequency noise: slope 0.</summary>
    FlickerFrequency,

    /// <summary>Random-walk frequency noise: slope +1/2.</summary>
    RandomWalkFrequency,
}
