using FreqReadout.Counting;

namespace FreqReadout.Tests.Counting;

/// <summary>Mains-nulling gates (issue 8: a readout near live wiring sees 50 or 60 Hz frequency modulation).</summary>
public class MainsGateTests
{
    /// <summary>
    /// The regression null z_k / pi against the roots of tan z = z found by bisection with System.Math
    /// in (k pi, (k + 1/2) pi); check values 4.4934, 7.7253, 10.9041 (zeros of the spherical Bessel
    /// function j1; Abramowitz and Stegun 1964, Table 10.6, from memory).
    /// </summary>
    [Fact]
    public void Parabolic_nulls_are_the_roots_of_tan_z_equals_z()
    {
        for (int k = 1; k <= 40; k++)
        {
            double lo = k * Math.PI + 1e-9, hi = (k + 0.5) * Math.PI - 1e-9;
            for (int i = 0; i < 200; i++)
            {
                double mid = 0.5 * (lo + hi);
                if (Math.Tan(mid) - mid < 0) lo = mid; else hi = mid;
            }

            Assert.Equal(0.5 * (lo + hi) / Math.PI, MainsGate.ParabolicZeroPeriods(k), 1e-12);
        }

        Assert.Equal(4.4934, MainsGate.ParabolicZeroPeriods(1) * Math.PI, 1e-4);
        Assert.Equal(7.7253, MainsGate.ParabolicZeroPeriods(2) * Math.PI, 1e-4);
        Assert.Equal(10.9041, MainsGate.ParabolicZeroPeriods(3) * Math.PI, 1e-4);
    }

    [Fact]
    public void Gate_lengths_are_whole_periods_for_reciprocal_and_the_nearest_null_for_regression()
    {
        Assert.Equal(0.1, MainsGate.GateSecondsFor(0.1, 50, EstimatorKind.Reciprocal), 12);
        Assert.Equal(0.1, MainsGate.GateSecondsFor(0.105, 50, EstimatorKind.Reciprocal), 12);
        Assert.Equal(1.0 / 60, MainsGate.GateSecondsFor(0.001, 60, EstimatorKind.Reciprocal), 12);
        Assert.Equal(MainsGate.ParabolicZeroPeriods(5) / 50, MainsGate.GateSecondsFor(0.1, 50, EstimatorKind.Regression), 12); // 5.4815 is nearer 5 than 4.4774
        Assert.Equal(MainsGate.ParabolicZeroPeriods(4) / 50, MainsGate.GateSecondsFor(0.09, 50, EstimatorKind.Regression), 12);
        Assert.Equal(MainsGate.ParabolicZeroPeriods(1) / 50, MainsGate.GateSecondsFor(0.001, 50, EstimatorKind.SnapshotRegression), 12);
        Assert.Equal(MainsGate.ParabolicZeroPeriods(6) / 60, MainsGate.GateSecondsFor(0.1, 60, EstimatorKind.Regression), 12);
        Assert.Equal(0.1, MainsGate.GateSecondsFor(0.1, 0, EstimatorKind.Regression));
        var s = new CounterSettings { ClockHz = 1e6, MainsHz = 55 };
        Assert.True(s.TryValidate(out _));
        s.MainsHz = 5;
        Assert.False(s.TryValidate(out string error));
        Assert.Contains("mains", error);
        Assert.Equal((long)Math.Ceiling(MainsGate.ParabolicZeroPeriods(5) / 50 * 80e6 - 1e-6),
            new EdgeCounter(new CounterSettings { ClockHz = 80e6, MainsHz = 50 }).GateTicks);
    }

    /// <summary>
    /// Synthetic 20 kHz signal (80 MHz timer, no jitter) with 50 Hz sinusoidal FM of 10 ppm peak, the
    /// modulation at 45 degrees when the first gate opens (invented data). Gates spanning a null of their
    /// estimator cancel it: the reciprocal over whole mains periods, the regression over 4.4774 periods;
    /// the regression over whole periods does not (its response there is -12 / (2 pi k)^2, 1.2 % at
    /// k = 5, 1.9 % at k = 4), nor does the reciprocal over 4.5 periods (4.5 periods is close to the
    /// regression's null, which is why that estimator wants 4.4774, not whole periods).
    /// </summary>
    [Fact]
    public void Gates_that_span_a_null_cancel_sinusoidal_mains_fm()
    {
        double Rms(EstimatorKind estimator, double gateSeconds)
        {
            const double clock = 80e6, f0 = 20_000, depth = 1e-5, fm = 50;
            var c = new EdgeCounter(new CounterSettings { ClockHz = clock, GateSeconds = gateSeconds, Estimator = estimator });
            // phase(t) = f0 t + (f0 depth / (2 pi fm)) (sin(2 pi fm t + th) - sin th): frequency f0 (1 + depth cos(2 pi fm t + th)).
            double a = f0 * depth / (2 * Math.PI * fm);
            const double th = Math.PI / 4;
            double t = 0, sum2 = 0;
            int gates = 0;
            for (long k = 0; gates < 40; k++)
            {
                for (int i = 0; i < 3; i++)
                {
                    double phase = f0 * t + a * (Math.Sin(2 * Math.PI * fm * t + th) - Math.Sin(th)) - k;
                    t -= phase / (f0 * (1 + depth * Math.Cos(2 * Math.PI * fm * t + th)));
                }

                if (!c.AddEdge((long)Math.Floor(t * clock), out GateResult r)) continue;
                gates++;
                sum2 += (r.FrequencyHz - f0) * (r.FrequencyHz - f0);
            }

            return Math.Sqrt(sum2 / gates);
        }

        double amplitude = 20_000 * 1e-5; // 0.2 Hz
        double recWhole = Rms(EstimatorKind.Reciprocal, MainsGate.GateSecondsFor(0.1, 50, EstimatorKind.Reciprocal));
        double recHalf = Rms(EstimatorKind.Reciprocal, 0.09);
        double regNull = Rms(EstimatorKind.Regression, MainsGate.GateSecondsFor(0.09, 50, EstimatorKind.Regression));
        double regWhole = Rms(EstimatorKind.Regression, 0.1);
        double regFour = Rms(EstimatorKind.Regression, 0.08);
        Assert.True(recHalf > 0.02 * amplitude, "reciprocal, 4.5 periods: " + recHalf); // 2 / (9 pi) x sin 45 degrees = 5 %
        Assert.True(recWhole < 0.1 * recHalf, $"reciprocal, whole periods: {recWhole} against {recHalf}");
        Assert.InRange(regWhole, 0.005 * amplitude, 0.016 * amplitude); // |-12 / (2 pi 5)^2| x cos 45 degrees = 0.86 %
        Assert.True(regNull < 0.1 * regWhole, $"regression, 4.4774 periods: {regNull} against {regWhole} at 5 periods");
        Assert.True(regNull < 0.1 * regFour, $"regression, 4.4774 periods: {regNull} against {regFour} at 4 periods");
    }
}
