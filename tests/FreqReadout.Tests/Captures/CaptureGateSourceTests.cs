using System.Globalization;
using System.Text;
using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Counting;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Captures;

/// <summary>Captures replayed through the counting core by <see cref="CaptureGateSource"/>.</summary>
public sealed class CaptureGateSourceTests
{
    [Theory]
    [InlineData(EstimatorKind.Regression)]
    [InlineData(EstimatorKind.Reciprocal)]
    public void Minimal_gives_50000_Hz_exactly(EstimatorKind estimator)
    {
        // Contract README: "50 kHz exactly: 10 MHz clock, 200 ticks per edge, 101 edges".
        var gates = Replay(Contract("minimal.edges.csv"), new CounterSettings { Mode = GateMode.Edges, GateEdges = 100, Estimator = estimator }, out _);
        var gate = Assert.Single(gates).Gate;
        Assert.Equal(GateState.Ok, gate.State);
        Assert.Equal(50_000.0, gate.FrequencyHz);
        Assert.Equal(50_000.0, gate.ReciprocalHz);
        Assert.Equal(50_000.0, gate.RegressionHz);
        Assert.Equal(101, gate.Edges);
        Assert.Equal(estimator, gate.Estimator);
    }

    [Fact]
    public void Wrap16_unwraps_to_30000_Hz_within_one_tick_over_the_gate()
    {
        // Contract README: "16-bit timer at 8 MHz, prescale 4, input 30 kHz, wraps often: unwrap; 30 000 Hz within quantisation".
        // Reciprocal resolution +-1 tick over the gate, relative 1/(f_clk T) (Boyes, Instrumentation Reference Book,
        // 3rd ed., 2003, Fig. 20.75; HP Application Note 200, memory).
        var gates = Replay(Contract("wrap16.edges.csv"), new CounterSettings { Mode = GateMode.Edges, GateEdges = 199, Estimator = EstimatorKind.Reciprocal }, out var source);
        var gate = Assert.Single(gates).Gate;
        double spanTicks = gate.EndTick - gate.StartTick;
        Assert.InRange(spanTicks, 199 * 1066.0, 199 * 1067.0);
        double bound = 30_000.0 / spanTicks;
        Assert.InRange(gate.FrequencyHz, 30_000.0 - bound, 30_000.0 + bound);
        Assert.InRange(gate.RegressionHz, 30_000.0 - bound, 30_000.0 + bound);
        Assert.Equal(4, gate.Prescale);
        Assert.Equal(0, source.FlaggedSteps);
        Assert.Empty(source.Warnings); // 61 intervals per wrap: no fast-wrap warning
    }

    [Fact]
    public void Beat_with_temp_carries_temperatures_and_the_mark_into_their_gates()
    {
        // 400 Hz beat on a 1 MHz clock (2500 ticks per edge); 0.1 s gates close every 40 intervals:
        // gate 1 = data rows 1..41 (the mark `rebaseline` is on row 41, its closing edge), gate 2 = rows 42..81.
        var gates = Replay(Contract("beat-with-temp.edges.csv"), new CounterSettings { GateSeconds = 0.1 }, out var source);
        Assert.Equal(2, gates.Count);
        Assert.All(gates, g => Assert.Equal(400.0, g.Gate.FrequencyHz, 9));
        Assert.All(gates, g => Assert.Equal(SignalKind.Beat, g.Gate.Signal));
        Assert.Equal(new[] { "rebaseline" }, gates[0].Marks);
        Assert.Empty(gates[1].Marks);
        Assert.Equal(21.5, gates[0].TemperatureC);
        Assert.Equal(21.5, gates[1].LatestTemperatureC);
        Assert.Equal(51L, gates[0].LastLineNumber);
        Assert.Equal(0.1, gates[0].Gate.EndSeconds, 12);
        Assert.Equal(SignalKind.Beat, source.Settings.Signal);
    }

