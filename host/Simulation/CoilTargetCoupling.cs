using System.Numerics;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// Coil-to-target coupling: the coil's field per ampere at the target (exact off-axis loop field, turns lumped at the mean
/// radius in the coil's mid-plane) and the inductance change by reciprocity, dL = mu0 Re(M) |H/I|^2.
/// </summary>
public static class CoilTargetCoupling
{
    /// <summary>H/I at a point <paramref name="radialM"/> from the coil axis and <paramref name="axialM"/> from the coil plane, 1/m.</summary>
    public static FieldVector FieldPerA(SearchCoil coil, double radialM, double axialM)
    {
        return LoopField.Field(coil.Turns, coil.MeanRadiusM, radialM, axialM);
    }

    /// <summary>dL = mu0 Re(M) |H/I|^2, H, for a sphere of polarizability M (m^3) at that point.</summary>
    public static double InductanceChangeH(SearchCoil coil, Complex polarizabilityM3, double radialM, double axialM)
    {
        return Reciprocity.InductanceChangeH(polarizabilityM3, FieldPerA(coil, radialM, axialM));
    }

    /// <summary>On-axis closed form dL = mu0 Re(M) N^2 R^4 / (4 (R^2 + z^2)^3), H (docs/references.md).</summary>
    public static double OnAxisInductanceChangeH(SearchCoil coil, Complex polarizabilityM3, double axialM)
    {
        double h = LoopField.OnAxisPerM(coil.Turns, coil.MeanRadiusM, axialM);
        return PhysicalConstants.Mu0HPerM * polarizabilityM3.Real * h * h;
    }
}
