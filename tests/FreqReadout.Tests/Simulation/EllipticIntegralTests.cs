using FreqReadout.Host.Simulation;
using MathNet.Numerics;

namespace FreqReadout.Tests.Simulation;

public class EllipticIntegralTests
{
    [Fact]
    public void ZeroParameterGivesHalfPi()
    {
        // K(0) = E(0) = pi/2 by the definition (integrand 1); 1e-15.
        Assert.Equal(Math.PI / 2, EllipticIntegrals.CompleteK(0), 1e-15);
        Assert.Equal(Math.PI / 2, EllipticIntegrals.CompleteE(0), 1e-15);
        Assert.Equal(1.0, EllipticIntegrals.CompleteE(1), 1e-15);
    }

    [Fact]
    public void KnownValuesAtHalf()
    {
        // K(m = 1/2) = 1.854074677301372, E(1/2) = 1.350643881047675 (Abramowitz and Stegun, Handbook of Mathematical
        // Functions, 1964, Table 17.1, from memory); 1e-13.
        Assert.Equal(1.854074677301372, EllipticIntegrals.CompleteK(0.5), 1e-13);
        Assert.Equal(1.350643881047675, EllipticIntegrals.CompleteE(0.5), 1e-13);
    }

    [Theory]
    [InlineData(0.01)]
    [InlineData(0.3)]
    [InlineData(0.7)]
    [InlineData(0.95)]
    [InlineData(0.999)]
    public void AgreesWithNumericalQuadratureOfTheDefinition(double m)
    {
        // Definitions K = int_0^{pi/2} (1 - m sin^2 t)^(-1/2) dt, E = int_0^{pi/2} (1 - m sin^2 t)^(1/2) dt, integrated
        // with MathNet's double-exponential quadrature (an independent computation); 1e-9 relative.
        double k = Integrate.DoubleExponential(t => 1 / Math.Sqrt(1 - m * Math.Sin(t) * Math.Sin(t)), 0, Math.PI / 2, 1e-13);
        double e = Integrate.DoubleExponential(t => Math.Sqrt(1 - m * Math.Sin(t) * Math.Sin(t)), 0, Math.PI / 2, 1e-13);
        Assert.Equal(k, EllipticIntegrals.CompleteK(m), k * 1e-9);
        Assert.Equal(e, EllipticIntegrals.CompleteE(m), e * 1e-9);
    }
}
