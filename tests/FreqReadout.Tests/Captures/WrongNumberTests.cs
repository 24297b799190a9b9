using System.Globalization;
using System.Text;
using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Counting;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Captures;

/// <summary>
/// Captures that used to give a confident wrong number: rows out of order on a narrow timer, a signal aliased by
/// a timer or pulse counter too narrow for it, a no-signal timeout shorter than the signal's period.
/// </summary>
public sealed class WrongNumberTests
{
    /// <summary>Rows of a steady edge capture: tick i = start + i x ticksPerEdge, modulo 2^bits.</summary>
    private static List<ulong> Ticks(int bits, double ticksPerEdge, int rows, ulong start = 12345)
    {
        ulong mask = bits == 64 ? ulong.MaxValue : (1UL << bits) - 1;
        var ticks = new List<ulong>(rows);
        for (int i = 0; i < rows; i++)
        {
            ticks.Add((start + (ulong)Math.Round(i * ticksPerEdge)) & mask);
        }

        return ticks;
    }

    private static string Capture(double clockHz, int bits, IEnumerable<ulong> ticks, string extraHeader = "")
    {
        var sb = new StringBuilder("# freqreadout capture 1\n");
        sb.Append(CultureInfo.InvariantCulture, $"# clock_hz = {clockHz}\n# timer_bits = {bits}\n{extraHeader}tick\n");
        foreach (ulong t in ticks)
        {
            sb.Append(t.ToString(CultureInfo.InvariantCulture)).Append('\n');
        }

        return sb.ToString();
    }

    private static (List<CaptureGate> Gates, CaptureGateSource Source) Replay(string text, CounterSettings options, double? searchHz = null, bool noSignalGiven = true)
    {
        using var reader = ReadText(text, "test.csv");
        var source = new CaptureGateSource(reader, options, searchHz, noSignalGiven);
        return (source.ReadGates().ToList(), source);
    }

    [Theory]
    [InlineData(32, 20000)]
    [InlineData(24, 20000)]
    [InlineData(32, 2)] // the second and third rows: before the counter has a period, the read-ahead gives it
    public void Two_swapped_rows_are_one_skipped_row_with_a_warning_not_minutes_of_no_signal(int bits, int swapAt)
    {
        // 10 kHz recorded edges on an 80 MHz timer for 5 s. Taken as a forward step, the earlier row after the
        // later one is a wrap of 2^bits - 8000 ticks (53.7 s on 32 bits): thousands of no-signal gates.
        var ticks = Ticks(bits, 8000, 50_000);
        (ticks[swapAt], ticks[swapAt + 1]) = (ticks[swapAt + 1], ticks[swapAt]);
        var (gates, source) = Replay(Capture(80e6, bits, ticks), new CounterSettings { GateSeconds = 1 });

        Assert.Equal(1, source.FlaggedSteps);
        Assert.Equal(1, source.BackwardSteps);
        Assert.DoesNotContain(gates, g => g.Gate.State == GateState.NoSignal);
        Assert.InRange(gates[^1].Gate.EndSeconds, 4.0, 5.0);
        Assert.All(gates, g => Assert.Equal(10_000.0, g.Gate.FrequencyHz, 0.01));
        int line = swapAt + 1 + 5; // row index to line: 4 header lines, rows from line 5; the second of the pair is skipped
        string warning = Assert.Single(source.Warnings);
        Assert.StartsWith($"test.csv:{line}: the tick {ticks[swapAt + 1]} steps back by 8000 ticks", warning);
        Assert.Contains($"from the tick of line {line - 1}", warning);
        Assert.Contains("rows out of order", warning);
        Assert.Contains("the row is skipped", warning);
    }

    [Fact]
    public void A_long_forward_gap_is_still_no_signal_then_the_signal_restored()
    {
        // 1 s of 10 kHz, 3 s of silence, 1 s more, on a 32-bit 80 MHz timer (wrap 53.7 s).
        var ticks = Ticks(32, 8000, 10_000);
        ticks.AddRange(Ticks(32, 8000, 10_000, start: 12345 + (ulong)(4 * 80e6)));
        var (gates, source) = Replay(Capture(80e6, 32, ticks), new CounterSettings { GateSeconds = 0.5 });
        Assert.Equal(0, source.FlaggedSteps);
        Assert.Contains(gates, g => g.Gate.State == GateState.NoSignal);
        Assert.Equal(GateState.Ok, gates[^1].Gate.State);
        Assert.Equal(10_000.0, gates[^1].Gate.FrequencyHz, 0.01);
    }

