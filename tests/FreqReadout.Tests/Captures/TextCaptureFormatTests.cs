using System.Globalization;
using System.Text;
using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Captures;

/// <summary>The text format rules of docs/capture-text-format.md beyond the contract samples: malformed cases, encodings, round trip.</summary>
public sealed class TextCaptureFormatTests
{
    private const string Head = "# freqreadout capture 1\n# clock_hz = 1000000\n";

    public static TheoryData<string> GoodSamples() => new()
    {
        "minimal.edges.csv", "beat-with-temp.edges.csv", "snapshots.edges.csv", "wrap16.edges.csv",
    };

    [Theory]
    [MemberData(nameof(GoodSamples))]
    public void Reading_then_writing_a_sample_gives_the_same_bytes(string name)
    {
        byte[] original = File.ReadAllBytes(Contract(name));
        byte[] written = RewriteText(original);
        Assert.Equal(Encoding.UTF8.GetString(original), Encoding.UTF8.GetString(written));
    }

    [Fact]
    public void Crlf_bom_blank_lines_and_spaces_read_like_the_plain_file()
    {
        string text = "\uFEFF# freqreadout capture 1\r\n\r\n#   clock_hz=  2500000.5  \r\n# a comment\r\n\r\ntick , mark\r\n10,\r\n\r\n 20 , hold \r\n";
        var bytes = Encoding.UTF8.GetBytes(text);
        Assert.Equal(0xEF, bytes[0]); // a real UTF-8 BOM in front
        using var reader = new TextCaptureReader(new MemoryStream(bytes), "crlf.csv");
        Assert.Equal(2500000.5, reader.Metadata.ClockHz);
        var rows = reader.ReadRows().ToList();
        Assert.Equal(2, rows.Count);
        Assert.Equal((10UL, (string?)null, 7L), (rows[0].Tick, rows[0].Mark, rows[0].LineNumber));
        Assert.Equal((20UL, "hold", 9L), (rows[1].Tick, rows[1].Mark, rows[1].LineNumber));
    }

    [Fact]
    public void Numbers_use_the_dot_whatever_the_current_culture()
    {
        var saved = CultureInfo.CurrentCulture;
        try
        {
            // A culture with ',' as decimal and '.' as group separator (globalization-invariant mode has no named cultures).
            var comma = (CultureInfo)CultureInfo.InvariantCulture.Clone();
            comma.NumberFormat.NumberDecimalSeparator = ",";
            comma.NumberFormat.NumberGroupSeparator = ".";
            CultureInfo.CurrentCulture = comma;
            Assert.Equal("21,25", 21.25.ToString(CultureInfo.CurrentCulture));
            using var reader = ReadText(Head + "tick,temp_c\n5,21.25\n");
            Assert.Equal(21.25, reader.ReadRows().Single().TemperatureC);
        }
        finally
        {
            CultureInfo.CurrentCulture = saved;
        }
    }

    [Fact]
    public void Optional_columns_in_any_order_blank_temperature_is_no_sample()
    {
        var rows = AllRows(Head + "tick,mark,temp_c\n1,start,\n2,,-3.5\n3,,\n");
        Assert.Equal(new double?[] { null, -3.5, null }, rows.Select(r => r.TemperatureC));
        Assert.Equal(new[] { "start", null, null }, rows.Select(r => r.Mark));
    }

    [Fact]
    public void Unknown_keys_are_kept_in_order_and_comments_are_not_metadata()
    {
        using var reader = ReadText(Head + "# rig = bench 2\n# just a comment\n# operator = A. N. Other\ntick\n1\n");
        Assert.Equal(
            new[] { new KeyValuePair<string, string>("rig", "bench 2"), new KeyValuePair<string, string>("operator", "A. N. Other") },
            reader.Metadata.Extra);
        Assert.Equal("bench 2", reader.Metadata.GetExtra("rig"));
        Assert.Contains(reader.Metadata.HeaderLines, l => l.IsComment && l.Comment == " just a comment");
    }

    [Fact]
    public void Trailer_lines_are_collected_after_the_rows()
    {
        using var reader = ReadText(Head + "tick\n1\n2\n\n# frames_lost = 0\n# crc_errors = 3\n\n");
        Assert.Empty(reader.Trailer);
        Assert.Equal(2, reader.ReadRows().Count());
        Assert.Equal(
            new[] { new KeyValuePair<string, string>("frames_lost", "0"), new KeyValuePair<string, string>("crc_errors", "3") },
            reader.Trailer);
    }

