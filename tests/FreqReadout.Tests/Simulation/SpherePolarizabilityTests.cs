using System.Numerics;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Simulation;

public class SpherePolarizabilityTests
{
    // All check values: J. R. Wait, Geophysics 16:666, 1951 (form as in Ledger and Lionheart's polarizability papers), docs/references.md "Coil and target
    // physics", M / (2 pi a^3), a = 1 cm, calculated; these use sigma = 5.8e7 (copper) and 6e6 (steel), not the presets.
    // Tolerance 2e-5 absolute: the values are given to 5 decimals.
    private const double Tol = 2e-5;

    [Theory]
    [InlineData(1e3, -0.68657, -0.24791)]
    [InlineData(1e4, -0.90087, -0.09258)]
    [InlineData(1e6, -0.99009, -0.00985)]
    public void Copper_CheckValues(double f, double re, double im)
    {
        Complex m = SpherePolarizability.Normalised(0.01, 5.8e7, 1.0, f);
        Assert.Equal(re, m.Real, Tol);
        Assert.Equal(im, m.Imaginary, Tol);
        // Non-magnetic closed form -[1 - 3/(ka)^2 + 3 cot(ka)/(ka)] (same source) gives the same; 1e-12.
        Complex n = SpherePolarizability.NormalisedNonMagnetic(0.01, 5.8e7, f);
        Assert.Equal(m.Real, n.Real, 1e-12);
        Assert.Equal(m.Imaginary, n.Imaginary, 1e-12);
    }

    [Theory]
    [InlineData(100.0, 1.85220, -0.12883)]
    [InlineData(1e3, 1.55393, -0.33978)]
    [InlineData(1e4, 0.82255, -0.59647)]
    public void Steel_CheckValues(double f, double re, double im)
    {
        Complex m = SpherePolarizability.Normalised(0.01, 6e6, 100.0, f);
        Assert.Equal(re, m.Real, Tol);
        Assert.Equal(im, m.Imaginary, Tol);
    }

    [Fact]
    public void Limits()
    {
        // Same source: w -> 0: 2 (mu_r - 1)/(mu_r + 2) = 1.94118 for mu_r = 100; w -> infinity: -1. 1e-5.
        Assert.Equal(1.94118, SpherePolarizability.LowFrequencyLimit(100), 1e-5);
        Assert.Equal(1.94118, SpherePolarizability.Normalised(0.01, 6e6, 100, 1e-3).Real, 1e-5);
        Assert.Equal(0.0, SpherePolarizability.Normalised(0.01, 5.8e7, 1, 1e-3).Real, 1e-5);
        Assert.Equal(-1.0, SpherePolarizability.Normalised(0.01, 5.8e7, 1, 1e12).Real, 1e-4);
        Assert.Equal(-1.0, SpherePolarizability.Normalised(0.01, 6e6, 100, 1e14).Real, 1e-3);
    }

    [Fact]
    public void ImaginaryPartNeverPositive()
    {
        // Same source: Im M <= 0 (losses), over 1 Hz..100 MHz, several materials and sizes.
        foreach (double mur in new[] { 1.0, 10.0, 100.0, 1000.0 })
        {
            foreach (double a in new[] { 0.001, 0.01, 0.1 })
            {
                for (double f = 1; f <= 1e8; f *= 1.7)
                {
                    Complex m = SpherePolarizability.Normalised(a, 6e6, mur, f);
                    Assert.True(m.Imaginary <= 1e-15, $"Im M = {m.Imaginary} at mu_r {mur}, a {a}, f {f}");
                    Assert.False(double.IsNaN(m.Real) || double.IsInfinity(m.Real));
                }
            }
        }
    }

    [Fact]
    public void LargeLossySphere_NoOverflow_AsymptoticForm()
    {
        // Issue 4: a 5 cm copper sphere at 1 MHz: |ka| ~ 770, so sin/cos of ka overflow double range. The asymptotic form
        // (cot -> i, j2/j0 -> -1) must give finite values near the high-frequency limit -1 (docs/references.md limit), with the
        // asymptotic value itself, M/(2 pi a^3) = 3/(ka)^2 - 1 - 3 cot(ka)/(ka) with cot -> i (derived from the docs/references.md
        // non-magnetic form); 1e-4.
        double a = 0.05;
        double f = 1e6;
        Complex m = SpherePolarizability.Normalised(a, 5.8e7, 1.0, f);
        Assert.True(double.IsFinite(m.Real) && double.IsFinite(m.Imaginary));
        double delta = SpherePolarizability.SkinDepthM(f, 5.8e7, 1.0);
        Complex ka = new Complex(a / delta, -a / delta);
        Complex expected = -1.0 - 3.0 * Complex.ImaginaryOne / ka + 3.0 / (ka * ka);
        Assert.Equal(expected.Real, m.Real, 1e-4);
        Assert.Equal(expected.Imaginary, m.Imaginary, 1e-4);
        Assert.True(m.Imaginary <= 0);
        // And the steel sphere of the same size at 1 MHz, mu_r 100: far above its crossover (about 6 kHz by the docs/references.md
        // estimate 1.641 mu_r / (pi mu0 sigma a^2)), so finite with -1 < Re M < 0.
        Complex s = SpherePolarizability.Normalised(a, 6.99e6, 100.0, f);
        Assert.True(double.IsFinite(s.Real) && double.IsFinite(s.Imaginary));
        Assert.True(s.Real < 0 && s.Real > -1.0);
    }

    [Fact]
    public void SkinDepth_CopperAt100kHz()
    {
        // docs/references.md: skin depth sqrt(2/(w mu sigma)), copper 1.678e-8 ohm m at 100 kHz: 0.20617 mm; 0.00001 mm.
        Assert.Equal(0.20617e-3, SpherePolarizability.SkinDepthM(1e5, 1.0 / 1.678e-8, 1.0), 1e-8);
    }
}
