namespace FreqReadout.Host.Simulation;

/// <summary>One row of the coil command's shift-against-depth table (target on the coil axis).</summary>
public sealed class CoilShiftRow
{
    /// <summary>Target centre below the surface, m.</summary>
    public double DepthM { get; set; }

    /// <summary>Coil plane to target centre (height + depth), m.</summary>
    public double DistanceM { get; set; }

    /// <summary>The same in target radii (the dipole model wants about 10 or more).</summary>
    public double DistanceRadii { get; set; }
    public double InductanceChangeNh { get; set; }

    /// <summary>Search-oscillator shift, Hz (positive = frequency rises).</summary>
    public double ShiftHz { get; set; }
    public double ShiftPpm { get; set; }
}
