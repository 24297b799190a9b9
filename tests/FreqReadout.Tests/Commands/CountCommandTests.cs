using System.Text.Json;
using FreqReadout.Host.Commands;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Commands;

/// <summary><c>freqreadout count</c> run in-process on the contract samples.</summary>
[Collection(ConsoleCollection.Name)]
public sealed class CountCommandTests
{
    [Fact]
    public void Json_lines_carry_the_contract_keys_and_50000_Hz_exactly_for_minimal()
    {
        // Contract README: minimal.edges.csv is 50 kHz exactly (101 edges, 200 ticks at 10 MHz).
        var (exit, stdout, stderr) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), "--gate-edges", "25", "--json");
        Assert.Equal(0, exit);
        Assert.Equal(string.Empty, stderr);
        var lines = stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(4, lines.Length); // 100 intervals in gates of 25
        double previous = 0;
        foreach (string line in lines)
        {
            using var doc = JsonDocument.Parse(line);
            var o = doc.RootElement;
            foreach (string key in new[] { "time_s", "frequency_hz", "shift_hz", "edges", "error_hz", "estimator", "state" })
            {
                Assert.True(o.TryGetProperty(key, out _), $"missing key {key} in {line}");
            }

            Assert.Equal(50_000.0, o.GetProperty("frequency_hz").GetDouble());
            Assert.Equal(0.0, o.GetProperty("shift_hz").GetDouble());
            Assert.Equal(26, o.GetProperty("edges").GetInt32()); // gates share their boundary edge
            Assert.Equal("regression", o.GetProperty("estimator").GetString());
            Assert.Equal("ok", o.GetProperty("state").GetString());
            Assert.True(o.GetProperty("error_hz").GetDouble() > 0);
            double t = o.GetProperty("time_s").GetDouble();
            Assert.Equal(previous + 0.0005, t, 12); // 25 x 200 ticks at 10 MHz
            previous = t;
        }
    }

    [Fact]
    public void Reciprocal_estimator_is_named_in_the_json()
    {
        var (exit, stdout, _) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), "--gate-edges", "100", "--estimator", "reciprocal", "--json");
        Assert.Equal(0, exit);
        using var doc = JsonDocument.Parse(stdout.Trim());
        Assert.Equal("reciprocal", doc.RootElement.GetProperty("estimator").GetString());
        Assert.Equal(50_000.0, doc.RootElement.GetProperty("frequency_hz").GetDouble());
    }

    [Fact]
    public void Snapshot_captures_report_the_snapshot_regression_estimator()
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run("count", Contract("snapshots.edges.csv"), "--gate-seconds", "0.5", "--json");
        Assert.Equal(0, exit);
        Assert.Equal(string.Empty, stderr);
        var rows = stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries).Select(l => JsonDocument.Parse(l).RootElement).ToList();
        Assert.Equal(3, rows.Count);
        Assert.All(rows, r => Assert.Equal("snapshot-regression", r.GetProperty("estimator").GetString()));

        // Contract README: input exactly 130 kHz; within 3 predicted sigma (common practice, no source).
        Assert.All(rows, r => Assert.InRange(r.GetProperty("frequency_hz").GetDouble(), 130_000 - 3 * r.GetProperty("error_hz").GetDouble(), 130_000 + 3 * r.GetProperty("error_hz").GetDouble()));
    }

    [Fact]
    public void Json_states_name_glitch_dropout_and_no_signal_with_null_frequencies()
    {
        // 1 kHz edges on a 1 MHz clock with a double-triggered edge, a 20-period gap (dropout) and 2 s of silence (no signal).
        var sb = new System.Text.StringBuilder("# freqreadout capture 1\n# clock_hz = 1000000\ntick\n");
        long t = 0;
        for (int i = 0; i < 300; i++)
        {
            sb.Append(t).Append('\n');
            if (i == 60)
            {
                sb.Append(t + 100).Append('\n');
            }

            t += i == 120 ? 20_000 : i == 170 ? 2_000_000 : 1000;
        }

        string dir = Directory.CreateTempSubdirectory("freqreadout-states").FullName;
        try
        {
            string path = Path.Combine(dir, "states.csv");
            File.WriteAllText(path, sb.ToString());
            var (exit, stdout, stderr) = ConsoleCapture.Run("count", path, "--gate-seconds", "0.05", "--json");
            Assert.Equal(0, exit);
            Assert.Equal(string.Empty, stderr);
            var rows = stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries).Select(l => JsonDocument.Parse(l).RootElement).ToList();
            var states = rows.Select(r => r.GetProperty("state").GetString()).ToList();
            Assert.Contains("ok", states);
            Assert.Contains("glitch", states);
            Assert.Contains("dropout", states);
            Assert.Equal(3, states.Count(s => s == "no_signal"));
            foreach (var r in rows.Where(r => r.GetProperty("state").GetString() == "no_signal"))
            {
                Assert.Equal(JsonValueKind.Null, r.GetProperty("frequency_hz").ValueKind);
                Assert.Equal(JsonValueKind.Null, r.GetProperty("shift_hz").ValueKind);
                Assert.Equal(JsonValueKind.Null, r.GetProperty("error_hz").ValueKind);
            }

            foreach (var r in rows.Where(r => r.GetProperty("state").GetString() != "no_signal"))
            {
                Assert.Equal(1000.0, r.GetProperty("frequency_hz").GetDouble(), 6);
            }
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    [Fact]
    public void A_fast_wrapping_timer_is_warned_about_on_stderr()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-wrap").FullName;
        try
        {
            string path = Path.Combine(dir, "fast.csv");
            File.WriteAllText(path, FreqReadout.Tests.Captures.CaptureGateSourceTests.EdgeCapture(8e6, 16, 900, 400));
            var (exit, stdout, stderr) = ConsoleCapture.Run("count", path, "--json");
            Assert.Equal(0, exit);
            Assert.NotEmpty(stdout);
            Assert.StartsWith($"warning: {path}: timer_bits = 16: the timer wraps every 65536 ticks", stderr);
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    [Fact]
    public void Jitter_ticks_raise_the_predicted_error()
    {
        double Error(string jitter)
        {
            var (_, stdout, _) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), "--gate-edges", "100", "--jitter-ticks", jitter, "--json");
            using var doc = JsonDocument.Parse(stdout.Trim());
            return doc.RootElement.GetProperty("error_hz").GetDouble();
        }

        // With 3 ticks of jitter the error model is the white one, sigma_x^2 = 1/12 + jitter^2 (docs/json-output.md, error_hz:
        // quantisation q^2/12 plus the configured jitter; Rubiola 2005): Var(P) = 12 sigma_x^2 / (N (N^2 - 1)),
        // N = 101, P = 200 ticks, f = 50 kHz. Changed deliberately (issue 8): without jitter the figure is
        // no longer the white 1/12 one but the quantisation model's, here at a whole-tick period its
        // worst case 1/2 x sum |i - mean| / sum (i - mean)^2 = 0.5 floor(N^2/4) / (N (N^2 - 1) / 12) ticks.
        double n = 101;
        double sxx = n * (n * n - 1) / 12;
        Assert.Equal(50_000 * Math.Sqrt((1.0 / 12 + 9) / sxx) / 200, Error("3"), 9);
        Assert.Equal(50_000 * 0.5 * Math.Floor(n * n / 4) / sxx / 200, Error("0"), 9);
    }

    [Fact]
    public void Shift_is_from_the_first_gate_of_the_counted_signal()
    {
        // wrap16: 30 kHz; gates of 20 recorded intervals each read within a tick of it, shifts from gate 1 are small and the first is 0.
        var (exit, stdout, _) = ConsoleCapture.Run("count", Contract("wrap16.edges.csv"), "--gate-edges", "20", "--json");
        Assert.Equal(0, exit);
        var rows = stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries).Select(l => JsonDocument.Parse(l).RootElement).ToList();
        Assert.Equal(9, rows.Count); // 199 intervals / 20
        double first = rows[0].GetProperty("frequency_hz").GetDouble();
        Assert.Equal(0.0, rows[0].GetProperty("shift_hz").GetDouble());
        foreach (var row in rows)
        {
            Assert.Equal(row.GetProperty("frequency_hz").GetDouble() - first, row.GetProperty("shift_hz").GetDouble(), 9);
            Assert.InRange(row.GetProperty("frequency_hz").GetDouble(), 29_990.0, 30_010.0);
        }
    }

    [Fact]
    public void Table_shows_metadata_unknown_keys_and_the_gates()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-count").FullName;
        try
        {
            string path = Path.Combine(dir, "rig.csv");
            File.WriteAllText(path, "# freqreadout capture 1\n# clock_hz = 1000000\n# rig_id = bench-7\n# beat_side = above\ntick,mark\n0,\n1000,\n2000,hold\n3000,\n4000,\n# frames_lost = 0\n");
            var (exit, stdout, stderr) = ConsoleCapture.Run("count", path, "--gate-edges", "2");
            Assert.Equal(0, exit);
            Assert.Contains("rig_id (unknown key)", stdout);
            Assert.Contains("bench-7", stdout);
            Assert.Contains("clock_hz", stdout);
            Assert.Contains("frequency Hz", stdout);
            Assert.Contains("1000.000", stdout);
            Assert.Contains("ok (hold)", stdout);
            Assert.Contains("frames_lost", stdout);
            Assert.Contains("2 gates (2 with a frequency) from 5 rows", stdout);
            Assert.Contains("warning: ", stderr);
            Assert.Contains("beat_side is ignored: signal = search", stderr);
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    public static TheoryData<string, string> BadFiles() => new()
    {
        { "bad-no-magic.edges.csv", ":1: not a capture" },
        { "bad-no-clock.edges.csv", ":3: missing required metadata key 'clock_hz'" },
        { "bad-tick-text.edges.csv", ":6: expected the tick as an unsigned integer (digits only), found '2x0'" },
        { "bad-beat-no-side.edges.csv", ":3: signal = beat needs the key 'beat_side'" },
        { "bad-tick-too-wide.edges.csv", ":6: tick 70000 exceeds the timer width" },
        { "bad-no-header-row.edges.csv", ":3: expected the column header row" },
    };

    [Theory]
    [MemberData(nameof(BadFiles))]
    public void A_bad_file_gives_one_clear_message_and_a_nonzero_exit(string name, string expected)
    {
        foreach (var json in new[] { false, true })
        {
            var args = new List<string> { "count", Contract(name) };
            if (json)
            {
                args.Add("--json");
            }

            var (exit, stdout, stderr) = ConsoleCapture.Run(args.ToArray());
            Assert.Equal(CommandOutput.BadInput, exit);
            string line = Assert.Single(stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries));
            Assert.Equal("error: " + Contract(name) + expected, line.Substring(0, ("error: " + Contract(name) + expected).Length));
            Assert.DoesNotContain("   at ", stderr); // no stack trace
            if (json)
            {
                Assert.Equal(string.Empty, stdout);
            }
        }
    }

    [Theory]
    [InlineData("--gate-seconds", "0", "--gate-seconds must be a number of seconds in [1e-6, 86400], got '0'")]
    [InlineData("--gate-edges", "0", "--gate-edges must be an integer from 1 to 1048576")]
    [InlineData("--estimator", "median", "--estimator must be reciprocal or regression, got 'median'")]
    [InlineData("--jitter-ticks", "-1", "--jitter-ticks must be a number of rms ticks in [0, 1e9], got '-1'")]
    [InlineData("--jitter-ticks", "1e308", "--jitter-ticks must be a number of rms ticks in [0, 1e9], got '1e308'")]
    [InlineData("--no-signal-seconds", "-1", "--no-signal-seconds must be a number of seconds in [0.001, 3600], got '-1'")]
    [InlineData("--no-signal-seconds", "1e-9", "--no-signal-seconds must be a number of seconds in [0.001, 3600], got '1e-9'")]
    public void A_bad_option_is_named_with_its_range(string option, string value, string expected)
    {
        var (exit, _, stderr) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), option, value);
        Assert.Equal(CommandOutput.BadOption, exit);
        Assert.Contains(expected, stderr);
    }

    [Theory]
    [InlineData(new[] { "count" }, "error: Command 'count' is missing required argument 'capture'")]
    [InlineData(new[] { "count", "x.csv", "--gate-second", "1" }, "error: Unknown option 'gate-second'")]
    public void Usage_errors_are_one_line_without_a_stack_trace(string[] args, string expected)
    {
        var (exit, _, stderr) = ConsoleCapture.RunMain(args);
        Assert.Equal(2, exit);
        Assert.StartsWith(expected, stderr);
        Assert.Single(stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries));
    }

    [Fact]
    public void A_value_that_is_not_a_number_is_named()
    {
        var (exit, _, stderr) = ConsoleCapture.RunMain("count", Contract("minimal.edges.csv"), "--gate-seconds", "0,5");
        Assert.Equal(CommandOutput.BadOption, exit);
        Assert.Equal("error: --gate-seconds must be a number of seconds in [1e-6, 86400], got '0,5'\n", stderr);
    }

    [Fact]
    public void Gate_seconds_and_gate_edges_together_are_refused()
    {
        var (exit, _, stderr) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), "--gate-seconds", "0.001", "--gate-edges", "5");
        Assert.Equal(CommandOutput.BadOption, exit);
        Assert.Contains("either --gate-seconds or --gate-edges, not both", stderr);
    }

    [Fact]
    public void A_missing_file_is_a_clear_error()
    {
        var (exit, _, stderr) = ConsoleCapture.Run("count", "no-such-capture.csv");
        Assert.Equal(CommandOutput.BadInput, exit);
        Assert.StartsWith("error: no-such-capture.csv: cannot open the capture", stderr);
    }

    [Fact]
    public void Count_reads_binary_captures_by_content()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-count").FullName;
        try
        {
            string binary = Path.Combine(dir, "minimal.csv"); // a binary file with a text-like name
            var (convertExit, _, _) = ConsoleCapture.Run("convert", Contract("minimal.edges.csv"), binary, "--to", "binary");
            Assert.Equal(0, convertExit);
            var fromText = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), "--gate-edges", "10", "--json");
            var fromBinary = ConsoleCapture.Run("count", binary, "--gate-edges", "10", "--json");
            Assert.Equal(0, fromBinary.Exit);
            Assert.Equal(fromText.Out, fromBinary.Out);
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    [Theory]
    [InlineData("below", -10.0)]
    [InlineData("above", 10.0)]
    public void In_beat_mode_the_search_shift_is_shown_beside_the_beat_shift(string side, double searchShift)
    {
        // A beat of 400 Hz for 1 s, then 410 Hz for 1 s, on a 1 MHz timer: the beat rose by 10 Hz. With the search
        // oscillator below the reference (beat = f_ref - f_search) the search oscillator fell by 10 Hz.
        var sb = new System.Text.StringBuilder($"# freqreadout capture 1\n# clock_hz = 1000000\n# signal = beat\n# beat_side = {side}\ntick\n");
        double t = 0;
        for (int i = 0; i <= 800; i++)
        {
            sb.Append(((long)Math.Round(t)).ToString(System.Globalization.CultureInfo.InvariantCulture)).Append('\n');
            t += i < 400 ? 1e6 / 400 : 1e6 / 410;
        }

        string path = Path.Combine(Path.GetTempPath(), $"freqreadout-beat-{Guid.NewGuid():N}.csv");
        File.WriteAllText(path, sb.ToString());
        try
        {
            var (exit, stdout, stderr) = ConsoleCapture.Run("count", path, "--gate-seconds", "0.5", "--json");
            Assert.True(exit == 0, stderr);
            var last = System.Text.Json.JsonDocument.Parse(stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries)[^1]).RootElement;
            Assert.Equal(10.0, last.GetProperty("shift_hz").GetDouble(), 0.01);          // the counted signal, as the contract says
            Assert.Equal(searchShift, last.GetProperty("search_shift_hz").GetDouble(), 0.01);

            (exit, stdout, stderr) = ConsoleCapture.Run("count", path, "--gate-seconds", "0.5");
            Assert.True(exit == 0, stderr);
            Assert.Contains("beat shift", stdout);   // the header may wrap its unit onto a second line
            Assert.Contains("search shift", stdout);
            string row = stdout.Split('\n').Last(l => l.Contains(" ok", StringComparison.Ordinal));
            Assert.Contains(side == "below" ? "+10.000   -10.000" : "+10.000   +10.000", System.Text.RegularExpressions.Regex.Replace(row, " +", "   "));
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void The_estimator_option_on_a_snapshot_capture_is_said_to_have_no_effect()
    {
        var (exit, _, stderr) = ConsoleCapture.Run("count", Contract("snapshots.edges.csv"), "--estimator", "reciprocal", "--json");
        Assert.Equal(0, exit);
        Assert.Single(stderr.Split('\n'), l => l == "warning: --estimator reciprocal does not apply to a snapshot capture: its gates always use snapshot-regression");
    }

    /// <summary>inferred_edges and scatter_hz are in every JSON line (scatter null on the first gate, 0 on the exact 50 kHz sample).</summary>
    [Fact]
    public void Json_lines_carry_inferred_edges_and_scatter()
    {
        var (exit, stdout, _) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), "--gate-edges", "25", "--json");
        Assert.Equal(0, exit);
        var rows = stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries).Select(l => JsonDocument.Parse(l).RootElement).ToList();
        Assert.Equal(JsonValueKind.Null, rows[0].GetProperty("scatter_hz").ValueKind);
        Assert.All(rows.Skip(1), r => Assert.Equal(0.0, r.GetProperty("scatter_hz").GetDouble()));
        Assert.All(rows, r => Assert.Equal(0, r.GetProperty("inferred_edges").GetInt32()));
    }

    [Theory]
    [InlineData("--mains-hz", "5", "--mains-hz must be a number from 10 to 1000")]
    [InlineData("--mains-hz", "fifty", "--mains-hz must be a number")]
    public void Bad_mains_option_is_refused_with_its_range(string option, string value, string message)
    {
        var (exit, _, stderr) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), option, value);
        Assert.NotEqual(0, exit);
        Assert.Contains(message, stderr);
        (exit, _, stderr) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), "--mains-hz", "50", "--gate-edges", "10");
        Assert.NotEqual(0, exit);
        Assert.Contains("does not go with --gate-edges", stderr);
    }

    [Fact]
    public void Mains_option_shows_the_nulling_gate_in_the_table_header()
    {
        // 1.2 s of a 1 kHz signal on a 1 MHz timer (invented test data): long enough for the ~0.1 s mains gates.
        var sb = new System.Text.StringBuilder("# freqreadout capture 1\n# clock_hz = 1000000\ntick\n");
        for (int i = 0; i <= 1200; i++)
        {
            sb.Append((i * 1000).ToString(System.Globalization.CultureInfo.InvariantCulture)).Append('\n');
        }

        string path = Path.Combine(Path.GetTempPath(), $"freqreadout-mains-{Guid.NewGuid():N}.csv");
        File.WriteAllText(path, sb.ToString());
        string stdout;
        int exit;
        try
        {
            (exit, stdout, _) = ConsoleCapture.Run("count", path, "--gate-seconds", "0.1", "--mains-hz", "50");
        }
        finally
        {
            File.Delete(path);
        }

        Assert.Equal(0, exit);
        Assert.Contains("periods of 50 Hz mains, asked 0.1 s", stdout);
        (exit, stdout, _) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), "--gate-edges", "25");
        Assert.Equal(0, exit);
        Assert.Contains("scatter Hz", stdout);
    }
}
