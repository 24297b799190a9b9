using System.Globalization;
using System.Text.Json;
using FreqReadout.Counting;
using FreqReadout.Tests.Tracking;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// <c>freqreadout replay</c> end to end through real edge captures (written by the capture text writer
/// from a known frequency profile, invented data), the contract samples and bad input.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ReplayCommandTests : IDisposable
{
    private const double F0 = 100_000;
    private readonly string _dir = Path.Combine(Path.GetTempPath(), "freqreadout-replay-" + Guid.NewGuid().ToString("N"));

    public ReplayCommandTests()
    {
        Directory.CreateDirectory(_dir);
    }

    public void Dispose()
    {
        Directory.Delete(_dir, true);
    }

    private string PathOf(string name) => Path.Combine(_dir, name);

    // Search truth: settling of -200 ppm (tau 60 s), a +2 Hz pass at 30 s (1 s wide), a -2 Hz pass at
    // 50 s (0.5 s wide), a still +1.5 Hz target from 70 s to 78 s, and a +3 Hz target that comes at 115 s
    // and is still there when the capture ends at 120 s.
    private static double SearchProfile(double t)
    {
        double f = F0 - (200e-6 * F0 * (1 - Math.Exp(-t / 60)));
        f += new TargetPass(30, 1.0, 2.0).ShiftAt(t) + new TargetPass(50, 0.5, -2.0).ShiftAt(t);
        f += t >= 70 && t < 78 ? 1.5 : 0;
        f += t >= 115 ? 3.0 : 0;
        return f;
    }

    private static JsonElement ParseSingleObject(string stdout)
    {
        // Exactly one JSON object on stdout: the whole text parses as one document.
        using var doc = JsonDocument.Parse(stdout);
        Assert.Equal(JsonValueKind.Object, doc.RootElement.ValueKind);
        return doc.RootElement.Clone();
    }

    [Fact]
    public void Search_capture_gives_the_contract_json_with_events_rebaseline_hold_and_utc()
    {
        var capture = new SyntheticEdgeCapture
        {
            DurationSeconds = 120,
            SearchHzAt = SearchProfile,
            StartedUtc = new DateTimeOffset(2026, 11, 30, 8, 15, 0, TimeSpan.Zero),
        };
        capture.Marks.Add((40.0, "rebaseline"));
        capture.Marks.Add((69.0, "hold"));
        capture.Marks.Add((100.0, "release"));
        capture.Marks.Add((101.0, "coil lifted")); // carried, no effect
        string path = PathOf("search.edges.csv");
        long rows = capture.Write(path);

        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json", "--persistent-shift-s", "5");
        Assert.True(exit == 0, stderr);
        JsonElement o = ParseSingleObject(stdout);

        // Shape of issue 3.
        JsonElement c = o.GetProperty("capture");
        Assert.Equal(rows, c.GetProperty("edges").GetInt64());
        Assert.InRange(c.GetProperty("duration_s").GetDouble(), 119.8, 120.0);
        Assert.Equal("search", c.GetProperty("signal").GetString());
        long gates = o.GetProperty("gates").GetInt64();
        Assert.InRange(gates, 1195, 1200);

        // baseline_hz: the first captured baseline (truth at about 6 s: 100 kHz x (1 - 200e-6 (1 - e^-0.1))).
        double firstBaseline = SearchProfile(6.0);
        Assert.InRange(o.GetProperty("baseline_hz").GetDouble() - firstBaseline, -0.1, 0.1);

        // noise_hz: 0.3 Hz block noise over ten 10 ms blocks per 0.1 s gate gives about 0.095 Hz.
        Assert.InRange(o.GetProperty("noise_hz").GetDouble(), 0.07, 0.13);

        // drift_hz_per_min: the settling's mean slope over 6..120 s is (f(120) - f(6)) / 114 s, about -2.2 Hz/min,
        // and the still targets and the re-baseline move the tracked baseline little; within 25 %.
        double driftTruth = (SearchProfile(114) - SearchProfile(6)) / 108 * 60;
        Assert.InRange(o.GetProperty("drift_hz_per_min").GetDouble(), driftTruth * 1.25, driftTruth * 0.75);

        // Re-baselines: the manual mark at 40 s only (hold kept the still target from auto re-baselining
        // although it outlasted --persistent-shift-s 5).
        JsonElement[] rebaselines = o.GetProperty("rebaselines").EnumerateArray().ToArray();
        JsonElement manual = Assert.Single(rebaselines);
        Assert.Equal("manual", manual.GetProperty("reason").GetString());
        Assert.InRange(manual.GetProperty("time_s").GetDouble(), 40.0, 40.2);

        // Events: the two passes, the still target, and the open one closed at the end with a warning.
        JsonElement[] events = o.GetProperty("events").EnumerateArray().ToArray();
        Assert.Equal(4, events.Length);
        (double centre, double peak, string cls)[] expected =
        {
            (30, 2.0, "non-ferrous"), (50, -2.0, "ferrous"), (74, 1.5, "non-ferrous"), (117, 3.0, "non-ferrous"),
        };
        for (int i = 0; i < 4; i++)
        {
            JsonElement e = events[i];
            foreach (string key in new[] { "start_s", "end_s", "peak_s", "peak_shift_hz", "peak_shift_ppm", "class", "start_utc" })
            {
                Assert.True(e.TryGetProperty(key, out _), $"event {i} lacks {key}");
            }

            Assert.Equal(expected[i].cls, e.GetProperty("class").GetString());
            double p = e.GetProperty("peak_shift_hz").GetDouble();
            Assert.InRange(p, expected[i].peak - 0.45, expected[i].peak + 0.45); // 10 % of 2 Hz or 4 sigma (0.4 Hz), see TargetPassTests
            Assert.Equal(p / F0 * 1e6, e.GetProperty("peak_shift_ppm").GetDouble(), 0.01);
            double start = e.GetProperty("start_s").GetDouble();
            Assert.InRange(start, expected[i].centre - 4, expected[i].centre + 0.2);
            DateTimeOffset utc = DateTimeOffset.Parse(e.GetProperty("start_utc").GetString()!, CultureInfo.InvariantCulture);
            Assert.Equal(capture.StartedUtc!.Value.AddSeconds(start), utc, TimeSpan.FromMilliseconds(1));
        }

        Assert.InRange(events[3].GetProperty("end_s").GetDouble(), 119.5, 120.0);
        string[] warnings = o.GetProperty("warnings").EnumerateArray().Select(w => w.GetString()!).ToArray();
        Assert.Contains(warnings, w => w.Contains("still open at the end"));
        Assert.Contains(warnings, w => w.StartsWith("events during settling are not reported"));
        Assert.Contains(warnings, w => w.Contains("marks other than rebaseline"));

        // Diagnostics on stderr, the caution with them.
        Assert.Contains("warning: ", stderr);
        Assert.Contains("approved voltage tester", stderr);
    }

    [Fact]
    public void Without_hold_a_persistent_shift_is_an_auto_re_baseline_with_its_shift()
    {
        var capture = new SyntheticEdgeCapture { DurationSeconds = 60, SearchHzAt = t => F0 + (t >= 20 ? -2.5 : 0) };
        string path = PathOf("step.edges.csv");
        capture.Write(path);
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json", "--persistent-shift-s", "10");
        Assert.True(exit == 0, stderr);
        JsonElement o = ParseSingleObject(stdout);
        JsonElement r = Assert.Single(o.GetProperty("rebaselines").EnumerateArray().ToArray());
        Assert.Equal("auto", r.GetProperty("reason").GetString());
        Assert.InRange(r.GetProperty("time_s").GetDouble(), 30.0, 30.3);
        Assert.InRange(r.GetProperty("shift_hz").GetDouble(), -2.7, -2.3);
        Assert.Equal(r.GetProperty("time_s").GetDouble(), r.GetProperty("completed_s").GetDouble()); // re-acquired from the readings held

        // The confirmed event that the re-baseline absorbed is reported and flagged (issue 8).
        JsonElement e = Assert.Single(o.GetProperty("events").EnumerateArray().ToArray());
        Assert.True(e.GetProperty("absorbed").GetBoolean());
        Assert.Equal("ferrous", e.GetProperty("class").GetString());
        Assert.InRange(e.GetProperty("peak_shift_hz").GetDouble(), -3.0, -2.2);
    }

    [Theory]
    [InlineData(BeatSide.Above, 99_000.0)]
    [InlineData(BeatSide.Below, 101_000.0)]
    public void Beat_capture_reports_search_shifts_and_classes(BeatSide side, double referenceHz)
    {
        // 1 kHz beat, no prescaler; a +2 Hz search pass at 20 s and a -2 Hz one at 35 s.
        var capture = new SyntheticEdgeCapture
        {
            DurationSeconds = 45,
            Prescale = 1,
            Signal = SignalKind.Beat,
            BeatSide = side,
            ReferenceHz = referenceHz,
            SearchHz = F0,
            SearchHzAt = t => F0 + new TargetPass(20, 1.0, 2.0).ShiftAt(t) + new TargetPass(35, 1.0, -2.0).ShiftAt(t),
        };
        string path = PathOf("beat.edges.csv");
        capture.Write(path);
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json");
        Assert.True(exit == 0, stderr);
        JsonElement o = ParseSingleObject(stdout);
        Assert.Equal("beat", o.GetProperty("capture").GetProperty("signal").GetString());
        Assert.InRange(o.GetProperty("baseline_hz").GetDouble(), 999, 1001); // counted signal: the beat
        JsonElement[] events = o.GetProperty("events").EnumerateArray().ToArray();
        Assert.Equal(2, events.Length);
        Assert.InRange(events[0].GetProperty("peak_shift_hz").GetDouble(), 1.6, 2.4);
        Assert.Equal("non-ferrous", events[0].GetProperty("class").GetString());
        Assert.InRange(events[1].GetProperty("peak_shift_hz").GetDouble(), -2.4, -1.6);
        Assert.Equal("ferrous", events[1].GetProperty("class").GetString());
        Assert.InRange(events[0].GetProperty("peak_shift_ppm").GetDouble(), 16, 24); // of search_hz = 100 kHz

        // Polarity inverted swaps the classes, not the shifts.
        var (_, inverted, _) = ConsoleCapture.Run("replay", path, "--json", "--polarity", "inverted");
        JsonElement[] flipped = ParseSingleObject(inverted).GetProperty("events").EnumerateArray().ToArray();
        Assert.Equal("ferrous", flipped[0].GetProperty("class").GetString());
        Assert.Equal("non-ferrous", flipped[1].GetProperty("class").GetString());
        Assert.Equal(events[0].GetProperty("peak_shift_hz").GetDouble(), flipped[0].GetProperty("peak_shift_hz").GetDouble());
    }

    [Fact]
    public void Readings_and_events_csv_are_written()
    {
        var capture = new SyntheticEdgeCapture { DurationSeconds = 20, SearchHzAt = t => F0 + new TargetPass(12, 1.0, -2.0).ShiftAt(t) };
        string path = PathOf("csv.edges.csv");
        capture.Write(path);
        string readings = PathOf("readings.csv");
        string events = PathOf("events.csv");
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json", "--readings", readings, "--events", events);
        Assert.True(exit == 0, stderr);
        JsonElement o = ParseSingleObject(stdout);
        string[] r = File.ReadAllLines(readings);
        Assert.StartsWith("time_s,state,frequency_hz,baseline_hz,shift_hz", r[0]);
        Assert.Equal(o.GetProperty("gates").GetInt64(), r.Length - 1);
        Assert.Contains(r, line => line.Contains(",target,"));
        Assert.Contains(r, line => line.Contains(",settling,"));
        string[] e = File.ReadAllLines(events);
        Assert.Equal(2, e.Length);
        Assert.StartsWith("start_s,end_s,peak_s,peak_shift_hz", e[0]);
        Assert.Contains(",ferrous,", e[1]);
    }

    [Fact]
    public void Text_summary_lists_baseline_noise_drift_and_events_with_the_caution()
    {
        var capture = new SyntheticEdgeCapture { DurationSeconds = 20, SearchHzAt = t => F0 + new TargetPass(12, 1.0, 2.0).ShiftAt(t) };
        string path = PathOf("text.edges.csv");
        capture.Write(path);
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", path);
        Assert.True(exit == 0, stderr);
        foreach (string word in new[] { "edges", "duration", "gates", "baseline", "noise", "ppm", "drift", "re-baselines: 0", "events: 1", "non-ferrous", "approved voltage tester" })
        {
            Assert.Contains(word, stdout);
        }
    }

    [Fact]
    public void Contract_beat_sample_replays_without_error()
    {
        // beat-with-temp.edges.csv is 0.2 s long: no baseline, said so in the warnings; the JSON is still one object.
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", Contract("beat-with-temp.edges.csv"), "--json");
        Assert.True(exit == 0, stderr);
        JsonElement o = ParseSingleObject(stdout);
        Assert.Equal(JsonValueKind.Null, o.GetProperty("baseline_hz").ValueKind);
        Assert.Equal("beat", o.GetProperty("capture").GetProperty("signal").GetString());
        Assert.Contains(o.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("no baseline was captured"));
    }

    [Theory]
    [InlineData("--threshold-sigma", "0.5", "threshold_sigma must be in [1, 1000]")]
    [InlineData("--hysteresis-sigma", "9", "hysteresis_sigma must be in [0, threshold_sigma)")]
    [InlineData("--persistent-shift-s", "0", "persistent_shift_s must be in [1, 86400]")]
    [InlineData("--tracker-memory-s", "-1", "tracker_memory_s must be in [0.4, 120]")]
    [InlineData("--baseline-s", "0", "baseline_s must be in (0, 600]")]
    [InlineData("--noise-window-gates", "3", "noise_window_gates must be an integer in [16, 4096], got 3")]
    [InlineData("--polarity", "sideways", "--polarity must be normal or inverted")]
    [InlineData("--threshold-sigma", "five", "--threshold-sigma must be a number in [1, 1000], got 'five'")]
    [InlineData("--release-s", "NaN", "--release-s must be a number in [0, 60], got 'NaN'")]
    [InlineData("--tracker-memory-s", "1e400", "--tracker-memory-s must be a number in [0.4, 120], got '1e400'")]
    [InlineData("--hysteresis-sigma", "2,5", "--hysteresis-sigma must be a number in [0, threshold_sigma)")]
    [InlineData("--search-hz", "fast", "--search-hz must be a number (Hz) in [0, 1e12]")]
    [InlineData("--noise-window-gates", "1.5", "--noise-window-gates must be an integer in [16, 4096], got '1.5'")]
    [InlineData("--tracker-delay-gates", "99999999999", "--tracker-delay-gates must be an integer in [0, 1000], got '99999999999'")]
    [InlineData("--lock-check-s", "0.1", "lock_check_s must be in [0.5, 600]")]
    [InlineData("--fit-window-s", "601", "fit_window_s must be in [1, 600]")]
    [InlineData("--fit-window-s", "long", "--fit-window-s must be a number in [1, 600], got 'long'")]
    [InlineData("--history-gates", "32", "history_gates must be an integer in [64, 16384], got 32")]
    [InlineData("--history-gates", "1e3", "--history-gates must be an integer in [64, 16384], got '1e3'")]
    [InlineData("--gate-seconds", "0", "--gate-seconds must be a number of seconds in [1e-6, 86400]")]
    [InlineData("--estimator", "guess", "--estimator must be reciprocal or regression")]
    public void Each_bad_option_gives_its_own_error_naming_the_setting_and_range(string option, string value, string message)
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", Contract("minimal.edges.csv"), option, value, "--json");
        Assert.Equal(2, exit);
        Assert.Equal(string.Empty, stdout);
        Assert.Contains(message, stderr);
        Assert.StartsWith("error: " + option, stderr);
    }

    [Theory]
    [InlineData("bad-tick-text.edges.csv", ":6:")]
    [InlineData("bad-no-magic.edges.csv", ":1:")]
    [InlineData("bad-no-clock.edges.csv", "clock_hz")]
    [InlineData("bad-beat-no-side.edges.csv", "beat_side")]
    [InlineData("bad-tick-too-wide.edges.csv", ":6:")]
    public void Malformed_captures_give_a_file_line_error_and_no_crash(string file, string expected)
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", Contract(file), "--json");
        Assert.Equal(1, exit);
        Assert.Equal(string.Empty, stdout);
        Assert.StartsWith("error: ", stderr);
        Assert.Contains(file, stderr);
        Assert.Contains(expected, stderr);
    }

    [Fact]
    public void Missing_file_is_a_clear_error()
    {
        var (exit, _, stderr) = ConsoleCapture.Run("replay", PathOf("nope.csv"));
        Assert.Equal(1, exit);
        Assert.Contains("cannot open the capture", stderr);
    }

    [Fact]
    public void The_two_sided_decision_settings_are_options_that_reach_the_readout()
    {
        var metadata = new FreqReadout.Host.Captures.CaptureMetadata { ClockHz = 1e6 };
        var defaults = new FreqReadout.Host.Commands.ReplayCommand.Settings().BuildReadoutSettings(metadata, out string? none);
        Assert.Null(none);
        Assert.Equal((2.5, 8.0, 256), (defaults!.LockCheckSeconds, defaults.FitWindowSeconds, defaults.HistoryGates));
        var given = new FreqReadout.Host.Commands.ReplayCommand.Settings { LockCheckSeconds = "4", FitWindowSeconds = "12.5", HistoryGates = "1024" }
            .BuildReadoutSettings(metadata, out string? error);
        Assert.Null(error);
        Assert.Equal((4.0, 12.5, 1024), (given!.LockCheckSeconds, given.FitWindowSeconds, given.HistoryGates));
    }

    [Fact]
    public void Every_readout_and_gate_option_states_its_default_for_help()
    {
        // --help prints each option's Description; every value option of replay and calibrate names its default.
        var options = typeof(FreqReadout.Host.Commands.ReplayCommand.Settings).GetProperties()
            .Select(p => (Option: p.GetCustomAttributes(typeof(Spectre.Console.Cli.CommandOptionAttribute), true).Cast<Spectre.Console.Cli.CommandOptionAttribute>().FirstOrDefault(),
                          Text: p.GetCustomAttributes(typeof(System.ComponentModel.DescriptionAttribute), true).Cast<System.ComponentModel.DescriptionAttribute>().FirstOrDefault()?.Description))
            .Where(x => x.Option != null && x.Option.ValueName != null)
            .ToList();
        Assert.True(options.Count >= 25, "options " + options.Count);
        foreach (var (option, text) in options)
        {
            string name = option!.LongNames[0];
            if (name is "readings" or "events" or "gate-edges")
            {
                continue; // files, and the alternative to --gate-seconds
            }

            Assert.True(text != null && text.Contains("Default"), "--" + name + " does not state its default");
        }
    }

    [Fact]
    public void Snapshot_capture_replays_through_the_snapshot_counter()
    {
        // Pulse-counter reads every 1 ms (+-20 us) of a 100 003.7 Hz search oscillator (1 MHz timer): +12 Hz and
        // -12 Hz passes (whole counts limit a 0.1 s gate to about 1 Hz, the snapshot error model: 1 / (T sqrt(M))).
        var capture = new SyntheticEdgeCapture
        {
            DurationSeconds = 30,
            ClockHz = 1e6,
            SnapshotEverySeconds = 0.001,
            SearchHzAt = t => F0 + 3.7 + new TargetPass(15, 1.0, 12.0).ShiftAt(t) + new TargetPass(24, 1.0, -12.0).ShiftAt(t),
        };
        string path = PathOf("snap.csv");
        capture.Write(path);
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json");
        Assert.True(exit == 0, stderr);
        JsonElement o = ParseSingleObject(stdout);
        Assert.InRange(o.GetProperty("baseline_hz").GetDouble(), F0 + 3.7 - 0.5, F0 + 3.7 + 0.5);
        Assert.InRange(o.GetProperty("noise_hz").GetDouble(), 0.2, 2.0);
        JsonElement[] events = o.GetProperty("events").EnumerateArray().ToArray();
        Assert.True(events.Length == 2, stdout);
        Assert.Equal("non-ferrous", events[0].GetProperty("class").GetString());
        Assert.Equal("ferrous", events[1].GetProperty("class").GetString());
        Assert.InRange(events[0].GetProperty("peak_s").GetDouble(), 14.5, 15.6);
    }

    [Fact]
    public void Binary_capture_replays_exactly_like_its_text_original()
    {
        var capture = new SyntheticEdgeCapture { DurationSeconds = 25, SearchHzAt = t => F0 + new TargetPass(15, 1.0, -2.0).ShiftAt(t) };
        capture.Marks.Add((18.0, "rebaseline"));
        string text = PathOf("orig.edges.csv");
        string binary = PathOf("orig.bin");
        capture.Write(text);
        Assert.Equal(0, ConsoleCapture.Run("convert", text, binary, "--to", "binary").Exit);

        var (e1, fromText, err1) = ConsoleCapture.Run("replay", text, "--json");
        var (e2, fromBinary, err2) = ConsoleCapture.Run("replay", binary, "--json");
        Assert.True(e1 == 0 && e2 == 0, err1 + err2);
        Assert.Equal(fromText, fromBinary);
        Assert.Equal(1, ParseSingleObject(fromText).GetProperty("events").GetArrayLength());
    }
}
