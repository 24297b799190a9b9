using FreqReadout.Host.Captures;
using FreqReadout.Host.Commands;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Commands;

/// <summary><c>freqreadout convert</c>: lossless text/binary round trips and time-range trimming.</summary>
[Collection(ConsoleCollection.Name)]
public sealed class ConvertCommandTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-convert").FullName;

    public static TheoryData<string> GoodSamples() => new()
    {
        "minimal.edges.csv", "beat-with-temp.edges.csv", "snapshots.edges.csv", "wrap16.edges.csv",
    };

    public void Dispose() => Directory.Delete(_dir, true);

    [Theory]
    [MemberData(nameof(GoodSamples))]
    public void Text_to_binary_and_back_is_byte_identical(string name)
    {
        string binary = Path.Combine(_dir, "capture.frb");
        string text = Path.Combine(_dir, "capture.csv");
        Assert.Equal(0, ConsoleCapture.Run("convert", Contract(name), binary).Exit); // default: the other format
        Assert.Equal(CaptureFileFormat.Binary, CaptureFile.DetectFormat(binary));
        Assert.True(new FileInfo(binary).Length < new FileInfo(Contract(name)).Length, "binary is smaller than text");
        var (exit, _, stderr) = ConsoleCapture.Run("convert", binary, text);
        Assert.Equal(0, exit);
        Assert.Contains("text capture", stderr);
        Assert.Equal(File.ReadAllBytes(Contract(name)), File.ReadAllBytes(text));
    }

    [Fact]
    public void Trimming_keeps_the_rows_in_the_time_range_and_notes_it()
    {
        // beat-with-temp: 2500 ticks (2.5 ms) per row from tick 5000; 0.05 s to 0.1 s after the first row
        // keeps ticks 55000 to 105000: 21 rows, the `rebaseline` mark (tick 105000) included.
        string output = Path.Combine(_dir, "trimmed.csv");
        var (exit, _, stderr) = ConsoleCapture.Run("convert", Contract("beat-with-temp.edges.csv"), output, "--to", "text", "--from-s", "0.05", "--to-s", "0.1");
        Assert.Equal(0, exit);
        Assert.Contains("21 of 81 rows", stderr);
        using var reader = CaptureFile.Open(output);
        var rows = reader.ReadRows().ToList();
        Assert.Equal(21, rows.Count);
        Assert.Equal(55000UL, rows[0].Tick);
        Assert.Equal(105000UL, rows[^1].Tick);
        Assert.Equal("rebaseline", rows[^1].Mark);
        Assert.Contains(reader.Metadata.HeaderLines, l => l.IsComment && l.Comment!.Contains("trimmed by freqreadout convert"));
        Assert.Equal(FreqReadout.Counting.SignalKind.Beat, reader.Metadata.Signal);
        Assert.Equal(FreqReadout.Counting.BeatSide.Below, reader.Metadata.BeatSide);
    }

    [Fact]
    public void Trimming_a_wrapping_timer_uses_unwrapped_time()
    {
        // wrap16: 1066.67 ticks per row at 8 MHz (133.3 us); rows from 10 ms on: the first kept row is row 76 (0-based 75).
        string output = Path.Combine(_dir, "wrap.frb");
        Assert.Equal(0, ConsoleCapture.Run("convert", Contract("wrap16.edges.csv"), output, "--from-s", "0.01").Exit);
        using var all = CaptureFile.Open(Contract("wrap16.edges.csv"));
        var expected = all.ReadRows().Skip(75).Select(r => r.Tick).ToList();
        using var reader = CaptureFile.Open(output);
        Assert.Equal(expected, reader.ReadRows().Select(r => r.Tick).ToList());
    }

    [Theory]
    [InlineData("--to", "csv", "--to must be text or binary, got 'csv'")]
    [InlineData("--from-s", "-1", "--from-s must be a number of seconds from the first row in [0, 1e9], got '-1'")]
    [InlineData("--to-s", "0", "--to-s must be a number of seconds from the first row greater than --from-s (0 s) and at most 1e9, got '0'")]
    public void Bad_options_are_named(string option, string value, string expected)
    {
        var (exit, _, stderr) = ConsoleCapture.Run("convert", Contract("minimal.edges.csv"), Path.Combine(_dir, "x.frb"), option, value);
        Assert.Equal(CommandOutput.BadOption, exit);
        Assert.Contains(expected, stderr);
    }

    [Fact]
    public void A_bad_input_leaves_no_half_written_output()
    {
        string output = Path.Combine(_dir, "half.frb");
        var (exit, _, stderr) = ConsoleCapture.Run("convert", Contract("bad-tick-text.edges.csv"), output);
        Assert.Equal(CommandOutput.BadInput, exit);
        Assert.Contains(":6: expected the tick as an unsigned integer", stderr);
        Assert.False(File.Exists(output));
    }

    [Fact]
    public void Trimming_moves_started_utc_with_the_range_and_carries_the_temperature_in_force()
    {
        // 10 s of 100 Hz rows on a 1 MHz timer from 10:00:00; a temperature sample every second, 20.0 + t / 10 C.
        var sb = new System.Text.StringBuilder("# freqreadout capture 1\n# clock_hz = 1000000\n# started_utc = 2026-03-01T10:00:00Z\ntick,temp_c\n");
        for (int i = 0; i < 1000; i++)
        {
            sb.Append(System.Globalization.CultureInfo.InvariantCulture, $"{i * 10000},{(i % 100 == 0 ? (20.0 + (i / 1000.0)).ToString("0.0##", System.Globalization.CultureInfo.InvariantCulture) : string.Empty)}\n");
        }

        string input = Path.Combine(_dir, "timed.csv");
        File.WriteAllText(input, sb.ToString());
        string output = Path.Combine(_dir, "timed-trim.csv");
        var (exit, _, stderr) = ConsoleCapture.Run("convert", input, output, "--to", "text", "--from-s", "3.45", "--to-s", "6");
        Assert.True(exit == 0, stderr);
        using var reader = CaptureFile.Open(output);
        // Time 0 of the trimmed capture is its first row, 3.45 s into the original: started_utc moves with it
        // (to the nearest second, the key's resolution), so events' UTC times stay right to within that second.
        Assert.Equal(new DateTimeOffset(2026, 3, 1, 10, 0, 3, TimeSpan.Zero), reader.Metadata.StartedUtc);
        Assert.Contains(reader.Metadata.HeaderLines, l => l.IsComment && l.Comment!.Contains("started_utc moved 3 s later (was 2026-03-01T10:00:00Z)"));
        var rows = reader.ReadRows().ToList();
        Assert.Equal(3_450_000UL, rows[0].Tick);
        // The sample taken at 3 s (20.3 C) is the temperature in force at the cut: the first kept row carries it.
        Assert.Equal(20.3, rows[0].TemperatureC);
        Assert.Null(rows[1].TemperatureC);
        Assert.Equal(20.4, rows.First(r => r.Tick == 4_000_000UL).TemperatureC);
    }
}
