namespace FreqReadout.Host.Simulation;

/// <summary>Scene: faults to inject when asked (JSON object <c>faults</c>). All default to none.</summary>
public sealed class SceneFaults
{
    /// <summary>Mean rate of double triggers (an extra edge 5-25 % of a period after a real one; for snapshots an extra count), per s.</summary>
    public double GlitchesPerS { get; set; }

    /// <summary>Mean rate of dropouts (edges lost), per s.</summary>
    public double DropoutsPerS { get; set; }

    /// <summary>Length of each dropout, s. Default 0.005.</summary>
    public double DropoutS { get; set; } = 0.005;
}
