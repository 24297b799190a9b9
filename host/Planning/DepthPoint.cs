namespace FreqReadout.Host.Planning;

/// <summary>One point of the shift-against-depth curve of <c>plan</c> (JSON and the depth plot).</summary>
public sealed class DepthPoint
{
    /// <summary>Target centre below the surface, m.</summary>
    public double DepthM { get; set; }

    /// <summary>Instantaneous peak |search shift| of a pass straight over the target, Hz.</summary>
    public double PeakShiftHz { get; set; }

    /// <summary>Largest |reading| of a gate of the chosen length (flat weights, the reciprocal's), Hz.</summary>
    public double GateShiftHz { get; set; }
}
