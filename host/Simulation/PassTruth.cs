namespace FreqReadout.Host.Simulation;

/// <summary>Truth for one target on one pass (a row of the truth file's <c>passes</c>).</summary>
public sealed class PassTruth
{
    /// <summary>0-based pass number.</summary>
    public int Pass { get; set; }

    /// <summary>Time the coil centre passes over the target's position along the line, s.</summary>
    public double ClosestTimeS { get; set; }

    /// <summary>Time of the largest |shift| of this target alone on this pass, s (under the winding for shallow targets).</summary>
    public double PeakTimeS { get; set; }

    /// <summary>Expected peak shift of the search oscillator from this target alone, Hz (drift and noise excluded).</summary>
    public double PeakSearchShiftHz { get; set; }

    /// <summary>The same shift in the counted signal, Hz (sign flipped in beat mode when the search is tuned below the reference).</summary>
    public double PeakCountedShiftHz { get; set; }

    /// <summary>Search-oscillator shift with the coil centred over the target, Hz.</summary>
    public double ClosestSearchShiftHz { get; set; }
}
