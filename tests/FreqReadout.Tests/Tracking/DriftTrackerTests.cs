using FreqReadout.Tracking;
using MathNet.Numerics.LinearAlgebra;

namespace FreqReadout.Tests.Tracking;

/// <summary>
/// The drift tracker's Kalman filter against a textbook filter written with MathNet.Numerics matrices
/// (x = F x, P = F P F^T + Q, K = P H^T / (H P H^T + R), x += K v, P = (I - K H) P: Bar-Shalom, Li and
/// Kirubarajan, Estimation with Applications to Tracking and Navigation, 2001, sections 5.2 and 6.2.3 for the
/// white-jerk Q), and its documented behaviour.
/// </summary>
public class DriftTrackerTests
{
    private static (Matrix<double> F, Matrix<double> Q) Model(double dt, double q)
    {
        var f = Matrix<double>.Build.DenseOfArray(new[,] { { 1, dt, dt * dt / 2 }, { 0, 1, dt }, { 0, 0, 1 } });
        double d2 = dt * dt, d3 = d2 * dt, d4 = d3 * dt, d5 = d4 * dt;
        var qm = Matrix<double>.Build.DenseOfArray(new[,]
        {
            { d5 / 20, d4 / 8, d3 / 6 },
            { d4 / 8, d3 / 3, d2 / 2 },
            { d3 / 6, d2 / 2, dt },
        }) * q;
        return (f, qm);
    }

    [Fact]
    public void Updates_match_a_textbook_Kalman_filter_written_with_matrices()
    {
        const double noise = 0.05;
        var tracker = new DriftTracker(5);
        tracker.Reset(10, 0.2, -0.002, 0, 0.1, 0.02, 0.001, noise, 0.1);
        double q = tracker.JerkDensity;

        var x = Vector<double>.Build.DenseOfArray(new[] { 10, 0.2, -0.002 });
        var p = Matrix<double>.Build.DenseOfDiagonalArray(new[] { 0.01, 0.0004, 0.000001 });
        var h = Matrix<double>.Build.DenseOfArray(new double[,] { { 1, 0, 0 } });
        var rng = new Random(7);
        double t = 0;
        for (int k = 0; k < 400; k++)
        {
            double dt = 0.05 + (0.2 * rng.NextDouble()); // irregular gates and gaps
            t += dt;
            // A drift that bends well inside the thermal limit (|a| <= |b| / 30 s), so the limit never acts here.
            double y = 10 + (0.3 * t) - (0.001 * t * t) + (noise * (rng.NextDouble() - 0.5));
            var (f, qm) = Model(dt, q);
            x = f * x;
            p = (f * p * f.Transpose()) + qm;

            // The forecast and its variance before the update.
            Assert.Equal(x[0], tracker.Predict(t), 1e-9);
            Assert.Equal(p[0, 0], tracker.PredictVariance(t), 1e-12 + (1e-9 * p[0, 0]));

            double s = p[0, 0] + (noise * noise);
            var kgain = p * h.Transpose() / s;
            x += kgain.Column(0) * (y - x[0]);
            p = (Matrix<double>.Build.DenseIdentity(3) - (kgain * h)) * p;
            tracker.Update(t, y, noise);
            Assert.True(Math.Abs(x[2]) < Math.Abs(x[1]) / DriftTracker.MinSettlingSeconds);
        }

        Assert.Equal(x[0], tracker.LevelHz, 1e-9);
        Assert.Equal(x[1], tracker.SlopeHzPerSecond, 1e-9);
        Assert.Equal(x[2], tracker.AccelerationHzPerSecond2, 1e-9);
        Assert.Equal(p[0, 0], tracker.PredictVariance(t), 1e-12);
    }

    [Fact]
    public void A_quadratic_drift_is_followed_without_lag()
    {
        // A constant-acceleration model has no steady-state error on a quadratic (derived from the model: the
        // quadratic is one of its noise-free trajectories). 20 Hz/s bending by 0.5 Hz/s^2 is a settling of 40 s.
        var tracker = new DriftTracker(5);
        tracker.Reset(0, 0, 0, 0, 10, 10, 1, 0.01, 0.1);
        double t = 0;
        for (int k = 1; k <= 600; k++)
        {
            t = k * 0.1;
            tracker.Update(t, (20 * t) + (0.25 * t * t), 0.01);
        }

        double ahead = t + 0.6;
        Assert.Equal((20 * ahead) + (0.25 * ahead * ahead), tracker.Predict(ahead), 1e-3);
        Assert.Equal(20 + (0.5 * t), tracker.SlopeHzPerSecond, 1e-3);
        Assert.Equal(0.5, tracker.AccelerationHzPerSecond2, 1e-3);
    }

