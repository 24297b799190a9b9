using FreqReadout.Counting;
using FreqReadout.Detection;
using FsCheck;
using FsCheck.Fluent;
using FsCheck.Xunit;

namespace FreqReadout.Tests.Robustness;

/// <summary>
/// Properties of the counting core and the sign rule: the gate results do not depend on where the
/// timer started or how wide it is, and the class flips exactly with the polarity setting.
/// </summary>
public sealed class CounterInvarianceProperties
{
    /// <summary>A random edge train: frequency, clock, prescale, Gaussian jitter (ticks rms), a noise seed and a start tick.</summary>
    public sealed record EdgeTrain(double FrequencyHz, double ClockHz, int Prescale, double JitterTicks, int NoiseSeed, long StartTick, EstimatorKind Estimator)
    {
        public override string ToString() =>
            $"f={FrequencyHz:R} Hz clock={ClockHz:R} Hz prescale={Prescale} jitter={JitterTicks:R} ticks seed={NoiseSeed} start={StartTick} estimator={Estimator}";
    }

    private static Gen<EdgeTrain> TrainGen() =>
        from fHz in Gen.Choose(500, 200_000)
        from fFrac in Gen.Choose(0, 999)
        from clockMHz in Gen.Elements(8.0, 10.0, 16.0, 48.0, 80.0)
        from prescale in Gen.Elements(1, 1, 2, 8)
        from jitterCenti in Gen.Frequency((1, Gen.Constant(0)), (3, Gen.Choose(1, 300)))
        from seed in Gen.Choose(0, int.MaxValue)
        from startHi in Gen.Choose(0, int.MaxValue)
        from startLo in Gen.Choose(0, int.MaxValue)
        from estimator in Gen.Elements(EstimatorKind.Regression, EstimatorKind.Reciprocal)
        select new EdgeTrain(fHz + (fFrac / 1000.0), clockMHz * 1e6, prescale, jitterCenti / 100.0, seed, (((long)startHi << 31) | (uint)startLo) >> 1, estimator);

    /// <summary>Edge ticks from 0: round(k x period + jitter), about 0.3 s of signal (at most 20 000 edges).</summary>
    private static long[] Ticks(EdgeTrain t)
    {
        double period = t.ClockHz * t.Prescale / t.FrequencyHz;
        int n = (int)Math.Clamp(0.3 * t.FrequencyHz / t.Prescale, 300, 20_000);
        var rng = new Random(t.NoiseSeed);
        var ticks = new long[n];
        for (int k = 0; k < n; k++)
        {
            double gauss = Math.Sqrt(-2 * Math.Log(1 - rng.NextDouble())) * Math.Cos(2 * Math.PI * rng.NextDouble());
            ticks[k] = (long)Math.Round((k * period) + 10 + (t.JitterTicks * gauss));
        }

        return ticks;
    }

    private static EdgeCounter Counter(EdgeTrain t) => new(new CounterSettings
    {
        ClockHz = t.ClockHz,
        Prescale = t.Prescale,
        GateSeconds = 0.02,
        JitterTicks = t.JitterTicks,
        Estimator = t.Estimator,
    });

    /// <summary>The gates as comparable values: everything but the absolute ticks (their span is kept).</summary>
    private static List<string> Gates(EdgeTrain t, IEnumerable<long> ticks)
    {
        var counter = Counter(t);
        var gates = new List<string>();
        foreach (long tick in ticks)
        {
            if (counter.AddEdge(tick, out GateResult g))
            {
                gates.Add($"{g.State} {g.HasFrequency} {g.FrequencyHz:R} {g.ErrorHz:R} {g.ReciprocalHz:R} {g.RegressionHz:R} {g.Edges} " +
                          $"{g.EndTick - g.StartTick} {g.StartSeconds:R} {g.EndSeconds:R} {g.Glitches} {g.Dropouts}");
            }
        }

        return gates;
    }

    [Property(MaxTest = 60)]
    public Property Estimate_is_unchanged_by_the_start_tick() =>
        Prop.ForAll(TrainGen().ToArbitrary(), t =>
        {
            long[] ticks = Ticks(t);
            var fromZero = Gates(t, ticks);
            var shifted = Gates(t, ticks.Select(x => x + t.StartTick));
            Assert.NotEmpty(fromZero);
            Assert.Equal(fromZero, shifted);
        });

    [Property(MaxTest = 60)]
    public Property Estimate_is_unchanged_by_the_timer_width() =>
        Prop.ForAll(TrainGen().ToArbitrary(), t =>
        {
            long[] ticks = Ticks(t);
            var wide = Gates(t, ticks.Select(x => x - ticks[0]));
            Assert.NotEmpty(wide);
            foreach (int bits in new[] { 32, 24 })
            {
                ulong mask = (1UL << bits) - 1;
                var unwrapper = new TimerUnwrapper(bits);
                var unwrapped = new List<long>();
                foreach (long x in ticks)
                {
                    Assert.True(unwrapper.TryUnwrap((ulong)(x + t.StartTick) & mask, out long tick));
                    unwrapped.Add(tick);
                }

                Assert.Equal(wide, Gates(t, unwrapped));
            }
        });

    private static Gen<(double Peak, double Sigma, double Threshold, double Band)> PeakGen() =>
        from peakMilli in Gen.Choose(-10_000_000, 10_000_000).Where(x => x != 0)
        from sigmaCenti in Gen.Choose(0, 5000)
        from thresholdCenti in Gen.Choose(100, 1000)
        from bandCenti in Gen.Choose(0, 500)
        select (peakMilli / 1000.0, sigmaCenti / 100.0, thresholdCenti / 100.0, bandCenti / 100.0);

    [Property(MaxTest = 2000)]
    public Property Classification_flips_exactly_when_polarity_does() =>
        Prop.ForAll(PeakGen().ToArbitrary(), p =>
        {
            var normal = SignRule.Classify(p.Peak, p.Sigma, p.Threshold, p.Band, Polarity.Normal, false);
            var inverted = SignRule.Classify(p.Peak, p.Sigma, p.Threshold, p.Band, Polarity.Inverted, false);
            if (p.Sigma >= p.Threshold + p.Band)
            {
                Assert.Equal(p.Peak > 0 ? TargetClass.NonFerrous : TargetClass.Ferrous, normal);
                Assert.Equal(p.Peak > 0 ? TargetClass.Ferrous : TargetClass.NonFerrous, inverted);
            }
            else
            {
                Assert.Equal(TargetClass.Unclear, normal);
                Assert.Equal(TargetClass.Unclear, inverted);
            }

            Assert.Equal(TargetClass.Unclear, SignRule.Classify(p.Peak, p.Sigma, p.Threshold, p.Band, Polarity.Normal, true));
            Assert.Equal(TargetClass.Unclear, SignRule.Classify(p.Peak, p.Sigma, p.Threshold, p.Band, Polarity.Inverted, true));
        });
}
