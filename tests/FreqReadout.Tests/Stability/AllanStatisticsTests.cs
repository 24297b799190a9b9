using System.Globalization;
using FreqReadout.Host.Stability;

namespace FreqReadout.Tests.Stability;

/// <summary>
/// The Allan statistics against NIST SP 1065 (W. J. Riley, 2008) Tables 30 and 31 (Data/Stability, relative 1e-4),
/// and against two closed forms: white phase noise gives sigma_y = sqrt(3) sigma_x / tau for the overlapping deviation
/// (SP 1065 Table 8's white-PM response, from memory; statistical tolerance from the number of terms), and a linear
/// frequency drift D gives sigma_y = D tau / sqrt(2) exactly (the second difference of a parabola).
/// </summary>
public sealed class AllanStatisticsTests
{
    private static readonly Dictionary<string, string> Table = File.ReadAllLines(Path.Combine(AppContext.BaseDirectory, "Data", "Stability", "nist-sp1065-tables-30-31.txt"))
        .Where(l => l.Length > 0 && l[0] != '#')
        .Select(l => l.Split('=', 2))
        .ToDictionary(p => p[0].Trim(), p => p[1].Trim());

    private static double Value(string key) => double.Parse(Table[key], CultureInfo.InvariantCulture);

    private static void Near(double expected, double actual) => Assert.InRange(actual, expected * (1 - 1e-4), expected * (1 + 1e-4));

    [Fact]
    public void Table_30_nine_point_suite()
    {
        double[] y = Table["table30.y"].Split(',').Select(v => double.Parse(v, CultureInfo.InvariantCulture)).ToArray();
        double[] x = AllanStatistics.PhaseFromFrequency(y, 1.0);
        Near(Value("table30.adev.1"), AllanStatistics.Deviation(x, 1.0, 1));
        Near(Value("table30.adev.2"), AllanStatistics.Deviation(x, 1.0, 2));
        Near(Value("table30.oadev.2"), AllanStatistics.OverlappingDeviation(x, 1.0, 2));
        Near(Value("table30.mdev.2"), AllanStatistics.ModifiedDeviation(x, 1.0, 2));
    }

    [Fact]
    public void Table_31_thousand_point_suite()
    {
        long n = long.Parse(Table["table31.n0"], CultureInfo.InvariantCulture);
        var y = new double[1000];
        for (int i = 0; i < y.Length; i++)
        {
            y[i] = n / 2147483647.0;
            n = 16807 * n % 2147483647;
        }

        double[] x = AllanStatistics.PhaseFromFrequency(y, 1.0);
        foreach (int m in new[] { 1, 10, 100 })
        {
            Near(Value($"table31.adev.{m}"), AllanStatistics.Deviation(x, 1.0, m));
            Near(Value($"table31.oadev.{m}"), AllanStatistics.OverlappingDeviation(x, 1.0, m));
            Near(Value($"table31.mdev.{m}"), AllanStatistics.ModifiedDeviation(x, 1.0, m));
        }
    }

    [Fact]
    public void Linear_frequency_drift_gives_d_tau_over_root_2_exactly()
    {
        const double d = 1e-3;    // per tau0, tau0 = 1 s
        double[] y = Enumerable.Range(0, 400).Select(i => d * i).ToArray();
        double[] x = AllanStatistics.PhaseFromFrequency(y, 1.0);
        foreach (int m in new[] { 1, 4, 16, 64 })
        {
            Assert.Equal(d * m / Math.Sqrt(2), AllanStatistics.OverlappingDeviation(x, 1.0, m), 9);
        }
    }

    [Fact]
    public void White_phase_noise_gives_root_3_sigma_x_over_tau()
    {
        var rng = new Random(1065);
        const double sigmaX = 1e-6;
        const double tau0 = 1e-3;
        double[] x = Enumerable.Range(0, 200_000).Select(_ => sigmaX * Gaussian(rng)).ToArray();
        foreach (int m in new[] { 1, 8, 64 })
        {
            double expected = Math.Sqrt(3) * sigmaX / (m * tau0);
            // N - 2m overlapping terms, strongly correlated only within 2m: relative error about sqrt(2m / (N - 2m)); 4 of those.
            double tolerance = 4 * Math.Sqrt(2.0 * m / (x.Length - (2 * m)));
            Assert.InRange(AllanStatistics.OverlappingDeviation(x, tau0, m) / expected, 1 - tolerance, 1 + tolerance);
        }
    }

    [Fact]
    public void Modified_deviation_running_sum_equals_the_direct_double_sum()
    {
        var rng = new Random(7);
        double[] x = Enumerable.Range(0, 20_000).Select(_ => Gaussian(rng)).ToArray();
        foreach (int m in new[] { 1, 3, 50, 3000 })
        {
            int n = x.Length;
            double sum = 0;
            for (int j = 0; j <= n - (3 * m); j++)
            {
                double inner = 0;
                for (int i = j; i < j + m; i++)
                {
                    inner += x[i + (2 * m)] - (2 * x[i + m]) + x[i];
                }

                sum += inner * inner;
            }

            double direct = Math.Sqrt(sum / (2.0 * m * m * m * m * (n - (3 * m) + 1)));
            Assert.Equal(1, AllanStatistics.ModifiedDeviation(x, 1.0, m) / direct, 9);
        }
    }

    [Fact]
    public void Too_few_points_give_nan()
    {
        double[] x = { 0, 1, 2, 3 };
        Assert.True(double.IsNaN(AllanStatistics.OverlappingDeviation(x, 1, 2)));
        Assert.True(double.IsNaN(AllanStatistics.ModifiedDeviation(x, 1, 2)));
        Assert.True(double.IsNaN(AllanStatistics.Deviation(x, 1, 0)));
    }

    private static double Gaussian(Random rng) => Math.Sqrt(-2 * Math.Log(1 - rng.NextDouble())) * Math.Cos(2 * Math.PI * rng.NextDouble());
}