    [Fact]
    public void Snapshots_give_130000_Hz_within_the_regression_error_model()
    {
        // Contract README: "input exactly 130 kHz, 2001 reads ... regression of count on time gives
        // 130 000 Hz within its error model". The model (white count quantisation and read-time
        // resolution) is SnapshotCounter's; 3 sigma per gate is the usual acceptance band (common practice, no source).
        var gates = Replay(Contract("snapshots.edges.csv"), new CounterSettings { GateSeconds = 0.1 }, out var source);
        Assert.Equal(19, gates.Count);
        Assert.All(gates, g => Assert.Equal(EstimatorKind.SnapshotRegression, g.Gate.Estimator));
        Assert.All(gates, g => Assert.InRange(g.Gate.FrequencyHz, 130_000.0 - 3 * g.Gate.ErrorHz, 130_000.0 + 3 * g.Gate.ErrorHz));

        // The scatter of the 19 gates matches the predicted 1-sigma error: for 18 degrees of freedom the
        // ratio of sample to true sigma lies in about 0.68..1.31 at 95 % (chi-square); 0.6..1.4 here.
        double rms = Math.Sqrt(gates.Sum(g => Math.Pow(g.Gate.FrequencyHz - 130_000.0, 2)) / gates.Count);
        double predicted = gates.Average(g => g.Gate.ErrorHz);
        Assert.InRange(rms / predicted, 0.6, 1.4);
        Assert.Equal(2001, source.RowsFed);

        // One gate over the whole capture.
        var whole = Assert.Single(Replay(Contract("snapshots.edges.csv"), new CounterSettings { GateSeconds = 1.9 }, out _)).Gate;
        Assert.InRange(whole.FrequencyHz, 130_000.0 - 3 * whole.ErrorHz, 130_000.0 + 3 * whole.ErrorHz);
        Assert.True(whole.ErrorHz < 0.05, $"error {whole.ErrorHz} Hz over 1.9 s");
    }

    [Fact]
    public void A_narrow_pulse_counter_is_unwrapped()
    {
        // 16-bit counter and 16-bit timer read every 1000 ticks at 1 MHz, input 50 kHz: 50 counts per read,
        // the counter wraps every 1311 reads (no warning), the timer every 65.5 reads.
        var sb = new StringBuilder("# freqreadout capture 1\n# kind = snapshots\n# clock_hz = 1000000\n# timer_bits = 16\n# count_bits = 16\ntick,count\n");
        for (int i = 0; i < 5000; i++)
        {
            sb.Append((i * 1000L) % 65536).Append(',').Append((i * 50L) % 65536).Append('\n');
        }

        var gates = ReplayText(sb.ToString(), new CounterSettings { GateSeconds = 0.5 }, out var source);
        Assert.Equal(9, gates.Count);
        Assert.All(gates, g => Assert.Equal(50_000.0, g.Gate.FrequencyHz, 6));
        Assert.Empty(source.Warnings);
    }

    [Fact]
    public void A_pulse_counter_wrapping_within_8_reads_gives_a_warning()
    {
        // 16-bit counter, input 10 MHz read every 1000 ticks at 1 MHz: 10 000 counts per read, 6.6 reads per wrap.
        var sb = new StringBuilder("# freqreadout capture 1\n# kind = snapshots\n# clock_hz = 1000000\n# count_bits = 16\ntick,count\n");
        for (int i = 0; i < 500; i++)
        {
            sb.Append(i * 1000L).Append(',').Append((i * 10_000L) % 65536).Append('\n');
        }

        var gates = ReplayText(sb.ToString(), new CounterSettings { GateSeconds = 0.1 }, out var source);
        Assert.All(gates, g => Assert.Equal(10_000_000.0, g.Gate.FrequencyHz, 3));
        var warning = Assert.Single(source.Warnings);
        Assert.Contains("count_bits = 16: the pulse counter wraps every 65536 counts, only 6.6 snapshot intervals", warning);
    }

    [Fact]
    public void Settings_take_clock_prescale_and_signal_from_the_capture()
    {
        using var reader = CaptureFile.Open(Contract("wrap16.edges.csv"));
        var options = new CounterSettings { ClockHz = 1, Prescale = 99, GateSeconds = 0.02, JitterTicks = 2 };
        var source = new CaptureGateSource(reader, options);
        Assert.Equal((8e6, 4, SignalKind.Search, 0.02, 2.0), (source.Settings.ClockHz, source.Settings.Prescale, source.Settings.Signal, source.Settings.GateSeconds, source.Settings.JitterTicks));
        Assert.Equal(1.0, options.ClockHz); // the caller's options are not changed
    }

    [Fact]
    public void A_bad_setting_is_named_with_its_range()
    {
        using var reader = CaptureFile.Open(Contract("minimal.edges.csv"));
        var e = Assert.Throws<ArgumentException>(() => new CaptureGateSource(reader, new CounterSettings { GateSeconds = -1 }));
        Assert.Contains("gate seconds must be in [1e-6, 86400] s", e.Message);
    }

    [Fact]
    public void A_timer_wrapping_within_8_intervals_gives_one_warning()
    {
        // 16-bit timer at 8 MHz, 900 Hz edges: 8889 ticks per edge, 65536 / 8889 = 7.4 intervals per wrap (< 8).
        string text = EdgeCapture(8e6, 16, 900, 400);
        var gates = ReplayText(text, new CounterSettings { GateSeconds = 0.1 }, out var source);
        Assert.NotEmpty(gates);
        var warning = Assert.Single(source.Warnings);
        Assert.Contains("timer_bits = 16", warning);
        Assert.Contains("a dropout longer than one wrap would go unseen", warning);
        Assert.All(gates, g => Assert.Equal(900.0, g.Gate.FrequencyHz, 0.1));
    }