    [Fact]
    public void A_signal_slower_than_the_timer_wrap_is_refused_when_search_hz_disagrees()
    {
        // 16-bit timer at 80 MHz wraps every 65536 ticks (819 us); a 1 kHz signal has 80000 ticks per period, so the
        // timer sees 80000 mod 65536 = 14464 ticks: 5530.97 Hz, steady and wrong.
        string text = Capture(80e6, 16, Ticks(16, 80000, 2000), "# search_hz = 1000\n");
        using var reader = ReadText(text, "alias.csv");
        var e = Assert.Throws<CaptureFormatException>(() => new CaptureGateSource(reader, new CounterSettings()));
        Assert.Equal(0, e.LineNumber);
        Assert.Contains("the capture measures about 5530.97 Hz, 5.5 times search_hz = 1000 Hz: the signal is likely aliased", e.Message);
        Assert.Contains("80000 ticks apart", e.Message);
        Assert.Contains("more than the wrap of the timer_bits = 16 timer, 65536 ticks", e.Message);

        // The same, with the expectation given by the caller (replay --search-hz) and none in the file.
        using var reader2 = ReadText(Capture(80e6, 16, Ticks(16, 80000, 2000)), "alias.csv");
        Assert.Throws<CaptureFormatException>(() => new CaptureGateSource(reader2, new CounterSettings(), 1000));
    }

    [Fact]
    public void Without_search_hz_the_fast_wrap_warning_says_the_frequency_may_be_aliased()
    {
        var (gates, source) = Replay(Capture(80e6, 16, Ticks(16, 80000, 2000)), new CounterSettings { GateSeconds = 0.05 });
        Assert.Equal(5530.97, gates[0].Gate.FrequencyHz, 0.01); // the data alone cannot tell
        Assert.Contains(source.Warnings, w => w.Contains("the frequency may be aliased", StringComparison.Ordinal));
    }

    [Fact]
    public void A_true_signal_near_search_hz_is_not_refused_and_a_wide_timer_only_warns_of_a_disagreement()
    {
        // 1 kHz on a 16-bit timer at 1 MHz: 1000 ticks per period, 65 per wrap: no alias, search_hz 5 % off.
        var (gates, source) = Replay(Capture(1e6, 16, Ticks(16, 1000, 2000), "# search_hz = 1050\n"), new CounterSettings());
        Assert.Equal(1000.0, gates[0].Gate.FrequencyHz, 1e-6);
        Assert.Empty(source.Warnings);

        // A 64-bit timer cannot alias: a search_hz far off is a warning (check clock_hz, prescale, search_hz), not a refusal.
        (gates, source) = Replay(Capture(1e6, 64, Ticks(64, 1000, 2000), "# search_hz = 5000\n"), new CounterSettings());
        Assert.Equal(1000.0, gates[0].Gate.FrequencyHz, 1e-6);
        Assert.Contains(source.Warnings, w => w.Contains("but search_hz = 5000 Hz (0.2 times): check clock_hz, prescale and search_hz", StringComparison.Ordinal));
    }

    [Fact]
    public void A_beat_note_read_above_the_search_frequency_is_refused_as_aliased()
    {
        // A 200 Hz beat on a 16-bit, 80 MHz timer: 400000 ticks per period, read as 400000 mod 65536 = 6784 ticks
        // (11792 Hz), above the 10 kHz search oscillator, which a beat of two oscillators tuned near each other cannot be.
        string text = Capture(80e6, 16, Ticks(16, 400000, 500), "# signal = beat\n# beat_side = above\n# search_hz = 10000\n");
        using var reader = ReadText(text, "beat.csv");
        var e = Assert.Throws<CaptureFormatException>(() => new CaptureGateSource(reader, new CounterSettings()));
        Assert.Contains("the beat note measures about 11792.5 Hz, above the search oscillator's 10000 Hz (search_hz)", e.Message);
        Assert.Contains("it is likely aliased", e.Message);
    }

