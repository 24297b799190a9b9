using FreqReadout.Tracking;
using MathNet.Numerics.Distributions;

namespace FreqReadout.Tests.Tracking;

public class ForecastRunMonitorTests
{
    [Fact]
    public void The_mean_is_that_of_the_last_five_consecutive_errors_and_a_gap_starts_a_new_run()
    {
        var monitor = new ForecastRunMonitor(64);
        for (int i = 1; i <= 4; i++)
        {
            monitor.Add(i * 0.1, 0.1, i);
            Assert.False(monitor.Ready);
            Assert.Equal(0.0, monitor.MeanHz);
        }

        monitor.Add(0.5, 0.1, 5);
        Assert.True(monitor.Ready);
        Assert.Equal(3.0, monitor.MeanHz, 12); // (1 + 2 + 3 + 4 + 5) / 5
        monitor.Add(0.6, 0.1, 11);
        Assert.Equal(5.0, monitor.MeanHz, 12); // (2 + 3 + 4 + 5 + 11) / 5
        Assert.Equal(2, monitor.Samples);

        monitor.Add(0.9, 0.1, 1); // 0.3 s after the last: more than 1.5 spans, a new run
        Assert.False(monitor.Ready);
        Assert.Equal(2, monitor.Samples);

        monitor.Add(double.NaN, 0.1, 1);
        monitor.ClearRun();
        Assert.False(monitor.Ready);
        Assert.Equal(2, monitor.Samples);
        monitor.Clear();
        Assert.Equal(0, monitor.Samples);
        Assert.Equal(0.0, monitor.NoiseHz);
    }

    [Fact]
    public void On_white_errors_the_scatter_is_sigma_over_root_five_and_a_leaning_run_is_seen()
    {
        // The mean of K independent errors of sigma has sigma / sqrt(K) (the variance of a mean, from memory); 1.4826
        // median |x| estimates the sigma of a normal variable (Rousseeuw and Croux, JASA 88:1273, 1993, the MAD consistency factor; from memory).
        const double sigma = 0.02;
        var monitor = new ForecastRunMonitor(512);
        var normal = new Normal(0, sigma, new Random(7));
        double t = 0;
        for (int i = 0; i < 4000; i++)
        {
            t += 0.1;
            monitor.Add(t, 0.1, normal.Sample());
        }

        double expected = sigma / Math.Sqrt(ForecastRunMonitor.Readings);
        Assert.InRange(monitor.NoiseHz, 0.85 * expected, 1.15 * expected); // 512 overlapping means: a few % scatter, 15 % allowed

        // A weak pass: five errors of 2 sigma each are 4.5 scatters of the mean, while no single one reaches 3 sigma.
        bool leanedOnNoise = false;
        for (int i = 0; i < 200; i++)
        {
            t += 0.1;
            monitor.Add(t, 0.1, normal.Sample());
            leanedOnNoise |= monitor.Leans(5.0, 20);
        }

        Assert.False(leanedOnNoise); // 5 scatters: about 6e-7 a reading for a normal mean, none in 200
        for (int i = 0; i < 5; i++)
        {
            t += 0.1;
            monitor.Add(t, 0.1, 2 * sigma);
        }

        Assert.True(monitor.Leans(4.0, 20));
        Assert.False(monitor.Leans(4.0, 100_000)); // too few means for the scatter
    }
}
