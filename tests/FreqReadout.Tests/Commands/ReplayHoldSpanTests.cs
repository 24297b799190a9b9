using System.Globalization;
using System.Text;
using System.Text.Json;
using FreqReadout.Host.Commands;
using FreqReadout.Host.Replay;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// <c>replay --hold-span FROM:TO</c> on the simulated floor scan (invented scenario): the same report as
/// <c>hold</c> / <c>release</c> marks written into the capture on the first rows at or after FROM and TO.
/// With --persistent-shift-s 1 the copper pipe's pass (about 2.4 s over the coil from 22 s, truth file)
/// is taken as a new baseline unless hold is on, so the spans visibly change the result.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ReplayHoldSpanTests : IClassFixture<SimulatedDemoCapture>
{
    private readonly SimulatedDemoCapture _sim;

    public ReplayHoldSpanTests(SimulatedDemoCapture sim)
    {
        _sim = sim;
    }

    [Theory]
    [InlineData("21:31")]
    [InlineData("21.5:25 36.25:52")]
    [InlineData("0:8.004")]
    public void Hold_spans_give_the_report_of_the_same_hold_and_release_marks_in_the_capture(string spanList)
    {
        string[] spans = spanList.Split(' ');
        var parsed = spans.Select(s => { Assert.True(HoldSpan.TryParse(s, out HoldSpan h, out _)); return h; }).ToList();
        string marked = Path.Combine(_sim.Dir, "marked-" + Guid.NewGuid().ToString("N") + ".csv");
        WriteWithMarks(_sim.CapturePath, marked, parsed);
        try
        {
            var args = new List<string> { "replay", _sim.CapturePath, "--json", "--persistent-shift-s", "1" };
            foreach (string s in spans)
            {
                args.Add("--hold-span");
                args.Add(s);
            }

            var (exitSpan, jsonSpan, errSpan) = ConsoleCapture.Run(args.ToArray());
            var (exitMarks, jsonMarks, errMarks) = ConsoleCapture.Run("replay", marked, "--json", "--persistent-shift-s", "1");
            var (exitPlain, jsonPlain, _) = ConsoleCapture.Run("replay", _sim.CapturePath, "--json", "--persistent-shift-s", "1");
            Assert.True(exitSpan == 0, errSpan);
            Assert.True(exitMarks == 0, errMarks);
            Assert.Equal(0, exitPlain);
            Assert.Equal(jsonMarks, jsonSpan);
            if (spans[0] != "0:8.004")
            {
                // Hold over a pass keeps it an event instead of an automatic re-baseline: the result differs without it.
                Assert.NotEqual(jsonPlain, jsonSpan);
                using var withHold = JsonDocument.Parse(jsonSpan);
                using var without = JsonDocument.Parse(jsonPlain);
                Assert.True(
                    withHold.RootElement.GetProperty("rebaselines").GetArrayLength() < without.RootElement.GetProperty("rebaselines").GetArrayLength(),
                    "hold should suppress an automatic re-baseline:\n" + jsonSpan + "\n" + jsonPlain);
            }
        }
        finally
        {
            File.Delete(marked);
        }
    }

    [Fact]
    public void The_readings_show_hold_exactly_in_the_span_from_the_gate_after_the_one_holding_FROM()
    {
        string readings = Path.Combine(_sim.Dir, "readings-" + Guid.NewGuid().ToString("N") + ".csv");
        try
        {
            var (exit, _, stderr) = ConsoleCapture.Run("replay", _sim.CapturePath, "--json", "--hold-span", "30:40", "--readings", readings);
            Assert.True(exit == 0, stderr);
            string[] lines = File.ReadAllLines(readings);
            string[] header = lines[0].Split(',');
            int time = Array.IndexOf(header, "time_s");
            int hold = Array.IndexOf(header, "hold");
            double previousEnd = 0;
            foreach (string line in lines.Skip(1))
            {
                string[] f = line.Split(',');
                double end = double.Parse(f[time], CultureInfo.InvariantCulture);

                // Hold acts from the gate after the first gate ending at or after 30 s: every gate that opens at or after 30 s
                // (the previous gate's end) and before 40 s.
                bool expected = previousEnd >= 30 && previousEnd < 40;
                Assert.True(expected == (f[hold] == "1"), $"gate ending {end} s (opening {previousEnd} s): hold {f[hold]}");
                previousEnd = end;
            }
        }
        finally
        {
            File.Delete(readings);
        }
    }

    [Theory]
    [InlineData("5:2", "--hold-span: TO must be later than FROM, got '5:2'")]
    [InlineData("5:5", "--hold-span: TO must be later than FROM, got '5:5'")]
    [InlineData("x", "--hold-span: expected FROM:TO, two times in seconds with '.' as decimal separator (as in 12.5:20), got 'x'")]
    [InlineData("1:2:3", "--hold-span: expected FROM:TO")]
    [InlineData("1,5:2", "--hold-span: expected FROM:TO")]
    [InlineData("NaN:5", "--hold-span: FROM and TO must be finite numbers of seconds, got 'NaN:5'")]
    [InlineData("1:Infinity", "--hold-span: FROM and TO must be finite numbers of seconds")]
    [InlineData("1:1e400", "--hold-span: FROM and TO must be finite numbers of seconds")]
    [InlineData(" -1:5", "--hold-span: FROM must be >= 0 s (time 0 is the capture's first edge), got ' -1:5'")]
    public void Bad_spans_are_refused_before_any_work_with_what_was_expected(string value, string expected)
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run("replay", _sim.CapturePath, "--hold-span", value);
        Assert.Equal(CommandOutput.BadOption, exit);
        Assert.Equal(string.Empty, stdout);
        Assert.StartsWith("error: " + expected, stderr);
    }

    [Fact]
    public void Overlapping_spans_are_refused_naming_the_joined_span()
    {
        var (exit, _, stderr) = ConsoleCapture.Run("replay", _sim.CapturePath, "--hold-span", "10:20", "--hold-span", "4:10");
        Assert.Equal(CommandOutput.BadOption, exit);
        Assert.StartsWith("error: --hold-span: the spans 4:10 and 10:20 overlap or touch; give them as one span 4:20", stderr);
    }

    [Fact]
    public void A_span_after_the_capture_is_a_warning_and_changes_nothing()
    {
        var (exit, withSpan, _) = ConsoleCapture.Run("replay", _sim.CapturePath, "--json", "--hold-span", "5000:6000");
        var (_, plain, _) = ConsoleCapture.Run("replay", _sim.CapturePath, "--json");
        Assert.Equal(0, exit);
        using var a = JsonDocument.Parse(withSpan);
        using var b = JsonDocument.Parse(plain);
        Assert.Equal(b.RootElement.GetProperty("events").GetRawText(), a.RootElement.GetProperty("events").GetRawText());
        Assert.Contains(a.RootElement.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.StartsWith("--hold-span 5000:6000 had no effect", StringComparison.Ordinal));
    }

    [Fact]
    public void Replay_help_documents_the_option()
    {
        // Help goes to the terminal through Spectre's own console: run the CLI as a user would.
        var r = FreqReadout.Tests.Docs.CliProcess.Run(_sim.Dir, new[] { "replay", "--help" });
        Assert.Equal(0, r.ExitCode);
        Assert.Contains("--hold-span <FROM:TO>", r.Stdout);
        string flat = System.Text.RegularExpressions.Regex.Replace(r.Stdout, @"\s+", " ");
        Assert.Contains("'release' mark", flat);
    }

    /// <summary>
    /// Copies a text edge capture adding a mark column: <c>hold</c> on the first row at or after each span's FROM and
    /// <c>release</c> on the first row at or after its TO (row time = unwrapped tick from the first row / clock_hz).
    /// </summary>
    private static void WriteWithMarks(string source, string target, IReadOnlyList<HoldSpan> spans)
    {
        var switches = new List<(double Time, string Mark)>();
        foreach (HoldSpan s in spans)
        {
            switches.Add((s.FromSeconds, "hold"));
            switches.Add((s.ToSeconds, "release"));
        }

        double clock = 0;
        int bits = 64;
        bool inData = false;
        bool first = true;
        ulong firstTick = 0;
        ulong lastRaw = 0;
        ulong unwrapped = 0;
        int next = 0;
        var text = new StringBuilder();
        foreach (string line in File.ReadLines(source))
        {
            if (!inData)
            {
                if (line.StartsWith("# clock_hz = ", StringComparison.Ordinal))
                {
                    clock = double.Parse(line["# clock_hz = ".Length..], CultureInfo.InvariantCulture);
                }
                else if (line.StartsWith("# timer_bits = ", StringComparison.Ordinal))
                {
                    bits = int.Parse(line["# timer_bits = ".Length..], CultureInfo.InvariantCulture);
                }
                else if (!line.StartsWith('#'))
                {
                    Assert.DoesNotContain("mark", line);
                    text.Append(line).Append(",mark\n");
                    inData = true;
                    continue;
                }

                text.Append(line).Append('\n');
                continue;
            }

            if (line.StartsWith('#'))
            {
                text.Append(line).Append('\n');
                continue;
            }

            ulong raw = ulong.Parse(line.Split(',')[0], CultureInfo.InvariantCulture);
            if (first)
            {
                firstTick = raw;
                unwrapped = raw;
                first = false;
            }
            else
            {
                ulong step = bits == 64 ? raw - lastRaw : (raw - lastRaw) & ((1UL << bits) - 1);
                unwrapped += step;
            }

            lastRaw = raw;
            double t = (unwrapped - firstTick) / clock;
            string mark = string.Empty;
            if (next < switches.Count && t >= switches[next].Time)
            {
                mark = switches[next].Mark;
                next++;
                Assert.False(next < switches.Count && t >= switches[next].Time, "two switches on one row");
            }

            text.Append(line).Append(',').Append(mark).Append('\n');
        }

        Assert.Equal(switches.Count, next);
        File.WriteAllText(target, text.ToString());
    }
}
