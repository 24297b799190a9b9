namespace FreqReadout.Host.Simulation;

/// <summary>One pass of the coil along the sweep line.</summary>
/// <param name="Index">0-based pass number.</param>
/// <param name="StartTimeS">Time the pass starts, s.</param>
/// <param name="EndTimeS">Time it ends, s.</param>
/// <param name="FromM">Position at the start, m.</param>
/// <param name="ToM">Position at the end, m.</param>
public readonly record struct SweepPass(int Index, double StartTimeS, double EndTimeS, double FromM, double ToM)
{
    /// <summary>Coil position during the pass at time t (clamped to the pass), m.</summary>
    public double PositionAt(double timeS)
    {
        double u = (timeS - StartTimeS) / (EndTimeS - StartTimeS);
        u = Math.Clamp(u, 0.0, 1.0);
        return FromM + (ToM - FromM) * u;
    }

    /// <summary>Time at which the coil passes position x (clamped to the line's ends), s.</summary>
    public double TimeAt(double positionM)
    {
        double u = (positionM - FromM) / (ToM - FromM);
        u = Math.Clamp(u, 0.0, 1.0);
        return StartTimeS + (EndTimeS - StartTimeS) * u;
    }
}