    [Fact]
    public void Beat_side_for_a_search_capture_is_a_warning()
    {
        using var reader = ReadText(Head + "# beat_side = above\ntick\n1\n", "w.csv");
        Assert.Equal(SignalKind.Search, reader.Metadata.Signal);
        var warning = Assert.Single(reader.Warnings);
        Assert.StartsWith("w.csv:3: beat_side is ignored: signal = search", warning);
    }

    [Theory]
    [InlineData(Head + "# prescale = 2\n# prescale = 3\ntick\n1\n", 4, "duplicate metadata key 'prescale' (first given at line 3)")]
    [InlineData(Head + "tick,temp_c,speed\n1,,\n", 3, "unknown column 'speed'")]
    [InlineData(Head + "tick,mark,mark\n1,,\n", 3, "column 'mark' appears twice")]
    [InlineData(Head + "tick,count\n1,2\n", 3, "unexpected column 'count': it belongs to kind = snapshots")]
    [InlineData("# freqreadout capture 1\n# kind = snapshots\n# clock_hz = 1000\ntick\n1\n", 4, "starting with 'tick,count' (kind = snapshots)")]
    [InlineData(Head + "tick\n1\n# lost = 0\n2\n", 6, "expected only trailer lines '# key = value' after the first trailer line (line 5)")]
    [InlineData(Head + "tick\n1\n# lost = 0\n# closing remark\n", 6, "expected a trailer line '# key = value'")]
    [InlineData(Head + "tick\n1\n# lost = 0\n# lost = 1\n", 6, "duplicate trailer key 'lost' (first given at line 5)")]
    [InlineData("# freqreadout capture 1\n# clock_hz = 1,5\ntick\n", 2, "expected clock_hz = the timer clock in Hz, a number in [1, 1e12]")]
    [InlineData("# freqreadout capture 1\n# clock_hz = -5\ntick\n", 2, "found '-5'")]
    [InlineData("# freqreadout capture 1\n# clock_hz = NaN\ntick\n", 2, "found 'NaN'")]
    [InlineData(Head + "# Prescale = 2\ntick\n", 3, "metadata keys are lowercase: expected 'prescale', found 'Prescale'")]
    [InlineData(Head + "# prescale = 0\ntick\n", 3, "expected prescale = an integer from 1 to 16777216")]
    [InlineData(Head + "# timer_bits = 12\ntick\n", 3, "expected timer_bits = 16, 24, 32 or 64, found '12'")]
    [InlineData(Head + "# kind = pulses\ntick\n", 3, "expected kind = edges or kind = snapshots, found 'pulses'")]
    [InlineData(Head + "# signal = beat\n# beat_side = left\ntick\n", 4, "expected beat_side = above or beat_side = below")]
    [InlineData(Head + "# started_utc = 30/11/2026\ntick\n", 3, "expected started_utc = YYYY-MM-DDTHH:MM:SSZ")]
    [InlineData(Head + "tick,temp_c\n1,21,5\n", 4, "expected 2 comma-separated fields (tick,temp_c), found 3")]
    [InlineData(Head + "tick,temp_c\n1\n", 4, "expected 2 comma-separated fields (tick,temp_c), found 1")]
        [InlineData(Head + "tick,temp_c\n1,warm\n", 4, "expected temp_c as a number of deg C in [-273.15, 1000] with '.' as decimal separator (or blank for no new sample), found 'warm'")]
    [InlineData(Head + "tick\n-1\n", 4, "expected the tick as an unsigned integer (digits only), found '-1'")]
    [InlineData(Head + "tick\n\n,\n", 5, "expected 1 comma-separated field (tick), found 2")]
    [InlineData(Head + "tick\n18446744073709551616\n", 4, "tick 18446744073709551616 exceeds the timer width: timer_bits = 64")]
    [InlineData(Head + "tick\n5\n5\n", 5, "expected a tick greater than 5 (line 4): with timer_bits = 64 ticks strictly increase, found 5")]
    [InlineData("# freqreadout capture 1\n# kind = snapshots\n# clock_hz = 1000\n# count_bits = 16\ntick,count\n1,65536\n", 6, "count 65536 exceeds the counter width: count_bits = 16 allows 0 to 65535")]
    [InlineData("# freqreadout capture 1\n# kind = snapshots\n# clock_hz = 1000\ntick,count\n1,10\n2,9\n", 6, "the cumulative count never decreases")]
    [InlineData("# freqreadout capture 2\n# clock_hz = 1000\ntick\n", 1, "unsupported capture version: expected '# freqreadout capture 1', found '# freqreadout capture 2'")]
    [InlineData("", 1, "not a capture: expected the first line '# freqreadout capture 1', found an empty file")]
    [InlineData(Head + "\n", 4, "expected the column header row ('tick', or 'tick,count' for kind = snapshots), found the end of the file")]
    public void Malformed_text_names_line_and_expectation(string text, long line, string expected)
    {
        var e = ErrorOf(text, "bad.csv");
        Assert.Equal(line, e.LineNumber);
        Assert.Contains(expected, e.Problem);
        Assert.Equal($"bad.csv:{line}: {e.Problem}", e.Message);
    }

