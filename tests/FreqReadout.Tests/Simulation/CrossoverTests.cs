using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Simulation;

public class CrossoverTests
{
    [Fact]
    public void OneCentimetreSteel()
    {
        // docs/references.md ferrous crossover (Re M = 0, calculated, Wait 1951 model): mu_r = 100, a = 1 cm, sigma = 6e6
        // -> 69.25 kHz; tolerance 0.01 kHz (4 significant figures given).
        double fx = SpherePolarizability.CrossoverFrequencyHz(0.01, 6e6, 100);
        Assert.Equal(69.25e3, fx, 10.0);
        Assert.Equal(0.0, SpherePolarizability.Normalised(0.01, 6e6, 100, fx).Real, 1e-9);
    }

    [Theory]
    [InlineData(0.005, 237.8e3, 0.1e3)]
    [InlineData(0.007, 121.3e3, 0.1e3)]
    [InlineData(0.01, 59.45e3, 0.01e3)]
    [InlineData(0.02, 14.86e3, 0.01e3)]
    public void SizeSweep(double radius, double expectedHz, double tolHz)
    {
        // Same source: sigma = 6.99e6, mu_r = 100 size sweep; tolerance half a unit of the last given digit.
        Assert.Equal(expectedHz, SpherePolarizability.CrossoverFrequencyHz(radius, 6.99e6, 100), tolHz / 2 + 1e-9);
    }

    [Fact]
    public void FallsWithSquareOfSize()
    {
        // Same source: f_x ~ 1.641 mu_r / (pi mu0 sigma a^2); root and estimate agree within 1 % (estimate is asymptotic).
        double fx = SpherePolarizability.CrossoverFrequencyHz(0.01, 6.99e6, 100);
        Assert.Equal(SpherePolarizability.CrossoverEstimateHz(0.01, 6.99e6, 100), fx, fx * 0.01);
        double ratio = SpherePolarizability.CrossoverFrequencyHz(0.005, 6.99e6, 100) / SpherePolarizability.CrossoverFrequencyHz(0.01, 6.99e6, 100);
        Assert.Equal(4.0, ratio, 0.02);
    }

    [Theory]
    [InlineData(1.05)]
    [InlineData(2.0)]
    [InlineData(10.0)]
    [InlineData(1000.0)]
    public void RootFinder_FindsReMZero_OverAWideRangeOfPermeability(double mur)
    {
        // Re M changes sign exactly once (from 2 (mu_r - 1)/(mu_r + 2) > 0 to -1, Wait 1951 limits): the root must make it 0.
        double fx = SpherePolarizability.CrossoverFrequencyHz(0.005, 6.99e6, mur);
        Assert.True(fx > 0 && double.IsFinite(fx));
        Assert.Equal(0.0, SpherePolarizability.Normalised(0.005, 6.99e6, mur, fx).Real, 1e-8);
        Assert.True(SpherePolarizability.Normalised(0.005, 6.99e6, mur, fx * 0.9).Real > 0);
        Assert.True(SpherePolarizability.Normalised(0.005, 6.99e6, mur, fx * 1.1).Real < 0);
    }

    [Fact]
    public void NonMagneticHasNoCrossover()
    {
        Assert.True(double.IsNaN(SpherePolarizability.CrossoverFrequencyHz(0.01, 5.8e7, 1.0)));
    }

    [Fact]
    public void TradeSanity_SmallIronBlindSpotNear130kHz()
    {
        // Common practice, no source: a detector run at about 130-135 kHz is nearly blind to small iron parts. Wait-model
        // crossover of a steel sphere sigma 6.99e6, mu_r 100 at a radius of about 6.7 mm lands at 130-135 kHz.
        double fx = SpherePolarizability.CrossoverFrequencyHz(0.0067, 6.99e6, 100);
        Assert.InRange(fx, 130e3, 135e3);
    }
}
