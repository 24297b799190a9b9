namespace FreqReadout.Host.Simulation;

/// <summary>Current distribution assumed by the thin-loop inductance formula (the Y term).</summary>
public enum ThinLoopCurrent
{
    /// <summary>Uniform current over the wire (low frequency): Y = 1/2, so ln(8R/a) - 1.75.</summary>
    Uniform,

    /// <summary>Current on the surface (full skin effect): Y = 0, so ln(8R/a) - 2.</summary>
    SkinEffect,
}
