using FreqReadout.Host.Simulation;
using MathNet.Numerics;

namespace FreqReadout.Tests.Simulation;

public class LoopFieldTests
{
    [Theory]
    [InlineData(0.0)]
    [InlineData(0.05)]
    [InlineData(0.3)]
    public void OffAxisField_AtZeroOffset_EqualsOnAxisBiotSavart(double z)
    {
        // docs/references.md: on-axis H/I = N R^2 / (2 (R^2 + z^2)^(3/2)) (Biot-Savart). The elliptic form at rho = 1e-9 m
        // and at rho = 1e-4 m (exact branch) must agree; 1e-7 relative (rho^2/R^2 terms).
        double onAxis = LoopField.OnAxisPerM(30, 0.1, z);
        Assert.Equal(onAxis, LoopField.Field(30, 0.1, 1e-9, z).AxialPerM, onAxis * 1e-12);
        Assert.Equal(onAxis, LoopField.Field(30, 0.1, 1e-5, z).AxialPerM, onAxis * 1e-7);
        Assert.Equal(0.0, LoopField.Field(30, 0.1, 0.0, z).RadialPerM, 1e-12);
        // Centre of the loop: H = N / (2R) (Biot-Savart); 1e-12 relative.
        Assert.Equal(30 / 0.2, LoopField.OnAxisPerM(30, 0.1, 0), 1e-10);
    }

    [Theory]
    [InlineData(2.0, 1.0)]
    [InlineData(3.0, 0.0)]
    [InlineData(0.5, 4.0)]
    public void OffAxisField_FarAway_EqualsDipoleField(double rho, double z)
    {
        // Magnetic dipole far field (3 (m.r^) r^ - m)/(4 pi r^3), m = N I pi R^2 (standard result, from memory).
        // At r >= 20 R the loop differs from the dipole by order (R/r)^2: tolerance 0.5 % of |H|.
        var exact = LoopField.Field(10, 0.1, rho, z);
        var dipole = LoopField.DipoleField(10, 0.1, rho, z);
        double scale = dipole.Magnitude;
        Assert.Equal(dipole.AxialPerM, exact.AxialPerM, scale * 5e-3);
        Assert.Equal(dipole.RadialPerM, exact.RadialPerM, scale * 5e-3);
    }

    [Theory]
    [InlineData(0.05, 0.02)]
    [InlineData(0.09, 0.01)]
    [InlineData(0.15, -0.04)]
    [InlineData(0.02, 0.3)]
    public void OffAxisField_AgreesWithDirectBiotSavartQuadrature(double rho, double z)
    {
        // Independent check: Biot-Savart integrated numerically around the loop (MathNet double-exponential quadrature).
        // dH = I dl x r / (4 pi |r|^3), loop R in the plane z = 0, field point (rho, 0, z). 1e-8 relative.
        const double r0 = 0.1;
        double hz = Integrate.DoubleExponential(p =>
        {
            double dx = rho - r0 * Math.Cos(p);
            double dy = -r0 * Math.Sin(p);
            double d2 = dx * dx + dy * dy + z * z;
            // dl = R(-sin p, cos p, 0) dp; (dl x r)_z = R(-sin p * dy - cos p * dx)
            return r0 * (-Math.Sin(p) * dy - Math.Cos(p) * dx) / (4 * Math.PI * d2 * Math.Sqrt(d2));
        }, 0, 2 * Math.PI, 1e-12);
        double hx = Integrate.DoubleExponential(p =>
        {
            double dx = rho - r0 * Math.Cos(p);
            double dy = -r0 * Math.Sin(p);
            double d2 = dx * dx + dy * dy + z * z;
            // (dl x r)_x = R cos p * z
            return r0 * Math.Cos(p) * z / (4 * Math.PI * d2 * Math.Sqrt(d2));
        }, 0, 2 * Math.PI, 1e-12);
        var f = LoopField.Field(1, r0, rho, z);
        double scale = Math.Sqrt(hz * hz + hx * hx);
        Assert.Equal(-hz, -f.AxialPerM, scale * 1e-8);
        Assert.Equal(hx, f.RadialPerM, scale * 1e-8);
    }
}
