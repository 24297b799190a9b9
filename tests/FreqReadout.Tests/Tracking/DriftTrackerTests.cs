using FreqReadout.Tracking;

namespace FreqReadout.Tests.Tracking;

/// <summary>The Holt tracker's documented behaviour (derived from its equations in the XML docs).</summary>
public class DriftTrackerTests
{
    [Fact]
    public void Linear_ramp_is_followed_with_no_steady_state_lag()
    {
        var tracker = new DriftTracker(2, 10);
        tracker.Reset(1000, 0, 0);
        for (int k = 1; k <= 3000; k++)
        {
            double t = k * 0.1;
            tracker.Update(t, 1000 + (0.5 * t), 0.1);
        }

        Assert.Equal(1000 + (0.5 * 300), tracker.Predict(300), 1e-6);
        Assert.Equal(0.5, tracker.SlopeHzPerSecond, 1e-8);
    }

    [Fact]
    public void Constant_acceleration_lags_by_a_tauL_tauB()
    {
        // Continuous limit: steady-state lag e = a tau_L tau_b (derived in the class docs). With 0.01 s steps
        // the discrete loop is within 2 % of it.
        const double a = 0.002;
        var tracker = new DriftTracker(2, 10);
        tracker.Reset(0, 0, 0);
        double t = 0;
        for (int k = 1; k <= 30000; k++)
        {
            t = k * 0.01;
            tracker.Update(t, 0.5 * a * t * t, 0.01);
        }

        double lag = (0.5 * a * t * t) - tracker.Predict(t);
        Assert.Equal(a * 2 * 10, lag, a * 2 * 10 * 0.02);
    }

    [Fact]
    public void Gains_follow_the_reading_span_not_the_gap()
    {
        var tracker = new DriftTracker(2, 10);
        tracker.Reset(0, 0, 0);
        tracker.Update(5.0, 1.0, 0.1); // one 0.1 s reading after a 5 s gap
        Assert.Equal(1 - Math.Exp(-0.1 / 2), tracker.LevelHz, 1e-12);
        tracker.Update(5.0, 100, 0.1); // not later: ignored
        Assert.Equal(1 - Math.Exp(-0.1 / 2), tracker.LevelHz, 1e-12);
    }
}
