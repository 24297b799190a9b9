using FreqReadout.Numerics;

namespace FreqReadout.Tests.Counting;

public class ScalarMathTests
{
    [Fact]
    public void Sqrt_agrees_with_the_runtime_to_one_ulp_over_the_whole_range()
    {
        var rng = new Random(5);
        for (int i = 0; i < 20000; i++)
        {
            double x = Math.Pow(10, rng.NextDouble() * 600 - 300) * (1 + rng.NextDouble());
            double expected = Math.Sqrt(x);
            double got = ScalarMath.Sqrt(x);
            Assert.True(Math.Abs(got - expected) <= Math.BitIncrement(expected) - expected, $"sqrt({x}) = {got}, expected {expected}");
        }

        Assert.Equal(0.0, ScalarMath.Sqrt(0));
        Assert.Equal(3.0, ScalarMath.Sqrt(9));
        Assert.Equal(1.4142135623730951, ScalarMath.Sqrt(2));
        Assert.True(double.IsNaN(ScalarMath.Sqrt(-1)));
        Assert.True(double.IsNaN(ScalarMath.Sqrt(double.NaN)));
        Assert.True(double.IsPositiveInfinity(ScalarMath.Sqrt(double.PositiveInfinity)));
        Assert.Equal(Math.Sqrt(double.Epsilon), ScalarMath.Sqrt(double.Epsilon));
        Assert.Equal(Math.Sqrt(double.MaxValue), ScalarMath.Sqrt(double.MaxValue), Math.BitIncrement(Math.Sqrt(double.MaxValue)) - Math.Sqrt(double.MaxValue));
    }

    [Fact]
    public void Rounding_and_absolute_values()
    {
        Assert.Equal(3, ScalarMath.RoundToLong(2.5));
        Assert.Equal(-3, ScalarMath.RoundToLong(-2.5));
        Assert.Equal(2, ScalarMath.RoundToLong(2.49));
        Assert.Equal(8_000_000, ScalarMath.CeilingToLongTolerant(0.1 * 80e6));
        Assert.Equal(8_000_001, ScalarMath.CeilingToLongTolerant(8_000_000.5));
        Assert.Equal(-2, ScalarMath.CeilingToLongTolerant(-2.5));
        Assert.Equal(2.5, ScalarMath.Abs(-2.5));
        Assert.Equal(7L, ScalarMath.Abs(-7L));
    }
}
