using FreqReadout.Host.Stability;

namespace FreqReadout.Tests.Stability;

/// <summary>
/// The 68.3 % intervals hold their coverage where the true deviation is known in closed form (invented noise, seeded):
/// white frequency noise of sigma per tau0 has sigma_y(m tau0) = sigma / sqrt(m); white phase noise of sigma_x has
/// sigma_y(tau) = sqrt(3) sigma_x / tau (SP 1065, from memory; exact in expectation: E[(x2 - 2 x1 + x0)^2] = 6 sigma_x^2).
/// Over 300 runs the share of intervals holding the truth is 0.683 within 4 binomial standard errors (0.054).
/// </summary>
public sealed class AllanConfidenceTests
{
    [Theory]
    [InlineData(NoiseType.WhiteFrequency, 1)]
    [InlineData(NoiseType.WhiteFrequency, 8)]
    [InlineData(NoiseType.WhitePhase, 1)]
    [InlineData(NoiseType.WhitePhase, 8)]
    public void Intervals_cover_the_true_deviation_about_68_percent_of_the_time(NoiseType noise, int m)
    {
        var rng = new Random(683 + m + (int)noise);
        const int runs = 300;
        const int n = 1001;
        int covered = 0;
        for (int run = 0; run < runs; run++)
        {
            double[] x;
            double truth;
            if (noise == NoiseType.WhiteFrequency)
            {
                double[] y = Enumerable.Range(0, n - 1).Select(_ => Gaussian(rng)).ToArray();
                x = AllanStatistics.PhaseFromFrequency(y, 1.0);
                truth = 1 / Math.Sqrt(m);
            }
            else
            {
                x = Enumerable.Range(0, n).Select(_ => Gaussian(rng)).ToArray();
                truth = Math.Sqrt(3) / m;
            }

            double adev = AllanStatistics.OverlappingDeviation(x, 1.0, m);
            double edf = AllanConfidence.EquivalentDegreesOfFreedom(noise, n, m);
            AllanConfidence.Interval(adev, edf, StabilityAnalysis.Confidence, out double low, out double high);
            if (low <= truth && truth <= high)
            {
                covered++;
            }
        }

        double share = (double)covered / runs;
        double se = Math.Sqrt(0.683 * 0.317 / runs);
        Assert.InRange(share, 0.683 - (4 * se), 0.683 + (4 * se));
    }

    [Fact]
    public void White_noise_is_identified_from_the_modified_deviation_slope()
    {
        var rng = new Random(5);
        double[] phase = Enumerable.Range(0, 100_000).Select(_ => Gaussian(rng)).ToArray();
        double[] frequency = AllanStatistics.PhaseFromFrequency(Enumerable.Range(0, 100_000).Select(_ => Gaussian(rng)).ToArray(), 1.0);
        StabilityAnalysis pm = StabilityAnalysis.Of(phase, 1.0);
        StabilityAnalysis fm = StabilityAnalysis.Of(frequency, 1.0);
        // The first octaves, where the estimate has many degrees of freedom.
        Assert.All(pm.Rows.Take(6), r => Assert.Equal(NoiseType.WhitePhase, r.Noise));
        Assert.All(fm.Rows.Take(6), r => Assert.Equal(NoiseType.WhiteFrequency, r.Noise));
    }

    [Fact]
    public void Long_averaging_times_with_few_spans_name_no_noise_type_and_keep_honest_intervals()
    {
        // White FM, unit variance per tau0: the true Allan deviation at m is 1/sqrt(m) (NIST SP 1065 Table 7 slope, from
        // memory). At m = 32 in 1024 points the slope to m = 64 rests on 16 spans: the type is not named, white FM's
        // degrees of freedom are used, and the 68.3 % interval covers the truth about 68.3 % of the time (300 runs,
        // within 4 binomial standard errors). A type guessed from that slope (white PM now and then) gave far too many.
        var rng = new Random(11);
        const int runs = 300;
        const int m = 32;
        int covered = 0;
        for (int run = 0; run < runs; run++)
        {
            double[] x = AllanStatistics.PhaseFromFrequency(Enumerable.Range(0, 1024).Select(_ => Gaussian(rng)).ToArray(), 1.0);
            StabilityPoint row = StabilityAnalysis.Of(x, 1.0).Rows.Single(r => r.M == m);
            Assert.Equal(NoiseType.Unknown, row.Noise);
            Assert.Equal(AllanConfidence.EquivalentDegreesOfFreedom(NoiseType.WhiteFrequency, x.Length, m), row.Edf, 9);
            double truth = 1 / Math.Sqrt(m);
            covered += row.AdevLow <= truth && truth <= row.AdevHigh ? 1 : 0;
        }

        double share = (double)covered / runs;
        double se = Math.Sqrt(0.683 * 0.317 / runs);
        Assert.InRange(share, 0.683 - (4 * se), 0.683 + (4 * se));
    }

    private static double Gaussian(Random rng) => Math.Sqrt(-2 * Math.Log(1 - rng.NextDouble())) * Math.Cos(2 * Math.PI * rng.NextDouble());
}
