namespace FreqReadout.Host.Simulation;

/// <summary>
/// Quasi-static magnetic field of an N-turn circular filament loop of radius R (turns lumped at one radius and plane),
/// per ampere of coil current.
/// </summary>
public static class LoopField
{
    /// <summary>On-axis H/I = N R^2 / (2 (R^2 + z^2)^(3/2)) (Biot-Savart), 1/m.</summary>
    public static double OnAxisPerM(int turns, double radiusM, double axialM)
    {
        double r2 = radiusM * radiusM;
        double d2 = r2 + axialM * axialM;
        return turns * r2 / (2.0 * d2 * Math.Sqrt(d2));
    }

    /// <summary>
    /// Exact field of the loop at radial distance rho from the axis and axial distance z from the loop plane
    /// (the standard elliptic-integral solution of Biot-Savart, e.g. Smythe, Static and Dynamic Electricity, from memory):
    /// with m = 4 R rho / ((R + rho)^2 + z^2), Q = (R + rho)^2 + z^2, D = (R - rho)^2 + z^2:
    /// H_z / I = N / (2 pi sqrt(Q)) [K(m) + (R^2 - rho^2 - z^2) / D E(m)],
    /// H_rho / I = N z / (2 pi rho sqrt(Q)) [-K(m) + (R^2 + rho^2 + z^2) / D E(m)].
    /// Near the axis (m &lt; 1e-8) the leading terms are used: H_z on-axis, H_rho = 3 N R^2 z rho / (4 (R^2 + z^2)^(5/2)).
    /// On the wire itself (rho = R, z = 0) the field is infinite and this throws.
    /// </summary>
    public static FieldVector Field(int turns, double radiusM, double radialM, double axialM)
    {
        double rho = Math.Abs(radialM);
        double z = axialM;
        double r = radiusM;
        double q = (r + rho) * (r + rho) + z * z;
        double m = 4.0 * r * rho / q;
        if (m < 1e-8)
        {
            double d2 = r * r + z * z;
            double hz = OnAxisPerM(turns, r, z);
            double hr = 3.0 * turns * r * r * z * rho / (4.0 * d2 * d2 * Math.Sqrt(d2));
            return new FieldVector(hr, hz);
        }

        double d = (r - rho) * (r - rho) + z * z;
        if (d <= 1e-24 * r * r)
        {
            throw new ArgumentOutOfRangeException(nameof(radialM), radialM, "the field point lies on the loop wire");
        }

        double k = EllipticIntegrals.CompleteK(m);
        double e = EllipticIntegrals.CompleteE(m);
        double sq = Math.Sqrt(q);
        double axial = turns / (2.0 * Math.PI * sq) * (k + (r * r - rho * rho - z * z) / d * e);
        double radial = turns * z / (2.0 * Math.PI * rho * sq) * (-k + (r * r + rho * rho + z * z) / d * e);
        return new FieldVector(radial, axial);
    }

    /// <summary>
    /// Field of a point magnetic dipole of moment N pi R^2 (per ampere) on the axis: H = (3 (m.r^) r^ - m) / (4 pi r^3), from memory,
    /// in the same cylindrical components. For far-field checks of <see cref="Field"/>.
    /// </summary>
    public static FieldVector DipoleField(int turns, double radiusM, double radialM, double axialM)
    {
        double moment = turns * Math.PI * radiusM * radiusM;
        double r2 = radialM * radialM + axialM * axialM;
        double r = Math.Sqrt(r2);
        double c = moment / (4.0 * Math.PI * r2 * r);
        double cosT = axialM / r;
        double sinT = radialM / r;
        // 3 (m.r^) r^ - m with m along z: radial 3 cos sin, axial 3 cos^2 - 1.
        return new FieldVector(c * 3.0 * cosT * sinT, c * (3.0 * cosT * cosT - 1.0));
    }
}
