namespace FreqReadout.Host.Simulation;

/// <summary>
/// Scene: one explicit pass of the coil (an item of <c>sweep.legs</c>): from <see cref="FromM"/> to <see cref="ToM"/> along
/// the line at constant speed, starting at <see cref="StartS"/> and lasting <see cref="DurationS"/>.
/// </summary>
public sealed class SceneSweepLeg
{
    /// <summary>Time the pass starts, s (at or after the previous leg's end).</summary>
    public double StartS { get; set; }

    /// <summary>Position at the start, m.</summary>
    public double FromM { get; set; }

    /// <summary>Position at the end, m (differs from <see cref="FromM"/>).</summary>
    public double ToM { get; set; }

    /// <summary>How long the pass takes, s (&gt; 0; the speed |to - from| / duration is at most 20 m/s).</summary>
    public double DurationS { get; set; }
}
