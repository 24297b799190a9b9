namespace FreqReadout.Host.Simulation;

/// <summary>Shape of a temperature profile.</summary>
public enum TemperatureProfileKind
{
    /// <summary>Constant <c>start_c</c>.</summary>
    Constant,

    /// <summary>Steps: each point's temperature holds from its time until the next point (before the first: <c>start_c</c>).</summary>
    Steps,

    /// <summary>Ramps: piecewise linear through the points (<c>start_c</c> at t = 0 before the first point; the last holds).</summary>
    Ramps,

    /// <summary>Exponential settling from <c>start_c</c> towards <c>ambient_c</c> with <c>time_constant_s</c>.</summary>
    Settling,
}
