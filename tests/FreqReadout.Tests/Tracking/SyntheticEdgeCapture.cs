using FreqReadout.Counting;
using FreqReadout.Host.Captures;

namespace FreqReadout.Tests.Tracking;

/// <summary>
/// Writes a text edge capture with a known truth (invented test data) through the capture branch's
/// <see cref="TextCaptureWriter"/>: the search frequency f_s(t) is a given profile; the counted signal
/// is f_s or the beat |f_s - f_ref|, plus white FM noise constant over blocks of BlockSeconds
/// (seeded RNG); every Prescale-th input edge is recorded as a timer tick (ClockHz, 64-bit).
/// Temperature samples and marks go in at the first edge at or after their times.
/// </summary>
internal sealed class SyntheticEdgeCapture
{
    public double ClockHz { get; init; } = 10e6;
    public int Prescale { get; init; } = 100;
    public SignalKind Signal { get; init; } = SignalKind.Search;
    public BeatSide BeatSide { get; init; } = BeatSide.None;
    public double ReferenceHz { get; init; }
    public double? SearchHz { get; init; }
    public DateTimeOffset? StartedUtc { get; init; }
    public double DurationSeconds { get; init; } = 60;
    public double BlockNoiseHz { get; init; } = 0.3;
    public double BlockSeconds { get; init; } = 0.01;
    public int Seed { get; init; } = 1;
    public Func<double, double> SearchHzAt { get; init; } = _ => 100_000;
    public Func<double, double>? TemperatureC { get; init; }
    public double TemperatureEverySeconds { get; init; } = 1.0;
    public List<(double TimeSeconds, string Mark)> Marks { get; } = new();

    /// <summary>Edge captures: stretches [start, end) in which the signal is lost (no row is written; the oscillator runs on).</summary>
    public List<(double StartSeconds, double EndSeconds)> Gaps { get; } = new();

    /// <summary>When &gt; 0, write <c>kind = snapshots</c> instead: a pulse-counter read every this many seconds
    /// (count = whole input cycles up to the read time); prescale is 1 then.</summary>
    public double SnapshotEverySeconds { get; init; }

    /// <summary>Snapshots: each read lands uniformly within +-this of its nominal time (as the contract sample's +-20 us),
    /// so whole-count quantisation behaves like noise rather than a deterministic pattern (docs/references.md, "Quantisation is not white noise").</summary>
    public double SnapshotJitterSeconds { get; init; } = 20e-6;

    /// <summary>Writes the capture to <paramref name="path"/>; returns the number of rows.</summary>
    public long Write(string path)
    {
        bool snapshots = SnapshotEverySeconds > 0;
        var md = new CaptureMetadata
        {
            ClockHz = ClockHz,
            Kind = snapshots ? CaptureKind.Snapshots : CaptureKind.Edges,
            Prescale = snapshots ? 1 : Prescale,
            Signal = Signal,
            BeatSide = Signal == SignalKind.Beat ? BeatSide : BeatSide.None,
            SearchHz = SearchHz,
            StartedUtc = StartedUtc,
            Note = "synthetic test capture (invented data)",
        };
        if (TemperatureC != null)
        {
            md.ExtraColumns.Add(CaptureColumns.TemperatureC);
        }

        if (Marks.Count > 0)
        {
            md.ExtraColumns.Add(CaptureColumns.Mark);
        }

        var rng = new Random(Seed);
        var marks = Marks.OrderBy(m => m.TimeSeconds).ToList();
        int nextMark = 0;
        double nextTemperature = 0;
        long block = -1;
        double blockNoise = 0;
        long rows = 0;
        using (ICaptureWriter writer = CaptureFile.Create(path, md, CaptureFileFormat.Text))
        {
            const ulong offset = 12345;
            double t = 0;
            if (snapshots)
            {
                // Reads at jittered times; the phase is integrated up to each read time exactly (sub-steps of
                // at most 10 us, midpoint rule), so the counts carry no grid artefact.
                double phase = 0;
                double previous = 0;
                for (long r = 0; ; r++)
                {
                    double tr = (r * SnapshotEverySeconds) + (r == 0 ? 0 : SnapshotJitterSeconds * ((2 * rng.NextDouble()) - 1));
                    if (tr > DurationSeconds)
                    {
                        break;
                    }

                    int n = Math.Max(1, (int)Math.Ceiling((tr - previous) / 1e-5));
                    double h = (tr - previous) / n;
                    for (int j = 0; j < n; j++)
                    {
                        double tm = previous + ((j + 0.5) * h);
                        long b = (long)Math.Floor(tm / BlockSeconds);
                        if (b != block)
                        {
                            block = b;
                            blockNoise = BlockNoiseHz * SyntheticGateStream.Gaussian(rng);
                        }

                        double fs = SearchHzAt(tm);
                        phase += ((Signal == SignalKind.Beat ? Math.Abs(fs - ReferenceHz) : fs) + blockNoise) * h;
                    }

                    previous = tr;
                    double? temp = null;
                    if (TemperatureC != null && tr >= nextTemperature)
                    {
                        temp = Math.Round(TemperatureC(tr), 4);
                        nextTemperature += TemperatureEverySeconds;
                    }

                    string? mark = null;
                    if (nextMark < marks.Count && tr >= marks[nextMark].TimeSeconds)
                    {
                        mark = marks[nextMark].Mark;
                        nextMark++;
                    }

                    writer.WriteRow(new CaptureRow(rows + 1, offset + (ulong)Math.Round(tr * ClockHz), (ulong)Math.Floor(phase), temp, mark));
                    rows++;
                }

                writer.Complete(Array.Empty<KeyValuePair<string, string>>());
                return rows;
            }

            while (t <= DurationSeconds)
            {
                bool lost = InGap(t);
                double? temp = null;
                if (!lost && TemperatureC != null && t >= nextTemperature)
                {
                    temp = Math.Round(TemperatureC(t), 4);
                    nextTemperature += TemperatureEverySeconds;
                }

                string? mark = null;
                if (!lost && nextMark < marks.Count && t >= marks[nextMark].TimeSeconds)
                {
                    mark = marks[nextMark].Mark;
                    nextMark++;
                }

                if (!lost)
                {
                    ulong tick = offset + (ulong)Math.Round(t * ClockHz);
                    writer.WriteRow(new CaptureRow(rows + 1, tick, 0, temp, mark));
                    rows++;
                }

                long b = (long)Math.Floor(t / BlockSeconds);
                if (b != block)
                {
                    block = b;
                    blockNoise = BlockNoiseHz * SyntheticGateStream.Gaussian(rng);
                }

                double fs = SearchHzAt(t);
                double counted = (Signal == SignalKind.Beat ? Math.Abs(fs - ReferenceHz) : fs) + blockNoise;
                t += Prescale / counted;
            }

            writer.Complete(Array.Empty<KeyValuePair<string, string>>());
        }

        return rows;
    }

    private bool InGap(double t)
    {
        for (int i = 0; i < Gaps.Count; i++)
        {
            if (t >= Gaps[i].StartSeconds && t < Gaps[i].EndSeconds)
            {
                return true;
            }
        }

        return false;
    }
}
