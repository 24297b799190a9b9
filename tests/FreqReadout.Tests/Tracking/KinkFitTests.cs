using FreqReadout.Numerics;
using MathNet.Numerics.LinearAlgebra;

namespace FreqReadout.Tests.Tracking;

/// <summary>
/// The kink fit of the two-sided check (a drift that keeps its quadratic and gains a new rate at an unknown time)
/// against ordinary least squares computed by MathNet.Numerics (QR solve of the design matrix [1, u, u^2,
/// max(0, t - t_k)]) at every kink time of the grid. The data are synthetic (invented) drifts with white noise.
/// </summary>
public class KinkFitTests
{
    private static (double[] T, double[] Y, bool[] Late) Data(int seed, double kinkSeconds, double rateChange)
    {
        var rng = new Random(seed);
        var t = new List<double>();
        var y = new List<double>();
        var late = new List<bool>();
        for (int i = 0; i < 200; i++)
        {
            double ti = 0.1 * i;
            bool early = ti < 8.0;
            bool after = ti >= 13.0;
            if (!early && !after)
            {
                continue; // the middle holds the pass and is left out of the fit
            }

            double drift = 3.0 + (0.8 * ti) - (0.01 * ti * ti) + (ti > kinkSeconds ? rateChange * (ti - kinkSeconds) : 0.0);
            t.Add(ti);
            y.Add(drift + (0.01 * Normal(rng)));
            late.Add(after);
        }

        return (t.ToArray(), y.ToArray(), late.ToArray());
    }

    private static double Normal(Random rng)
    {
        return Math.Sqrt(-2.0 * Math.Log(1.0 - rng.NextDouble())) * Math.Cos(2.0 * Math.PI * rng.NextDouble());
    }

    private static (Vector<double> Coefficients, double Rss) Reference(double[] t, double[] y, double origin, double kink)
    {
        Matrix<double> x = Matrix<double>.Build.Dense(t.Length, 4, (i, j) =>
        {
            double u = t[i] - origin;
            return j switch
            {
                0 => 1.0,
                1 => u,
                2 => u * u,
                _ => Math.Max(0.0, t[i] - kink),
            };
        });
        Vector<double> v = Vector<double>.Build.DenseOfArray(y);
        Vector<double> c = x.QR().Solve(v);
        Vector<double> r = v - (x * c);
        return (c, r.DotProduct(r));
    }

    [Theory]
    [InlineData(1, 10.0, 0.5)]
    [InlineData(2, 9.2, -1.5)]
    [InlineData(3, 12.1, 0.05)]
    public void Matches_least_squares_at_the_kink_it_picks_and_picks_the_least_residual(int seed, double kinkSeconds, double rateChange)
    {
        var (t, y, late) = Data(seed, kinkSeconds, rateChange);
        var fit = new KinkFit();
        double origin = t[^1];
        fit.Clear(origin);
        for (int i = 0; i < t.Length; i++)
        {
            if (late[i])
            {
                fit.AddLate(t[i], y[i]);
            }
            else
            {
                fit.AddEarly(t[i], y[i]);
            }
        }

        Assert.True(fit.TrySolve(8.0, 13.0, 0.05));

        // The grid minimum of the residual sum of squares, recomputed by MathNet at every grid point.
        double bestRss = double.MaxValue;
        double bestKink = double.NaN;
        for (int k = 0; k <= 100; k++)
        {
            double tk = 8.0 + (0.05 * k);
            double rss = Reference(t, y, origin, tk).Rss;
            if (rss < bestRss)
            {
                bestRss = rss;
                bestKink = tk;
            }
        }

        Assert.Equal(bestKink, fit.KinkSeconds, 6);
        double fitRss = t.Select((ti, i) => Math.Pow(y[i] - fit.Evaluate(ti), 2)).Sum();
        Assert.Equal(bestRss, fitRss, 8);
        var (c, _) = Reference(t, y, origin, fit.KinkSeconds);
        Assert.Equal(c[3], fit.RateChange, 6);
        for (double ti = 0; ti < 20; ti += 0.37)
        {
            double expected = c[0] + (c[1] * (ti - origin)) + (c[2] * (ti - origin) * (ti - origin)) + (c[3] * Math.Max(0.0, ti - fit.KinkSeconds));
            Assert.Equal(expected, fit.Evaluate(ti), 6);

            // The rate: the derivative of the same least-squares curve (MathNet's coefficients).
            double expectedSlope = c[1] + (2.0 * c[2] * (ti - origin)) + (ti > fit.KinkSeconds ? c[3] : 0.0);
            Assert.Equal(expectedSlope, fit.SlopeAt(ti), 6);
        }

        // And the kink is found near the truth (0.01 Hz noise; a tiny rate change leaves it loosely placed).
        if (Math.Abs(rateChange) >= 0.5)
        {
            Assert.InRange(fit.KinkSeconds, kinkSeconds - 0.3, kinkSeconds + 0.3);
            Assert.InRange(fit.RateChange, rateChange - 0.05, rateChange + 0.05);
        }
    }

    [Fact]
    public void Too_few_points_or_no_late_point_is_not_solved()
    {
        var fit = new KinkFit();
        fit.Clear(0);
        Assert.False(fit.TrySolve(0, 1, 0.1));
        for (int i = 0; i < 10; i++)
        {
            fit.AddEarly(0.1 * i, i);
        }

        Assert.False(fit.TrySolve(0, 1, 0.1)); // no late point
        Assert.Equal(0.0, fit.RateChange);
    }
}