    [Fact]
    public void Acceleration_stays_within_what_thermal_settling_can_bend()
    {
        // A pass's flank fed as if it were drift would teach a large acceleration; the limit (|b| + 3 sigma_b) / 30 s
        // keeps the forecast across a held target sane. Here b stays near 0, so |a| stays near 3 sigma_b / 30 s.
        var tracker = new DriftTracker(1);
        tracker.Reset(0, 0, 0, 0, 0.001, 0.001, 0.001, 0.001, 0.1);
        for (int k = 1; k <= 20; k++)
        {
            double t = k * 0.1;
            tracker.Update(t, 0.5 * t * t, 0.001); // 1 Hz/s^2 from rest: not thermal drift
            double limit = (Math.Abs(tracker.SlopeHzPerSecond) + (3 * 0.05)) / DriftTracker.MinSettlingSeconds;
            Assert.True(Math.Abs(tracker.AccelerationHzPerSecond2) <= limit + 1e-12, $"{tracker.AccelerationHzPerSecond2} at {t}");
        }

        Assert.True(tracker.AccelerationHzPerSecond2 < 0.2);
    }

    [Fact]
    public void Learning_raises_the_jerk_density_when_forecasts_miss_and_lowers_it_when_they_fit()
    {
        const double noise = 0.01;
        var tracker = new DriftTracker(5);
        tracker.Reset(0, 0, 0, 0, noise, noise, noise, noise, 0.1);
        double start = tracker.JerkDensity;
        for (int k = 0; k < 20; k++)
        {
            tracker.Learn(5 * noise, noise * noise, noise, 0.1); // 5 sigma misses: normalised error 25, clipped to 9
        }

        Assert.True(tracker.MeanNormalisedError > 3);
        Assert.True(tracker.JerkDensity > 2 * start);

        for (int k = 0; k < 2000; k++)
        {
            tracker.Learn(0.1 * noise, noise * noise, noise, 0.1);
        }

        // Bounded by the longest memory, q = R w / tau_max^6.
        double floor = noise * noise * 0.1 / Math.Pow(DriftTracker.MaxMemorySeconds, 6);
        Assert.Equal(floor, tracker.JerkDensity, floor * 1e-9);

        for (int k = 0; k < 5000; k++)
        {
            tracker.Learn(100 * noise, noise * noise, noise, 0.1);
        }

        double ceiling = noise * noise * 0.1 / Math.Pow(DriftTracker.MinMemorySeconds, 6);
        Assert.Equal(ceiling, tracker.JerkDensity, ceiling * 1e-9);
    }

    [Fact]
    public void A_copy_continues_exactly_as_the_original()
    {
        var a = new DriftTracker(5);
        a.Reset(1, 0.1, 0, 0, 0.01, 0.01, 0.001, 0.01, 0.1);
        for (int k = 1; k <= 50; k++)
        {
            a.Update(k * 0.1, 1 + (0.1 * k * 0.1) + (k % 3 * 0.001), 0.01);
            a.Learn(0.02, 0.0001, 0.01, 0.1);
        }

        var b = new DriftTracker(5);
        b.CopyFrom(a);
        a.Update(5.1, 1.52, 0.01);
        b.Update(5.1, 1.52, 0.01);
        Assert.Equal(a.Predict(6), b.Predict(6));
        Assert.Equal(a.PredictVariance(6), b.PredictVariance(6));
        Assert.Equal(a.JerkDensity, b.JerkDensity);
    }

    [Fact]
    public void Readings_not_later_than_the_last_or_not_finite_change_nothing()
    {
        var tracker = new DriftTracker(5);
        tracker.Reset(0, 0, 0, 1, 0.1, 0.1, 0.1, 0.1, 0.1);
        tracker.Update(1, 5, 0.1);
        tracker.Update(0.5, 5, 0.1);
        tracker.Update(2, double.NaN, 0.1);
        tracker.Update(2, 5, 0);
        Assert.Equal(0, tracker.LevelHz);
        Assert.Equal(1, tracker.TimeSeconds);
    }
}
