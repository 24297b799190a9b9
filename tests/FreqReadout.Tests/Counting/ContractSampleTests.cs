using System.Globalization;
using FreqReadout.Counting;

namespace FreqReadout.Tests.Counting;

/// <summary>
/// The counting core on the capture-format contract samples (docs/contracts, copied to Data/contracts in
/// the test output; see the contract README there: invented data whose truth that README states). Parsed here with a minimal
/// reader: the real capture reader is host code with its own tests.
/// </summary>
public class ContractSampleTests
{
    private static (Dictionary<string, string> Meta, List<ulong[]> Rows) Load(string name)
    {
        var meta = new Dictionary<string, string>();
        var rows = new List<ulong[]>();
        bool header = false;
        foreach (string raw in File.ReadLines(Path.Combine(AppContext.BaseDirectory, "Data", "contracts", name)))
        {
            string line = raw.Trim();
            if (line.Length == 0) continue;
            if (line.StartsWith('#'))
            {
                int eq = line.IndexOf('=');
                if (eq > 0) meta[line[1..eq].Trim()] = line[(eq + 1)..].Trim();
                continue;
            }

            if (!header) { header = true; continue; }
            rows.Add(line.Split(',').Select(p => ulong.Parse(p, CultureInfo.InvariantCulture)).ToArray());
        }

        return (meta, rows);
    }

    /// <summary>minimal.edges.csv: 50 kHz exactly, 10 MHz clock, 200 ticks per edge, 101 edges (contract README): both estimators give 50 000 Hz.</summary>
    [Fact]
    public void Minimal_sample_gives_50_kHz_exactly()
    {
        var (meta, rows) = Load("minimal.edges.csv");
        var u = new TimerUnwrapper(meta.TryGetValue("timer_bits", out string? bits) ? int.Parse(bits) : 64);
        var c = new EdgeCounter(new CounterSettings
        {
            ClockHz = double.Parse(meta["clock_hz"], CultureInfo.InvariantCulture),
            Mode = GateMode.Edges,
            GateEdges = 100,
        });
        GateResult r = default;
        bool got = false;
        foreach (ulong[] row in rows)
        {
            Assert.True(u.TryUnwrap(row[0], out long tick));
            got = c.AddEdge(tick, out r);
        }

        Assert.Equal(101, rows.Count);
        Assert.True(got);
        Assert.Equal(101, r.Edges);
        Assert.Equal(50_000.0, r.ReciprocalHz, 1e-9);
        Assert.Equal(50_000.0, r.RegressionHz, 1e-9);
        Assert.Equal(0.002, r.SpanSeconds, 12); // 100 intervals x 200 ticks at 10 MHz
    }

    /// <summary>wrap16.edges.csv: 16-bit timer at 8 MHz, prescale 4, input 30 kHz: 30 000 Hz within quantisation (contract README), i.e. the one-tick bound of Boyes 2003, Fig. 20.75.</summary>
    [Fact]
    public void Wrap16_sample_unwraps_and_counts_30_kHz_within_quantisation()
    {
        var (meta, rows) = Load("wrap16.edges.csv");
        Assert.Equal("16", meta["timer_bits"]);
        var u = new TimerUnwrapper(int.Parse(meta["timer_bits"]));
        var c = new EdgeCounter(new CounterSettings
        {
            ClockHz = double.Parse(meta["clock_hz"], CultureInfo.InvariantCulture),
            Prescale = int.Parse(meta["prescale"]),
            Mode = GateMode.Edges,
            GateEdges = rows.Count - 1,
            Estimator = EstimatorKind.Reciprocal,
        });
        GateResult r = default;
        bool got = false;
        foreach (ulong[] row in rows)
        {
            Assert.True(u.TryUnwrap(row[0], out long tick));
            got = c.AddEdge(tick, out r);
        }

        Assert.True(got);
        Assert.True(u.Wraps >= 3, "wraps " + u.Wraps);
        Assert.Equal(rows.Count, r.Edges);
        Assert.Equal(4, r.Prescale);
        double bound = 30_000.0 / (r.EndTick - r.StartTick);
        Assert.InRange(r.ReciprocalHz, 30_000 - bound, 30_000 + bound);
        Assert.InRange(r.RegressionHz, 30_000 - bound, 30_000 + bound);
        Assert.False(u.TryGetWrapWarning(c.RunningPeriodTicks, out _)); // 65536 / 1067 = 61 intervals per wrap
        Assert.Equal(8e6 * 4 / 30_000, c.RunningPeriodTicks, 0.5); // ticks per recorded edge = clock x prescale / f_input
    }

    /// <summary>snapshots.edges.csv: input exactly 130 kHz; regression of count on time gives 130 000 Hz within its error model (contract README). Checked at 3 sigma of the reported ErrorHz.</summary>
    [Theory]
    [InlineData(0.0)]
    [InlineData(11.547)] // +-20 us uniform read jitter = 20/sqrt(3) us rms
    public void Snapshot_sample_gives_130_kHz_within_its_error_model(double jitterTicks)
    {
        var (meta, rows) = Load("snapshots.edges.csv");
        Assert.Equal("snapshots", meta["kind"]);
        var ut = new TimerUnwrapper(int.Parse(meta["timer_bits"]));
        var uc = new TimerUnwrapper(int.Parse(meta["count_bits"]), true);
        var c = new SnapshotCounter(new CounterSettings
        {
            ClockHz = double.Parse(meta["clock_hz"], CultureInfo.InvariantCulture),
            GateSeconds = 1.0,
            JitterTicks = jitterTicks,
        });
        var results = new List<GateResult>();
        foreach (ulong[] row in rows)
        {
            Assert.True(ut.TryUnwrap(row[0], out long tick));
            Assert.True(uc.TryUnwrap(row[1], out long count));
            if (c.AddSnapshot(tick, count, out GateResult r)) results.Add(r);
        }

        Assert.Single(results); // 2 s of reads: the second gate would close at or after 2.0 s, beyond the last read
        GateResult g = results[0];
        Assert.Equal(GateState.Ok, g.State);
        Assert.Equal(EstimatorKind.SnapshotRegression, g.Estimator);
        Assert.InRange(g.Edges, 990, 1010);
        Assert.True(g.ErrorHz > 0.02 && g.ErrorHz < 0.5, "error " + g.ErrorHz);
        Assert.InRange(g.FrequencyHz, 130_000 - 3 * g.ErrorHz, 130_000 + 3 * g.ErrorHz);
        Assert.Equal(g.FrequencyHz, g.RegressionHz);
        Assert.Equal(0.0, g.ReciprocalHz);
    }
}