    [Fact]
    public void Narrow_timer_ticks_may_repeat_or_step_back_the_unwrapper_judges_them()
    {
        var rows = AllRows(Head + "# timer_bits = 16\ntick\n65000\n10\n10\n");
        Assert.Equal(new ulong[] { 65000, 10, 10 }, rows.Select(r => r.Tick));
    }

    [Fact]
    public void Invalid_utf8_is_reported_at_its_line()
    {
        var bytes = new List<byte>(Encoding.UTF8.GetBytes(Head + "# note = caf"));
        bytes.Add(0xE9); // Latin-1 e-acute: not UTF-8
        bytes.AddRange(Encoding.UTF8.GetBytes("\ntick\n1\n"));
        var e = Assert.Throws<CaptureFormatException>(() => new TextCaptureReader(new MemoryStream(bytes.ToArray()), "latin1.csv"));
        Assert.Equal(3L, e.LineNumber);
        Assert.Contains("not valid UTF-8", e.Problem);
    }

    [Fact]
    public void Rows_stream_once()
    {
        using var reader = ReadText(Head + "tick\n1\n");
        _ = reader.ReadRows().ToList();
        Assert.Throws<InvalidOperationException>(() => reader.ReadRows());
    }

    [Fact]
    public void Written_metadata_built_in_code_reads_back_equal()
    {
        var md = new CaptureMetadata
        {
            ClockHz = 80_000_000.123,
            Kind = CaptureKind.Snapshots,
            TimerBits = 32,
            CountBits = 16,
            Signal = SignalKind.Beat,
            BeatSide = BeatSide.Above,
            SearchHz = 131072.5,
            StartedUtc = new DateTimeOffset(2026, 12, 1, 22, 0, 5, TimeSpan.Zero),
            Note = "made in code, with = sign",
        };
        md.Extra.Add(new KeyValuePair<string, string>("rig", "x"));
        md.ExtraColumns.Add("temp_c");
        md.ExtraColumns.Add("mark");
        var rows = new[]
        {
            new CaptureRow(0, 4294967295, 65535, 0.1 + 0.2, "hold"),
            new CaptureRow(0, 3, 2, null, null),
            new CaptureRow(0, 1000, 40, -0.0, "release"),
        };
        var sw = new StringWriter();
        using (var writer = new TextCaptureWriter(sw, md))
        {
            foreach (var row in rows)
            {
                writer.WriteRow(row);
            }

            writer.Complete(new[] { new KeyValuePair<string, string>("frames_lost", "2") });
        }

        using var reader = ReadText(sw.ToString());
        var back = reader.Metadata;
        Assert.Equal(md.ClockHz, back.ClockHz);
        Assert.Equal((md.Kind, md.TimerBits, md.CountBits, md.Signal, md.BeatSide), (back.Kind, back.TimerBits, back.CountBits, back.Signal, back.BeatSide));
        Assert.Equal(md.SearchHz, back.SearchHz);
        Assert.Equal(md.StartedUtc, back.StartedUtc);
        Assert.Equal(md.Note, back.Note);
        Assert.Equal(md.Extra, back.Extra);
        Assert.Equal(md.ExtraColumns, back.ExtraColumns);
        var read = reader.ReadRows().ToList();
        Assert.Equal(rows.Select(r => (r.Tick, r.Count, r.Mark)), read.Select(r => (r.Tick, r.Count, r.Mark)));
        Assert.Equal(0.1 + 0.2, read[0].TemperatureC); // shortest round-trip form keeps every bit
        Assert.True(double.IsNegative(read[2].TemperatureC!.Value));
        Assert.Equal("2", reader.Trailer.Single().Value);
    }

    [Theory]
    [InlineData(16, 65536UL, 0UL, null, "tick 65536 exceeds timer_bits = 16")]
    [InlineData(64, 5UL, 0UL, "a,b", "a mark is non-empty text without commas")]
    public void Writer_rejects_values_the_format_cannot_hold(int timerBits, ulong tick, ulong count, string? mark, string expected)
    {
        var md = new CaptureMetadata { ClockHz = 1000, TimerBits = timerBits };
        md.ExtraColumns.Add("mark");
        using var writer = new TextCaptureWriter(new StringWriter(), md);
        var e = Assert.Throws<ArgumentException>(() => writer.WriteRow(new CaptureRow(0, tick, count, null, mark)));
        Assert.Contains(expected, e.Message);
    }

