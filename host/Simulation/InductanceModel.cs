namespace FreqReadout.Host.Simulation;

/// <summary>Which coil inductance formula sets the simulated oscillator's L.</summary>
public enum InductanceModel
{
    /// <summary>Wheeler's multilayer formula.</summary>
    Wheeler,

    /// <summary>Thin N-turn loop, round bundle of equal area, uniform current.</summary>
    ThinLoop,
}
