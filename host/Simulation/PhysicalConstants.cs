namespace FreqReadout.Host.Simulation;

/// <summary>Physical constants used by the simulator.</summary>
public static class PhysicalConstants
{
    /// <summary>Vacuum permeability mu0, H/m. The classical 4 pi 1e-7 (CODATA 2018 differs by 5.5e-10 relative, far below every tolerance here).</summary>
    public const double Mu0HPerM = 4e-7 * Math.PI;
}
