using FreqReadout.Counting;

namespace FreqReadout.Tests.Tracking;

/// <summary>A target pass: a raised-cosine bump of the search frequency, a (1 + cos(2 pi (t - c) / w)) / 2 for |t - c| &lt; w / 2.</summary>
internal readonly record struct TargetPass(double CenterSeconds, double WidthSeconds, double AmplitudeHz)
{
    public double ShiftAt(double t)
    {
        double u = t - CenterSeconds;
        if (Math.Abs(u) >= WidthSeconds / 2)
        {
            return 0;
        }

        return AmplitudeHz * 0.5 * (1 + Math.Cos(2 * Math.PI * u / WidthSeconds));
    }
}

/// <summary>
/// Synthetic gate results with a known truth (invented test data, not a reference): search frequency
/// = baseline + drift(t) + extra(t) + target passes; each gate carries the mean of that over the gate
/// (16-point midpoint rule), converted to the beat note |f_search - f_ref| in beat mode, plus white
/// Gaussian noise of NoiseHz from a seeded RNG (Box-Muller). Later the simulator may replace it.
/// </summary>
internal sealed class SyntheticGateStream
{
    public double GateSeconds { get; init; } = 0.1;
    public double BaselineHz { get; init; } = 100_000;
    public double NoiseHz { get; init; } = 0.1;
    public int Seed { get; init; } = 1;
    public double DurationSeconds { get; init; } = 60;
    public SignalKind Signal { get; init; } = SignalKind.Search;
    public double ReferenceHz { get; init; }

    /// <summary>Slow drift of the search oscillator, Hz (temperature, settling).</summary>
    public Func<double, double> DriftHz { get; init; } = _ => 0;

    /// <summary>Any further truth (steps, still targets), Hz of the search oscillator.</summary>
    public Func<double, double> ExtraHz { get; init; } = _ => 0;

    public List<TargetPass> Passes { get; } = new();

    public double SearchHzAt(double t)
    {
        double f = BaselineHz + DriftHz(t) + ExtraHz(t);
        foreach (TargetPass p in Passes)
        {
            f += p.ShiftAt(t);
        }

        return f;
    }

    public double TargetShiftAt(double t)
    {
        double s = 0;
        foreach (TargetPass p in Passes)
        {
            s += p.ShiftAt(t);
        }

        return s;
    }

    /// <summary>Mean of the target shift over [t0, t1] (what a gate can see of it).</summary>
    public double GateMeanTargetShift(double t0, double t1) => Mean(TargetShiftAt, t0, t1);

    /// <summary>Largest |gate-mean target shift| of a pass over the gate grid, signed.</summary>
    public double TruePassPeakHz(TargetPass pass)
    {
        double best = 0;
        int first = Math.Max(0, (int)((pass.CenterSeconds - pass.WidthSeconds) / GateSeconds));
        int last = (int)((pass.CenterSeconds + pass.WidthSeconds) / GateSeconds) + 1;
        for (int k = first; k <= last; k++)
        {
            double m = Mean(pass.ShiftAt, k * GateSeconds, (k + 1) * GateSeconds);
            if (Math.Abs(m) > Math.Abs(best))
            {
                best = m;
            }
        }

        return best;
    }

    public IEnumerable<GateResult> Gates()
    {
        var rng = new Random(Seed);
        int n = (int)Math.Round(DurationSeconds / GateSeconds);
        for (int k = 0; k < n; k++)
        {
            double t0 = k * GateSeconds;
            double t1 = (k + 1) * GateSeconds;
            double search = Mean(SearchHzAt, t0, t1);
            double counted = Signal == SignalKind.Beat ? Math.Abs(search - ReferenceHz) : search;
            counted += NoiseHz * Gaussian(rng);
            yield return Make(counted, t0, t1);
        }
    }

    public GateResult Make(double frequencyHz, double t0, double t1)
    {
        int edges = (int)Math.Max(2, Math.Round(frequencyHz * (t1 - t0)));
        return CoreTestExtensions.Gate(GateState.Ok, EstimatorKind.Regression, Signal, true, frequencyHz, 0.0, frequencyHz, frequencyHz,
            edges, 1, (long)(t0 * 80e6), (long)(t1 * 80e6), t0, t1, 0, 0);
    }

    public static GateResult NoSignal(double t0, double t1) =>
        CoreTestExtensions.Gate(GateState.NoSignal, EstimatorKind.Regression, SignalKind.Search, false, 0, 0, 0, 0, 0, 1, 0, 0, t0, t1, 0, 0);

    public static double Gaussian(Random rng)
    {
        double u1 = 1.0 - rng.NextDouble();
        double u2 = rng.NextDouble();
        return Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }

    private static double Mean(Func<double, double> f, double t0, double t1)
    {
        const int m = 16;
        double s = 0;
        for (int i = 0; i < m; i++)
        {
            s += f(t0 + ((i + 0.5) * (t1 - t0) / m));
        }

        return s / m;
    }
}