    [Fact]
    public void A_step_the_unwrapper_rejects_is_flagged_with_its_line_and_skipped()
    {
        // A repeated 16-bit timestamp (two edges at one tick) cannot be right.
        var sb = new StringBuilder("# freqreadout capture 1\n# clock_hz = 1000000\n# timer_bits = 16\ntick\n");
        for (int i = 0; i < 50; i++)
        {
            sb.Append((i * 1000) % 65536).Append('\n');
            if (i == 20)
            {
                sb.Append((i * 1000) % 65536).Append('\n'); // line 4 + 21 + 1 = 26
            }
        }

        var gates = ReplayText(sb.ToString(), new CounterSettings { Mode = GateMode.Edges, GateEdges = 10 }, out var source);
        Assert.Equal(1, source.FlaggedSteps);
        Assert.Equal(50, source.RowsFed);
        var warning = Assert.Single(source.Warnings);
        Assert.StartsWith("test.csv:26: the tick step to 20000 cannot be right for timer_bits = 16", warning);
        Assert.All(gates, g => Assert.Equal(1000.0, g.Gate.FrequencyHz, 9));
    }

    [Fact]
    public void A_long_silence_gives_no_signal_results_as_the_device_would_poll()
    {
        // 1 kHz edges on a 1 MHz clock, then 2 s of silence, then edges again; no-signal timeout 0.5 s:
        // polls at +0.5, +1.0 and +1.5 s into the gap each report no signal.
        var sb = new StringBuilder("# freqreadout capture 1\n# clock_hz = 1000000\ntick\n");
        long t = 0;
        for (int i = 0; i < 300; i++)
        {
            sb.Append(t.ToString(CultureInfo.InvariantCulture)).Append('\n');
            t += i == 149 ? 2_000_000 : 1000;
        }

        var gates = ReplayText(sb.ToString(), new CounterSettings { GateSeconds = 0.05, NoSignalSeconds = 0.5 }, out _);
        var silent = gates.Where(g => g.Gate.State == GateState.NoSignal).ToList();
        Assert.Equal(3, silent.Count);
        Assert.All(silent, g => Assert.False(g.Gate.HasFrequency));
        Assert.Equal(new[] { 0.649, 1.149, 1.649 }, silent.Select(g => Math.Round(g.Gate.EndSeconds, 3)));
        Assert.All(gates.Where(g => g.Gate.HasFrequency), g => Assert.Equal(1000.0, g.Gate.FrequencyHz, 9));
    }

    [Fact]
    public void Gates_stream_while_the_capture_is_still_being_produced()
    {
        var generated = new GeneratedCaptureStream(5_000_000);
        using var reader = CaptureFile.Open(generated, "generated.csv");
        var source = new CaptureGateSource(reader, new CounterSettings { GateSeconds = 0.001 });
        int n = 0;
        foreach (var gate in source.ReadGates())
        {
            Assert.Equal(320_000.0, gate.Gate.FrequencyHz, 6); // 80 MHz / 250 ticks
            if (++n == 100)
            {
                break;
            }
        }

        Assert.Equal(100, n);
        Assert.True(generated.BytesProduced < 2_000_000, $"only the start of the 50 MB capture was read ({generated.BytesProduced} bytes)");
    }

    internal static string EdgeCapture(double clockHz, int bits, double edgeHz, int rows)
    {
        var sb = new StringBuilder("# freqreadout capture 1\n");
        sb.Append(CultureInfo.InvariantCulture, $"# clock_hz = {clockHz}\n# timer_bits = {bits}\ntick\n");
        ulong mask = bits == 64 ? ulong.MaxValue : (1UL << bits) - 1;
        for (int i = 0; i < rows; i++)
        {
            ulong tick = (ulong)Math.Round(12345 + i * clockHz / edgeHz) & mask;
            sb.Append(tick.ToString(CultureInfo.InvariantCulture)).Append('\n');
        }

        return sb.ToString();
    }

    private static List<CaptureGate> Replay(string path, CounterSettings options, out CaptureGateSource source)
    {
        var reader = CaptureFile.Open(path);
        source = new CaptureGateSource(reader, options);
        var gates = source.ReadGates().ToList();
        reader.Dispose();
        return gates;
    }

    private static List<CaptureGate> ReplayText(string text, CounterSettings options, out CaptureGateSource source)
    {
        var reader = ReadText(text);
        source = new CaptureGateSource(reader, options);
        var gates = source.ReadGates().ToList();
        reader.Dispose();
        return gates;
    }
}
