using FreqReadout.Counting;
using FreqReadout.Host.Counting;

namespace FreqReadout.Tests.Counting;

public class ConsecutiveGateScatterTests
{
    private static GateResult Gate(long start, long end, double hz, bool hasFrequency = true) =>
        CoreTestExtensions.Gate(hasFrequency ? GateState.Ok : GateState.NoSignal, EstimatorKind.Regression, SignalKind.Search, hasFrequency,
            hasFrequency ? hz : 0, 0.01, hz, hz, 100, 1, start, end, start / 1e6, end / 1e6, 0, 0);

    /// <summary>
    /// Independent gate errors of sigma = 0.5 Hz (seeded Gaussian) on a slow ramp: the Allan-style
    /// scatter over 16 pairs has E = sigma (the ramp adds only its 0.001 Hz step); checked over 4000 gates
    /// as a mean within 5 %. A gap (a gate not opening on the previous closing edge) or a gate without a
    /// frequency starts it again (null first).
    /// </summary>
    [Fact]
    public void Scatter_estimates_the_gate_sigma_and_restarts_after_a_gap()
    {
        var s = new ConsecutiveGateScatter();
        var rng = new Random(16);
        Assert.Null(s.Add(Gate(0, 100, 1000)));
        double sum = 0;
        int n = 0;
        for (int k = 1; k <= 4000; k++)
        {
            double? v = s.Add(Gate(k * 100, (k + 1) * 100, 1000 + 0.001 * k + 0.5 * FreqReadout.Tests.Counting.EdgeStreams.Gaussian(rng)));
            Assert.NotNull(v);
            if (k >= ConsecutiveGateScatter.Window) { sum += v!.Value * v.Value; n++; }
        }

        Assert.Equal(0.5, Math.Sqrt(sum / n), 0.025);
        Assert.Null(s.Add(Gate(500_000, 500_100, 1000)));             // after a gap
        Assert.Equal(1 / Math.Sqrt(2), s.Add(Gate(500_100, 500_200, 1001))!.Value, 12);
        Assert.Null(s.Add(Gate(500_200, 600_000, 0, hasFrequency: false)));
        Assert.Null(s.Add(Gate(600_000, 600_100, 1000)));
    }
}