    [Fact]
    public void Snapshots_whose_count_steps_exceed_the_counter_wrap_are_refused()
    {
        // 10 MHz counted by a 16-bit pulse counter read every 10 ms: 100000 counts per read, seen as 100000 mod 65536 = 34464.
        var sb = new StringBuilder("# freqreadout capture 1\n# kind = snapshots\n# clock_hz = 1000000\n# count_bits = 16\n# search_hz = 10000000\ntick,count\n");
        for (int i = 0; i < 300; i++)
        {
            sb.Append(CultureInfo.InvariantCulture, $"{i * 10000},{(i * 100000L) % 65536}\n");
        }

        using var reader = ReadText(sb.ToString(), "snap.csv");
        var e = Assert.Throws<CaptureFormatException>(() => new CaptureGateSource(reader, new CounterSettings()));
        Assert.Contains("the capture measures about 3446400 Hz, 2.9 times below search_hz = 10000000 Hz: the pulse counter likely wrapped between reads", e.Message);
        Assert.Contains("more than the wrap of the count_bits = 16 counter, 65536 counts", e.Message);
    }

    [Fact]
    public void A_no_signal_timeout_shorter_than_the_signal_period_is_refused_when_given()
    {
        // Recorded edges 0.5 s apart (a 131 kHz oscillator behind a 65536 prescaler): a 0.5 s timeout would make every gap "no signal".
        string text = "# freqreadout capture 1\n# clock_hz = 1000000\n# prescale = 65536\ntick\n" + string.Concat(Enumerable.Range(0, 60).Select(i => $"{i * 500000}\n"));
        using var reader = ReadText(text, "slow.csv");
        var e = Assert.Throws<ArgumentException>(() => new CaptureGateSource(reader, new CounterSettings { NoSignalSeconds = 0.5 }, null, noSignalSecondsGiven: true));
        Assert.Equal("--no-signal-seconds 0.5 is shorter than 3 periods of this capture (slow.csv: the recorded edges are about 500 ms apart): every ordinary gap would read as no signal; give at least 1.5 s", e.Message);
    }

    [Fact]
    public void The_default_no_signal_timeout_is_lengthened_for_a_slow_signal_with_a_warning()
    {
        string text = "# freqreadout capture 1\n# clock_hz = 1000000\n# prescale = 65536\ntick\n" + string.Concat(Enumerable.Range(0, 60).Select(i => $"{i * 500000}\n"));
        var (gates, source) = Replay(text, new CounterSettings { GateSeconds = 5 }, noSignalGiven: false);
        Assert.Equal(1.5, source.Settings.NoSignalSeconds);
        Assert.Contains(source.Warnings, w => w.Contains("the no-signal timeout is raised from its default 0.5 s to 1.5 s", StringComparison.Ordinal));
        Assert.All(gates, g => Assert.Equal(GateState.Ok, g.Gate.State));
        Assert.Equal(5, gates.Count);
    }

    [Fact]
    public void A_malformed_row_within_the_read_ahead_is_still_raised_after_the_gates_before_it()
    {
        // The read-ahead reads the first 64 rows; a bad row at row 40 must not be raised before the gates of rows 1-39.
        var ticks = Ticks(64, 200, 39).Select(t => t.ToString(CultureInfo.InvariantCulture)).ToList();
        ticks.Add("12x");
        string text = "# freqreadout capture 1\n# clock_hz = 10000000\ntick\n" + string.Join("\n", ticks) + "\n";
        using var reader = ReadText(text, "bad.csv");
        var source = new CaptureGateSource(reader, new CounterSettings { Mode = GateMode.Edges, GateEdges = 10 });
        var gates = new List<CaptureGate>();
        var e = Assert.Throws<CaptureFormatException>(() =>
        {
            foreach (var g in source.ReadGates())
            {
                gates.Add(g);
            }
        });
        Assert.Equal(3, gates.Count);
        Assert.Equal(43, e.LineNumber);
    }
}
