using System.Text.Json;
using FreqReadout.Tests.Tracking;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// Meanings of <c>replay --json</c> fixed in docs/json-output.md, end to end through synthetic edge captures (invented
/// data): a signal that stops for 3 s (no rows written) is said in a warning, its return is re-baselined with
/// reason signal_restored, a pass during the following settling is not reported (the settling warning says
/// when that was), passes before and after are found; "unclear" events are listed.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ReplayContractMeaningsTests : IDisposable
{
    private const double F0 = 100_000;
    private readonly string _dir = Path.Combine(Path.GetTempPath(), "freqreadout-meanings-" + Guid.NewGuid().ToString("N"));

    public ReplayContractMeaningsTests()
    {
        Directory.CreateDirectory(_dir);
    }

    public void Dispose()
    {
        Directory.Delete(_dir, true);
    }

    [Fact]
    public void A_signal_gap_is_warned_re_baselined_as_signal_restored_and_hides_nothing_after_settling()
    {
        // Truth: +2 Hz pass at 15 s, signal lost 25..28 s and the oscillator 3 Hz higher when it is back (as after a
        // coil reconnected warmer), +2 Hz pass at 31.5 s (inside settling 1 s + baseline 5 s after the return),
        // -2 Hz pass at 45 s. Block noise 0.3 Hz over 10 ms gives about 0.1 Hz per 0.1 s gate; a 5 s baseline capture
        // (resistant line extrapolated to its end) then has a level error of about 0.05 Hz, so the level checks
        // below allow 0.25 Hz (5 sigma).
        var capture = new SyntheticEdgeCapture
        {
            DurationSeconds = 55,
            SearchHzAt = t => F0 + (t >= 26 ? 3.0 : 0.0) + new TargetPass(15, 1.0, 2.0).ShiftAt(t) + new TargetPass(31.5, 0.5, 2.0).ShiftAt(t) + new TargetPass(45, 1.0, -2.0).ShiftAt(t),
        };
        capture.Gaps.Add((25.0, 28.0));
        string path = Path.Combine(_dir, "gap.edges.csv");
        capture.Write(path);

        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json");
        Assert.True(exit == 0, stderr);
        using var doc = JsonDocument.Parse(stdout);
        JsonElement o = doc.RootElement;

        // The first baseline is not listed; the return of the signal is, with its reason and time (the first edge back).
        JsonElement r = Assert.Single(o.GetProperty("rebaselines").EnumerateArray().ToArray());
        Assert.Equal("signal_restored", r.GetProperty("reason").GetString());
        Assert.InRange(r.GetProperty("time_s").GetDouble(), 27.95, 28.1);
        Assert.InRange(r.GetProperty("shift_hz").GetDouble(), 3.0 - 0.35, 3.0 + 0.35); // the step it absorbed (two level errors)

        // baseline_hz stays the first captured baseline, not the one after the gap.
        Assert.InRange(o.GetProperty("baseline_hz").GetDouble(), F0 - 0.25, F0 + 0.25);

        // Events: the pass before the gap and the one after settling; none from the pass during settling.
        JsonElement[] events = o.GetProperty("events").EnumerateArray().ToArray();
        Assert.Equal(2, events.Length);
        Assert.InRange(events[0].GetProperty("peak_s").GetDouble(), 14.5, 15.5);
        Assert.Equal("non-ferrous", events[0].GetProperty("class").GetString());
        Assert.InRange(events[1].GetProperty("peak_s").GetDouble(), 44.5, 45.5);
        Assert.Equal("ferrous", events[1].GetProperty("class").GetString());

        string[] warnings = o.GetProperty("warnings").EnumerateArray().Select(w => w.GetString()!).ToArray();
        string noSignal = Assert.Single(warnings, w => w.StartsWith("no signal in "));
        Assert.Matches(@"\((24\.9\d*|25)-28(\.0\d*)? s\)", noSignal); // from the last gate with signal to the first edge back
        string settling = Assert.Single(warnings, w => w.StartsWith("events during settling are not reported"));
        Assert.Matches(@", 28(\.0\d*)?-34(\.0\d*)? s\)", settling); // settling_s 1 + baseline_s 5 after the return
    }

    [Fact]
    public void Unclear_events_are_listed_with_their_shift_in_json_and_csv()
    {
        // Passes of +2 and -2 Hz at about 20 sigma; with --unclear-band-sigma 100 both peaks lie inside the band
        // above the threshold, so both are events of class unclear, still with their signed peak shifts.
        var capture = new SyntheticEdgeCapture
        {
            DurationSeconds = 35,
            SearchHzAt = t => F0 + new TargetPass(15, 1.0, 2.0).ShiftAt(t) + new TargetPass(25, 1.0, -2.0).ShiftAt(t),
        };
        string path = Path.Combine(_dir, "unclear.edges.csv");
        string events = Path.Combine(_dir, "unclear.events.csv");
        capture.Write(path);

        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json", "--unclear-band-sigma", "100", "--events", events);
        Assert.True(exit == 0, stderr);
        using var doc = JsonDocument.Parse(stdout);
        JsonElement[] list = doc.RootElement.GetProperty("events").EnumerateArray().ToArray();
        Assert.Equal(2, list.Length);
        Assert.All(list, e => Assert.Equal("unclear", e.GetProperty("class").GetString()));
        Assert.InRange(list[0].GetProperty("peak_shift_hz").GetDouble(), 1.5, 2.5);
        Assert.InRange(list[1].GetProperty("peak_shift_hz").GetDouble(), -2.5, -1.5);

        string[] rows = File.ReadAllLines(events);
        Assert.Equal(3, rows.Length); // header and the two events
        Assert.All(rows.Skip(1), row => Assert.Contains(",unclear,", row));

        // The same capture with the default band: the classes by sign.
        (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json");
        Assert.True(exit == 0, stderr);
        using var plain = JsonDocument.Parse(stdout);
        Assert.Equal(new[] { "non-ferrous", "ferrous" }, plain.RootElement.GetProperty("events").EnumerateArray().Select(e => e.GetProperty("class").GetString()).ToArray());
    }

    [Fact]
    public void A_capture_shorter_than_one_gate_says_so()
    {
        // minimal.edges.csv: 101 edges, no closed 0.1 s gate (count says the same): nothing replayed is an error, not a summary of nothing.
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", Captures.CaptureTestFiles.Contract("minimal.edges.csv"), "--json");
        Assert.Equal(1, exit);
        Assert.Equal(string.Empty, stdout);
        Assert.EndsWith("minimal.edges.csv: no gate closed: the capture is shorter than one gate (try a shorter --gate-seconds or --gate-edges)\n", stderr);
        Assert.Single(stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries), l => l.Contains("no gate closed", StringComparison.Ordinal));
    }

    [Fact]
    public void A_mark_after_the_last_closed_gate_is_said_to_have_had_no_effect()
    {
        // 0.1 s gates of about 100 recorded edges each: the 100th closes at about 10.03 s (count on this capture
        // shows it), the capture ends at 10.09 s inside the next one, and a rebaseline mark at 10.07 s belongs to no
        // reported gate.
        var capture = new SyntheticEdgeCapture { DurationSeconds = 10.09 };
        capture.Marks.Add((10.07, "rebaseline"));
        string path = Path.Combine(_dir, "late-mark.edges.csv");
        capture.Write(path);
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json");
        Assert.True(exit == 0, stderr);
        using var doc = JsonDocument.Parse(stdout);
        Assert.Empty(doc.RootElement.GetProperty("rebaselines").EnumerateArray());
        Assert.Contains(doc.RootElement.GetProperty("warnings").EnumerateArray(), w => w.GetString() == "1 marks after the last closed gate had no effect (the capture ended inside an open gate): 'rebaseline'");
    }

    [Fact]
    public void An_estimator_asked_for_on_a_snapshot_capture_is_said_to_have_no_effect()
    {
        const string command = "replay";
        // snapshots.edges.csv is a pulse-counter capture: its gates always use snapshot-regression.
        string sample = Captures.CaptureTestFiles.Contract("snapshots.edges.csv");
        var (_, _, stderr) = ConsoleCapture.Run(command, sample, "--estimator", "reciprocal");
        Assert.Contains("warning: --estimator reciprocal does not apply to a snapshot capture: its gates always use snapshot-regression", stderr);

        var (_, _, plain) = ConsoleCapture.Run(command, sample);
        Assert.DoesNotContain("--estimator", plain);
    }

    [Fact]
    public void A_re_baseline_still_under_way_at_the_end_is_listed_without_a_shift_and_warned()
    {
        // A rebaseline mark at 20 s: the manual re-baseline needs settling_s 1 + baseline_s 5 more, but the
        // capture ends at 23 s. Before, the JSON then said nothing of it.
        var capture = new SyntheticEdgeCapture { DurationSeconds = 23, SearchHzAt = t => F0 };
        capture.Marks.Add((20.0, "rebaseline"));
        string path = Path.Combine(_dir, "late-manual.edges.csv");
        capture.Write(path);
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json");
        Assert.True(exit == 0, stderr);
        using var doc = JsonDocument.Parse(stdout);
        JsonElement r = Assert.Single(doc.RootElement.GetProperty("rebaselines").EnumerateArray().ToArray());
        Assert.Equal("manual", r.GetProperty("reason").GetString());
        Assert.InRange(r.GetProperty("time_s").GetDouble(), 20.0, 20.3);
        Assert.Equal(JsonValueKind.Null, r.GetProperty("shift_hz").ValueKind);
        Assert.Equal(JsonValueKind.Null, r.GetProperty("completed_s").ValueKind);
        Assert.Contains(doc.RootElement.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.StartsWith("the manual re-baseline begun at 20."));

        // Given 6 s more, the same re-baseline completes and carries its shift.
        var longer = new SyntheticEdgeCapture { DurationSeconds = 30, SearchHzAt = t => F0 };
        longer.Marks.Add((20.0, "rebaseline"));
        longer.Write(path);
        (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json");
        Assert.True(exit == 0, stderr);
        using var done = JsonDocument.Parse(stdout);
        JsonElement c = Assert.Single(done.RootElement.GetProperty("rebaselines").EnumerateArray().ToArray());
        Assert.InRange(c.GetProperty("shift_hz").GetDouble(), -0.2, 0.2);
        Assert.DoesNotContain(done.RootElement.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("had not completed"));
    }

    [Fact]
    public void A_rebaseline_mark_in_the_last_gate_is_said_to_have_had_no_effect()
    {
        // Marks act from the next gate (as a button pressed during a gate); 0.1 s gates close about every
        // 0.1003 s here (see the test above), so the last one closes at about 10.03 s and holds a mark at 10.0 s.
        var capture = new SyntheticEdgeCapture { DurationSeconds = 10.035 };
        capture.Marks.Add((10.0, "rebaseline"));
        string path = Path.Combine(_dir, "last-gate-mark.edges.csv");
        capture.Write(path);
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", path, "--json");
        Assert.True(exit == 0, stderr);
        using var doc = JsonDocument.Parse(stdout);
        Assert.Empty(doc.RootElement.GetProperty("rebaselines").EnumerateArray());
        Assert.Contains(doc.RootElement.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.StartsWith("the rebaseline mark in the last gate (10.0"));
        Assert.DoesNotContain(doc.RootElement.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.StartsWith("1 marks after the last closed gate"));
    }
}
