using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Simulation;

public class SimulatedCaptureCountTests
{
    [Theory]
    [InlineData(EstimatorKind.Regression)]
    [InlineData(EstimatorKind.Reciprocal)]
    public void SimulatedCapture_ThroughTheCounter_GivesTheIntendedFrequencyWithinItsPredictedError(EstimatorKind estimator)
    {
        // Issue 4: a simulated capture replayed through the counting core gives back the frequency the simulator intended,
        // within the estimator's predicted error. White timestamp jitter of 4 ticks rms (docs/references.md caveat: tests of the
        // white-noise formulas must add white jitter of several ticks). 100 kHz, 80 MHz clock, 32-bit timer (wraps every
        // 54 s are unwrapped), slow linear drift of +0.5 Hz over the run, 0.1 s gates. Checks: every gate within 5 sigma,
        // and the rms of (f - intended)/sigma within 0.75..1.25 over 80 gates (a consistent error model).
        var scene = new Scene
        {
            Seed = 42,
            DurationS = 8.0,
            Oscillator = new SceneOscillator { FrequencyHz = 100_000, TempcoPpmPerK = 5, WhiteFmAdev1s = 0, FlickerAdev = 0 },
            Temperature = new SceneTemperature { Kind = TemperatureProfileKind.Ramps, StartC = 20, Points = { new TemperaturePoint { TimeS = 8, TempC = 21 } } },
            Hardware = new SceneHardware { ClockHz = 80e6, TimerBits = 32, TimestampMethod = TimestampMethod.Custom, JitterS = 4 / 80e6 },
        };
        var model = new SceneModel(scene);
        var sim = new CaptureSimulator(model);
        var w = new MemoryCaptureWriter();
        sim.Run(w);

        var settings = new CounterSettings
        {
            ClockHz = 80e6,
            Prescale = 1,
            GateSeconds = 0.1,
            Estimator = estimator,
            JitterTicks = 4,
        };
        Assert.True(settings.TryValidate(out string? err), err);
        var counter = new EdgeCounter(settings);
        var unwrap = new TimerUnwrapper(32);
        double sumSq = 0;
        int gates = 0;
        foreach (var row in w.Rows)
        {
            Assert.True(unwrap.TryUnwrap(row.Tick, out long tick));
            if (!counter.AddEdge(tick, out GateResult g))
            {
                continue;
            }

            Assert.Equal(GateState.Ok, g.State);
            // The counter's time 0 is the first edge; the simulator's first edge lies within one period (10 us) of t = 0.
            double mid = 0.5 * (g.StartSeconds + g.EndSeconds);
            double intended = model.CountedIntendedHz(mid);
            double z = (g.FrequencyHz - intended) / g.ErrorHz;
            Assert.True(Math.Abs(z) < 5, $"gate at {mid:F2} s: {g.FrequencyHz} Hz vs intended {intended} Hz, sigma {g.ErrorHz}");
            sumSq += z * z;
            gates++;
        }

        Assert.InRange(gates, 78, 80);
        Assert.InRange(Math.Sqrt(sumSq / gates), 0.75, 1.25);
    }

    [Fact]
    public void SimulatedSnapshots_ThroughTheSnapshotCounter_GiveTheIntendedFrequencyWithinItsPredictedError()
    {
        // Same check for pulse-counter snapshots: 130 kHz, reads about every 1 ms on a 1 MHz 32-bit timer with 2 us rms
        // read jitter, 16-bit counter (wraps twice a second, unwrapped), 0.1 s gates, 6 s. The counter's model is white
        // count quantisation (1/12 counts^2) plus time terms; every gate within 5 sigma, rms z within 0.6..1.4.
        var scene = new Scene
        {
            Seed = 5,
            DurationS = 6.0,
            Oscillator = new SceneOscillator { FrequencyHz = 130_000, TempcoPpmPerK = 0, WhiteFmAdev1s = 0, FlickerAdev = 0 },
            Hardware = new SceneHardware { Kind = CaptureKind.Snapshots, ClockHz = 1e6, TimerBits = 32, CountBits = 16, ReadJitterS = 2e-6 },
        };
        var model = new SceneModel(scene);
        var w = new MemoryCaptureWriter();
        new CaptureSimulator(model).Run(w);

        var settings = new CounterSettings { ClockHz = 1e6, GateSeconds = 0.1, JitterTicks = 2 };
        Assert.True(settings.TryValidate(out string? err), err);
        var counter = new SnapshotCounter(settings);
        var ticks = new TimerUnwrapper(32);
        var counts = new TimerUnwrapper(16, true);
        double sumSq = 0;
        int gates = 0;
        foreach (var row in w.Rows)
        {
            Assert.True(ticks.TryUnwrap(row.Tick, out long tick));
            Assert.True(counts.TryUnwrap(row.Count, out long count));
            if (!counter.AddSnapshot(tick, count, out GateResult g))
            {
                continue;
            }

            Assert.Equal(GateState.Ok, g.State);
            double z = (g.FrequencyHz - 130_000) / g.ErrorHz;
            Assert.True(Math.Abs(z) < 5, $"gate at {g.EndSeconds:F2} s: {g.FrequencyHz} Hz, sigma {g.ErrorHz}");
            sumSq += z * z;
            gates++;
        }

        Assert.InRange(gates, 58, 60);
        Assert.InRange(Math.Sqrt(sumSq / gates), 0.6, 1.4);
    }
}