    [Fact]
    public void Writer_rejects_metadata_without_a_clock_naming_it()
    {
        var e = Assert.Throws<ArgumentException>(() => new TextCaptureWriter(new StringWriter(), new CaptureMetadata()));
        Assert.Contains("clock_hz", e.Message);
        Assert.Contains("[1, 1e12] Hz", e.Message);
    }

    private static byte[] RewriteText(byte[] original)
    {
        using var reader = new TextCaptureReader(new MemoryStream(original), "in");
        var output = new MemoryStream();
        using (var writer = new TextCaptureWriter(output, reader.Metadata, leaveOpen: true))
        {
            foreach (var row in reader.ReadRows())
            {
                writer.WriteRow(row);
            }

            writer.Complete(reader.Trailer);
        }

        return output.ToArray();
    }

    [Theory]
    [InlineData("1e308", "temp_c 1E+308 is above 1000 deg C, not a coil temperature")]
    // Temperatures are written "deg C" in every message since the manual merge (UnitSpellingTests).
    [InlineData("-300", "temp_c -300 is below absolute zero (-273.15 deg C); expected a number of deg C in [-273.15, 1000]")]
    [InlineData("1e999", "expected temp_c as a number of deg C in [-273.15, 1000]")]
    public void A_temperature_outside_its_physical_range_is_named_as_such(string value, string expected)
    {
        var e = ErrorOf(Head + "tick,temp_c\n1," + value + "\n");
        Assert.Equal(4, e.LineNumber);
        Assert.Contains(expected, e.Problem);
        Assert.Empty(Docs.UnitSpellingTests.Offending(e.Problem));
    }

    [Fact]
    public void A_fifty_million_digit_tick_is_quoted_as_a_short_excerpt()
    {
        string digits = new string('9', 50_000_000);
        var e = ErrorOf(Head + "tick\n" + digits + "\n");
        Assert.Equal(4, e.LineNumber);
        Assert.True(e.Message.Length < 300, $"the message is {e.Message.Length} characters long");
        Assert.Contains("tick 9999999999999999999999999999999999999999... (50000000 characters) exceeds the timer width", e.Problem);
    }

    [Theory]
    [InlineData("# freqreadout capture 1\n# note\u0000 = x\ntick\n", "metadata key")]
    [InlineData("# freqreadout capture 1\n# clock_hz = 1\u001b[2J000\ntick\n", "found '1\\u001B[2J000'")]
    public void Bad_values_are_quoted_escaped_so_they_cannot_break_or_restyle_the_error_line(string text, string expected)
    {
        var e = ErrorOf(text);
        Assert.Contains(expected, e.Problem);
        Assert.DoesNotContain('\u001b', e.Message);
        Assert.DoesNotContain('\u0000', e.Message);
    }

    [Theory]
    [InlineData(new byte[] { 0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52 })] // a PNG header
    [InlineData(new byte[] { 0xFF, 0xD8, 0xFF, 0xE0, 0x00, 0x10, 0x4A, 0x46, 0x49, 0x46 })]                          // a JPEG header
    [InlineData(new byte[] { 0x50, 0x4B, 0x03, 0x04, 0x14, 0x00, 0x00, 0x00 })]                                      // a zip archive
    public void A_binary_or_image_file_is_not_a_capture_rather_than_bad_utf8(byte[] bytes)
    {
        var e = Assert.Throws<CaptureFormatException>(() => CaptureFile.Open(new MemoryStream(bytes), "picture.png"));
        Assert.Equal(1, e.LineNumber);
        Assert.Equal("not a capture (no '# freqreadout capture 1' line): the file starts with binary data, not text", e.Problem);
    }

    [Fact]
    public void A_long_first_line_without_a_line_break_is_not_read_whole()
    {
        // A 10 MB text file without any line break: rejected after the first few kilobytes, with a short excerpt.
        var e = Assert.Throws<CaptureFormatException>(() => CaptureFile.Open(new MemoryStream(System.Text.Encoding.ASCII.GetBytes(new string('x', 10_000_000))), "big.txt"));
        Assert.StartsWith("not a capture: expected the first line '# freqreadout capture 1', found 'xxxx", e.Problem);
        Assert.True(e.Message.Length < 300);
    }
}
