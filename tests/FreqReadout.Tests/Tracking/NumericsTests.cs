using FreqReadout.Numerics;

namespace FreqReadout.Tests.Tracking;

/// <summary>Device numerics added for tracking (Exp, IsFinite, running median) against the BCL (System.Math is the reference here); Sqrt is tested with the counting core.</summary>
public class NumericsTests
{
    [Theory]
    [InlineData(-700)]
    [InlineData(-20)]
    [InlineData(-1)]
    [InlineData(-0.05)]
    [InlineData(0)]
    [InlineData(0.3)]
    [InlineData(1)]
    [InlineData(50)]
    [InlineData(700)]
    public void Exp_matches_Math_Exp(double x)
    {
        Assert.Equal(Math.Exp(x), ScalarMath.Exp(x), Math.Exp(x) * 1e-13);
    }

    [Fact]
    public void Exp_limits()
    {
        Assert.Equal(0.0, ScalarMath.Exp(-800));
        Assert.True(double.IsPositiveInfinity(ScalarMath.Exp(800)));
        Assert.True(ScalarMath.IsFinite(1.0) && !ScalarMath.IsFinite(double.NaN) && !ScalarMath.IsFinite(double.NegativeInfinity));
    }

    [Fact]
    public void Median_window_matches_a_sorted_copy_of_the_last_values()
    {
        var rng = new Random(3);
        var window = new MedianWindow(33);
        var all = new List<double>();
        for (int i = 0; i < 2000; i++)
        {
            // Repeated values included (ties must be removed one at a time).
            double v = Math.Round(rng.NextDouble() * 20);
            window.Add(v);
            all.Add(v);
            List<double> last = all.Skip(Math.Max(0, all.Count - 33)).OrderBy(x => x).ToList();
            double expected = last.Count % 2 == 1 ? last[last.Count / 2] : 0.5 * (last[(last.Count / 2) - 1] + last[last.Count / 2]);
            Assert.Equal(expected, window.Median());
        }

        Assert.Equal(33, window.Count);
        window.Clear();
        Assert.Equal(0.0, window.Median());
    }
}
