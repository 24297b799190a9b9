using System.Numerics;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// Coil impedance change from a small target by reciprocity (docs/references.md): dL = mu0 Re(M) |H/I|^2,
/// dR = -w mu0 Im(M) |H/I|^2, with H/I the coil's field per ampere at the target (the vector dot product, so it holds off
/// axis for an isotropic sphere). Valid while the target is small against its distance (about 10 radii).
/// </summary>
public static class Reciprocity
{
    /// <summary>dL = mu0 Re(M) |H/I|^2, H. M in m^3.</summary>
    public static double InductanceChangeH(Complex polarizabilityM3, FieldVector fieldPerA)
    {
        return PhysicalConstants.Mu0HPerM * polarizabilityM3.Real * fieldPerA.MagnitudeSquared;
    }

    /// <summary>dR = -w mu0 Im(M) |H/I|^2, ohm (&gt;= 0 since Im M &lt;= 0).</summary>
    public static double ResistanceChangeOhm(Complex polarizabilityM3, FieldVector fieldPerA, double frequencyHz)
    {
        return -2.0 * Math.PI * frequencyHz * PhysicalConstants.Mu0HPerM * polarizabilityM3.Imaginary * fieldPerA.MagnitudeSquared;
    }
}
