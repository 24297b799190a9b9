using System.Text.Json;
using FreqReadout.Tests.Tracking;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// Issue 3 through real edge captures and the counting core: 35 simulated minutes of exponential
/// settling (-300 ppm, tau 3 min) plus a 200 ppm temperature ramp, with no target gives no event and
/// no re-baseline; the same drift with 0.3-2 s passes gives each pass as one event with its class and
/// peak. Invented data: 100 kHz search oscillator, prescale 1000 (100 recorded edges/s), 10 MHz clock,
/// 0.3 Hz white FM in 10 ms blocks (about 0.1 Hz per 0.1 s gate).
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ReplayLongDriftTests : IDisposable
{
    private const double F0 = 100_000;
    private const double Minutes = 35;
    private readonly string _dir = Path.Combine(Path.GetTempPath(), "freqreadout-long-" + Guid.NewGuid().ToString("N"));

    public ReplayLongDriftTests()
    {
        Directory.CreateDirectory(_dir);
    }

    public void Dispose()
    {
        Directory.Delete(_dir, true);
    }

    private static double Drift(double t) => (-300e-6 * F0 * (1 - Math.Exp(-t / 180))) + (200e-6 * F0 * t / (Minutes * 60));

    private static List<TargetPass> Passes()
    {
        var passes = new List<TargetPass>();
        double[] widths = { 0.3, 0.6, 1.0, 2.0 };
        double[] amplitudes = { 1.2, 2.0 }; // 12 and 20 noise sigma
        int i = 0;
        for (double c = 30; c < (Minutes * 60) - 20; c += 45, i++)
        {
            passes.Add(new TargetPass(c, widths[i % 4], (i % 2 == 0 ? 1 : -1) * amplitudes[(i / 4) % 2]));
        }

        return passes;
    }

    private JsonElement Replay(bool withPasses)
    {
        List<TargetPass> passes = withPasses ? Passes() : new List<TargetPass>();
        var capture = new SyntheticEdgeCapture
        {
            DurationSeconds = Minutes * 60,
            Prescale = 1000,
            Seed = withPasses ? 2 : 3,
            SearchHzAt = t =>
            {
                double f = F0 + Drift(t);
                foreach (TargetPass p in passes)
                {
                    if (Math.Abs(t - p.CenterSeconds) < p.WidthSeconds)
                    {
                        f += p.ShiftAt(t);
                    }
                }

                return f;
            },
        };
        string path = Path.Combine(_dir, withPasses ? "passes.edges.csv" : "drift.edges.csv");
        capture.Write(path);
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json");
        Assert.True(exit == 0, stderr);
        using var doc = JsonDocument.Parse(stdout);
        return doc.RootElement.Clone();
    }

    [Fact]
    public void Drift_alone_gives_no_event_over_35_minutes()
    {
        JsonElement o = Replay(false);
        Assert.Equal(0, o.GetProperty("events").GetArrayLength());
        Assert.Equal(0, o.GetProperty("rebaselines").GetArrayLength());
        Assert.InRange(o.GetProperty("capture").GetProperty("duration_s").GetDouble(), (Minutes * 60) - 1, Minutes * 60);

        // The drift was large: 300 ppm settling = 30 Hz, some 300 times the 0.1 Hz noise.
        Assert.InRange(o.GetProperty("noise_hz").GetDouble(), 0.07, 0.14);
    }

    [Fact]
    public void Passes_on_the_same_drift_are_all_found_with_class_and_peak()
    {
        List<TargetPass> passes = Passes();
        JsonElement o = Replay(true);
        Assert.Equal(0, o.GetProperty("rebaselines").GetArrayLength());
        JsonElement[] events = o.GetProperty("events").EnumerateArray().ToArray();
        Assert.Equal(passes.Count, events.Length);
        double noise = o.GetProperty("noise_hz").GetDouble();
        for (int i = 0; i < passes.Count; i++)
        {
            TargetPass p = passes[i];
            JsonElement e = events[i];
            double peak = e.GetProperty("peak_shift_hz").GetDouble();
            string what = $"pass {i} at {p.CenterSeconds} s, {p.WidthSeconds} s wide, {p.AmplitudeHz} Hz: peak {peak} at {e.GetProperty("peak_s").GetDouble()}";

            // A 0.1 s gate sees the pass's mean over the gate: between the mean over [c, c + 0.1 s] (gate edge
            // on the centre) and the mean over [c - 0.05, c + 0.05] (gate centred); 10 % or 4 noise sigma
            // beyond that (see TargetPassTests for why 4 sigma).
            double low = Mean(p, p.CenterSeconds, p.CenterSeconds + 0.1);
            double high = Mean(p, p.CenterSeconds - 0.05, p.CenterSeconds + 0.05);
            double slack = Math.Max(0.1 * Math.Abs(high), 4 * noise);
            Assert.True(Math.Abs(peak) >= Math.Abs(low) - slack && Math.Abs(peak) <= Math.Abs(high) + slack, what);
            Assert.True(Math.Sign(peak) == Math.Sign(p.AmplitudeHz), what);
            Assert.True(e.GetProperty("class").GetString() == (p.AmplitudeHz > 0 ? "non-ferrous" : "ferrous"), what);
            Assert.True(Math.Abs(e.GetProperty("peak_s").GetDouble() - p.CenterSeconds) <= (p.WidthSeconds / 2) + 0.11, what);
        }
    }

    private static double Mean(TargetPass p, double t0, double t1)
    {
        double s = 0;
        for (int k = 0; k < 100; k++)
        {
            s += p.ShiftAt(t0 + ((k + 0.5) * (t1 - t0) / 100));
        }

        return s / 100;
    }
}
