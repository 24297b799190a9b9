namespace FreqReadout.Host.Simulation;

/// <summary>A magnetic field per unit coil current in cylindrical components about the coil axis, (A/m)/A = 1/m.</summary>
/// <param name="RadialPerM">H_rho / I, pointing away from the axis.</param>
/// <param name="AxialPerM">H_z / I, along the coil axis.</param>
public readonly record struct FieldVector(double RadialPerM, double AxialPerM)
{
    /// <summary>|H/I|^2 = H_rho^2 + H_z^2, 1/m^2.</summary>
    public double MagnitudeSquared => RadialPerM * RadialPerM + AxialPerM * AxialPerM;

    /// <summary>|H/I|, 1/m.</summary>
    public double Magnitude => Math.Sqrt(MagnitudeSquared);
}
