using FreqReadout.Counting;
using FreqReadout.Numerics;

namespace FreqReadout.Tests.Counting;

public class QuantisationErrorModelTests
{
    [Fact]
    public void SinPi_CosPi_and_Floor_agree_with_the_runtime()
    {
        var rng = new Random(11);
        for (int k = 0; k < 20000; k++)
        {
            double x = (rng.NextDouble() - 0.5) * Math.Pow(10, rng.Next(-6, 6));
            Assert.Equal(Math.Sin(Math.PI * x), ScalarMath.SinPi(x), 1e-12 * Math.Max(1, Math.Abs(x)));
            Assert.Equal(Math.Cos(Math.PI * x), ScalarMath.CosPi(x), 1e-12 * Math.Max(1, Math.Abs(x)));
            Assert.Equal(Math.Floor(x * 1000), ScalarMath.Floor(x * 1000));
        }

        Assert.Equal(0.0, ScalarMath.SinPi(3));
        Assert.Equal(1.0, ScalarMath.SinPi(0.5));
        Assert.Equal(-3.0, ScalarMath.Floor(-2.5));
        Assert.True(double.IsNaN(ScalarMath.SinPi(double.NaN)));
    }

    /// <summary>
    /// S(J) = sum_m exp(-4 pi^2 m^2 J^2) / m^2 against a brute-force sum of 10^6 terms (plus the
    /// 1/M tail) with System.Math; pi^2/6 at J = 0 (Euler's Basel sum, from memory).
    /// </summary>
    [Theory]
    [InlineData(0.0)]
    [InlineData(0.001)]
    [InlineData(0.02)]
    [InlineData(0.05)]
    [InlineData(0.0999)]
    [InlineData(0.1)]
    [InlineData(0.2)]
    [InlineData(0.3)]
    [InlineData(1.0)]
    public void Harmonic_sum_matches_a_brute_force_sum(double j)
    {
        const int terms = 1_000_000;
        double sum = 0;
        for (int m = terms; m >= 1; m--) sum += Math.Exp(-4 * Math.PI * Math.PI * (double)m * m * j * j) / ((double)m * m);
        if (j == 0) sum += 1.0 / terms;
        Assert.Equal(sum, QuantisationErrorModel.HarmonicSum(j), 2e-9);
    }

    /// <summary>
    /// Limits of the model: no jitter, everything is deterministic (white 0; span variance 1/2, the
    /// held-at-a-tick-boundary case, above the moving-phase 1/4 = max alpha (1 - alpha)); much jitter, the
    /// white model sigma^2 = J^2 + 1/12 and a span 2 J^2 + 1/6 (Rubiola 2005's white-noise figures).
    /// </summary>
    [Fact]
    public void Model_limits_are_the_sawtooth_without_jitter_and_the_white_model_with_much()
    {
        var m = new QuantisationErrorModel(0);
        Assert.Equal(0.0, m.WhiteVariance, 1e-15);
        Assert.Equal(0.5, m.ReciprocalSpanVariance, 1e-12);
        Assert.Equal(0.5, m.PeakDeterministic);
        m.Configure(2.0);
        Assert.Equal(4 + 1.0 / 12, m.WhiteVariance, 1e-12);
        Assert.Equal(2 * (4 + 1.0 / 12), m.ReciprocalSpanVariance, 1e-9);
        Assert.True(m.PeakDeterministic < 1e-30);
        Assert.Equal(0.0, m.RegressionDeterministicVariance(0.001, 1000, 1000.0 * (1000.0 * 1000 - 1) / 12), 1e-30);
        // The gain bound is an upper bound on the exact gain of the least-squares slope at every frequency.
        const int n = 157;
        double sxx = n * ((double)n * n - 1) / 12;
        for (int k = 1; k < 5000; k++)
        {
            double nu = k / 10000.0;
            double re = 0, im = 0;
            for (int i = 0; i < n; i++)
            {
                double c = (i - (n - 1) / 2.0) / sxx;
                re += c * Math.Cos(2 * Math.PI * nu * i);
                im += c * Math.Sin(2 * Math.PI * nu * i);
            }

            Assert.True(Math.Sqrt(re * re + im * im) <= QuantisationErrorModel.Gain(nu, n, sxx) * (1 + 1e-9), "nu " + nu);
        }
    }

    /// <summary>
    /// The held-phase span bound: max over tau of Var(floor(tau + n)), n Gaussian of rms J, computed
    /// exactly from the normal distribution (MathNet's Erf, an independent implementation) on a fine
    /// grid of tau, never exceeds J^2 + 1/12 + exp(-6 J^2) / 6.
    /// </summary>
    [Theory]
    [InlineData(0.01)]
    [InlineData(0.05)]
    [InlineData(0.1)]
    [InlineData(0.2)]
    [InlineData(0.3)]
    [InlineData(0.5)]
    [InlineData(0.7)]
    [InlineData(1.0)]
    [InlineData(3.0)]
    public void Held_phase_variance_of_one_dithered_quantisation_is_within_the_bound(double j)
    {
        double Phi(double x) => 0.5 * (1 + MathNet.Numerics.SpecialFunctions.Erf(x / Math.Sqrt(2)));
        double worst = 0;
        for (int g = 0; g <= 1000; g++)
        {
            double tau = g / 1000.0;
            double m1 = 0, m2 = 0;
            int span = (int)(10 * j) + 3;
            for (int k = -span; k <= span; k++)
            {
                double p = Phi((k + 1 - tau) / j) - Phi((k - tau) / j);
                m1 += k * p;
                m2 += (double)k * k * p;
            }

            worst = Math.Max(worst, m2 - m1 * m1);
        }

        double bound = j * j + 1.0 / 12 + Math.Exp(-6 * j * j) / 6;
        Assert.True(worst <= bound * (1 + 1e-9), $"J {j}: max variance {worst} above the bound {bound}");
        Assert.True(new QuantisationErrorModel(j).ReciprocalSpanVariance >= 2 * worst * (1 - 1e-9));
    }
}
