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

    [Fact]
    public void Median_window_of_512_matches_the_insertion_window_it_replaced()
    {
        // The earlier O(n) window (a sorted copy kept by insertion) is the oracle: the same numbers, bit for bit,
        // on the pipeline's default size with ties, NaN (ignored) and long runs of equal values.
        var rng = new Random(11);
        var fast = new MedianWindow(512);
        var oracle = new InsertionMedianWindow(512);
        for (int i = 0; i < 20_000; i++)
        {
            double v = (i % 997) < 40 ? 1.25 : (i % 131 == 0 ? double.NaN : Math.Abs(rng.NextDouble() - 0.5) * (1 + (i / 5000)));
            fast.Add(v);
            oracle.Add(v);
            Assert.Equal(oracle.Median(), fast.Median());
            Assert.Equal(oracle.Count, fast.Count);
        }

        fast.Clear();
        Assert.Equal(0, fast.Count);
        fast.Add(2.0);
        Assert.Equal(2.0, fast.Median());
    }

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    [InlineData(7)]
    [InlineData(100)]
    [InlineData(513)]
    public void Selection_gives_the_same_order_statistics_as_a_sort(int n)
    {
        var rng = new Random(n);
        var patterns = new List<double[]>
        {
            Enumerable.Range(0, n).Select(_ => rng.NextDouble()).ToArray(),
            Enumerable.Range(0, n).Select(i => (double)i).ToArray(),
            Enumerable.Range(0, n).Select(i => (double)(n - i)).ToArray(),
            Enumerable.Range(0, n).Select(_ => 3.0).ToArray(),
            Enumerable.Range(0, n).Select(i => (double)Math.Min(i, n - i)).ToArray(), // organ pipe
            Enumerable.Range(0, n).Select(_ => Math.Round(rng.NextDouble() * 4)).ToArray(),
        };

        foreach (double[] p in patterns)
        {
            double[] sorted = p.OrderBy(x => x).ToArray();
            foreach (int limit in new[] { -1, 0, 1 })
            {
                for (int k = 0; k < n; k += Math.Max(1, n / 17))
                {
                    double[] a = (double[])p.Clone();
                    double got = limit < 0 ? RobustStatistics.SelectInPlace(a, n, k) : RobustStatistics.SelectInPlace(a, n, k, limit);
                    Assert.Equal(sorted[k], got);
                    Assert.Equal(sorted, a.OrderBy(x => x).ToArray()); // nothing lost
                    Assert.All(a.Take(k), x => Assert.True(x <= got));
                    Assert.All(a.Skip(k + 1), x => Assert.True(x >= got));
                }
            }

            var scratch = new double[n];
            double median = n % 2 == 1 ? sorted[n / 2] : 0.5 * (sorted[(n / 2) - 1] + sorted[n / 2]);
            Assert.Equal(median, RobustStatistics.Median(p, n, scratch));
            Assert.Equal(RobustStatistics.MedianOfSorted(sorted, n), RobustStatistics.Median(p, n, scratch));
        }
    }

    /// <summary>The running median this project used before (a sorted copy kept by insertion, O(n) per value): the oracle.</summary>
    private sealed class InsertionMedianWindow
    {
        private readonly double[] ring;
        private readonly double[] sorted;
        private int head;

        public InsertionMedianWindow(int capacity)
        {
            ring = new double[capacity];
            sorted = new double[capacity];
        }

        public int Count { get; private set; }

        public void Add(double value)
        {
            if (double.IsNaN(value))
            {
                return;
            }

            if (Count == ring.Length)
            {
                double oldest = ring[head];
                int i = Array.IndexOf(sorted, oldest, 0, Count);
                Array.Copy(sorted, i + 1, sorted, i, Count - i - 1);
                Count--;
                ring[head] = value;
                head = (head + 1) % ring.Length;
            }
            else
            {
                ring[(head + Count) % ring.Length] = value;
            }

            int j = Count - 1;
            while (j >= 0 && sorted[j] > value)
            {
                sorted[j + 1] = sorted[j];
                j--;
            }

            sorted[j + 1] = value;
            Count++;
        }

        public double Median() => RobustStatistics.MedianOfSorted(sorted, Count);
    }
}
