using System.Globalization;
using System.Text;
using FreqReadout.Host.Captures;
using FreqReadout.Tests.Robustness;

namespace FreqReadout.Tests.Captures;

/// <summary>
/// The fast reading path (byte-level text reader, batches, the binary decoder writing into batches) against the
/// line-based, row-by-row path kept as its oracle: the same rows with the same line numbers, the same error message
/// after the same rows, the same warnings and trailer, on hand-made edge cases and on mutated inputs.
/// </summary>
public sealed class FastReadingOracleTests
{
    /// <summary>Everything a reader delivers, as text: one line per row, then the error or "end", warnings, trailer.</summary>
    private static string Oracle(byte[] bytes)
    {
        var text = new StringBuilder();
        ICaptureReader reader;
        try
        {
            reader = IsBinary(bytes)
                ? new BinaryCaptureReader(new MemoryStream(bytes, false), "t")
                : TextCaptureReader.OpenLineBased(new MemoryStream(bytes, false), "t");
        }
        catch (CaptureFormatException e)
        {
            return "open error: " + e.Message;
        }

        using (reader)
        {
            try
            {
                int n = 0;
                foreach (CaptureRow row in reader.ReadRows())
                {
                    Describe(text, row);
                    if (++n >= ParserTargets.RowCap)
                    {
                        break;
                    }
                }

                if (n >= ParserTargets.RowCap)
                {
                    return text.ToString(); // capped: warnings and trailer are complete only at the end
                }

                text.Append("end\n");
            }
            catch (CaptureFormatException e)
            {
                text.Append("error: ").Append(e.Message).Append('\n');
            }

            return Finish(text, reader);
        }
    }

    private static string Fast(byte[] bytes, int batchRows, int bufferBytes)
    {
        var text = new StringBuilder();
        ICaptureBatchReader reader;
        try
        {
            reader = IsBinary(bytes)
                ? new BinaryCaptureReader(new MemoryStream(bytes, false), "t")
                : new TextCaptureReader(new MemoryStream(bytes, false), "t", bufferBytes);
        }
        catch (CaptureFormatException e)
        {
            return "open error: " + e.Message;
        }

        using (reader)
        {
            var batch = new CaptureRowBatch(batchRows);
            try
            {
                int n = 0;
                bool capped = false;
                while (!capped && reader.ReadBatch(batch))
                {
                    Assert.True(batch.Count > 0, "a batch that is returned holds rows");
                    for (int i = 0; i < batch.Count && !capped; i++)
                    {
                        Describe(text, batch.RowAt(i));
                        capped = ++n >= ParserTargets.RowCap;
                    }
                }

                if (capped)
                {
                    return text.ToString();
                }

                text.Append("end\n");
            }
            catch (CaptureFormatException e)
            {
                text.Append("error: ").Append(e.Message).Append('\n');
            }

            return Finish(text, reader);
        }
    }

    private static bool IsBinary(byte[] bytes) =>
        bytes.Length >= BinaryCaptureFormat.Magic.Length && bytes.AsSpan(0, BinaryCaptureFormat.Magic.Length).SequenceEqual(BinaryCaptureFormat.Magic);

    private static void Describe(StringBuilder text, CaptureRow row) =>
        text.Append(CultureInfo.InvariantCulture, $"{row.LineNumber}: {row.Tick} {row.Count} {row.TemperatureC?.ToString("R", CultureInfo.InvariantCulture) ?? "-"} {row.Mark ?? "-"}\n");

    private static string Finish(StringBuilder text, ICaptureReader reader)
    {
        foreach (string w in reader.Warnings)
        {
            text.Append("warning: ").Append(w).Append('\n');
        }

        foreach (var kv in reader.Trailer)
        {
            text.Append("trailer: ").Append(kv.Key).Append(" = ").Append(kv.Value).Append('\n');
        }

        return text.ToString();
    }

    private static void AssertSame(byte[] bytes, string what)
    {
        string expected = Oracle(bytes);
        foreach ((int batch, int buffer) in new[] { (CaptureRowBatch.DefaultCapacity, Utf8LineReader.BufferBytes), (1, 64), (5, 97), (64, 4096) })
        {
            string actual = Fast(bytes, batch, buffer);
            if (actual != expected)
            {
                int at = 0;
                while (at < Math.Min(actual.Length, expected.Length) && actual[at] == expected[at])
                {
                    at++;
                }

                Assert.Fail($"{what} (batch {batch}, buffer {buffer}): fast path differs at char {at}:\n fast:   {Excerpt(actual, at)}\n oracle: {Excerpt(expected, at)}");
            }
        }
    }

    private static string Excerpt(string s, int at) => s.Substring(Math.Max(0, at - 80), Math.Min(s.Length, at + 80) - Math.Max(0, at - 80)).Replace("\n", "\\n");

    private const string Head = "# freqreadout capture 1\n# clock_hz = 1000000\n";

    public static TheoryData<string, string> HandMade() => new()
    {
        { "plain", Head + "tick\n1000\n2000\n3000\n" },
        { "crlf", Head.Replace("\n", "\r\n") + "tick\r\n1000\r\n2000\r\n3000\r\n" },
        { "mixed endings", Head + "tick\n1000\r\n2000\n3000\r\n4000" },
        { "lone cr splits a line", Head + "tick\n1000\r2000\n3000\n" },
        { "cr at the end of the file", Head + "tick\n1000\n2000\r" },
        { "blank and space lines", Head + "tick\n\n1000\n   \n\t\n2000\n\n" },
        { "spaces around a value", Head + "tick\n 1000\n2000 \n\t3000\t\n" },
        { "leading zeros", Head + "tick\n0001000\n00002000\n0\n" },
        { "no final newline", Head + "tick\n1000\n2000" },
        { "trailer", Head + "tick\n1000\n2000\n# frames_lost = 0\n# note = x\n" },
        { "data after the trailer", Head + "tick\n1000\n# frames_lost = 0\n3000\n" },
        { "comment in the data", Head + "tick\n1000\n# just a comment\n" },
        { "bom", "\uFEFF" + Head + "tick\n1000\n2000\n" },
        { "19 digits", Head + "# timer_bits = 64\ntick\n1000\n9999999999999999999\n" },
        { "20 digits", Head + "# timer_bits = 64\ntick\n1000\n10000000000000000000\n18446744073709551615\n" },
        { "2^64", Head + "# timer_bits = 64\ntick\n1000\n18446744073709551616\n" },
        { "too wide for 32 bits", Head + "# timer_bits = 32\ntick\n1000\n4294967295\n4294967296\n" },
        { "64-bit tick steps back", Head + "# timer_bits = 64\ntick\n1000\n2000\n1500\n" },
        { "64-bit tick repeats", Head + "# timer_bits = 64\ntick\n1000\n1000\n" },
        { "a letter", Head + "tick\n1000\n20a0\n" },
        { "a minus", Head + "tick\n1000\n-2000\n" },
        { "two fields", Head + "tick\n1000\n2000,5\n" },
        { "empty field", Head + "tick\n1000\n,\n" },
        { "nul byte", Head + "tick\n1000\n\0\n2000\n" },
        { "temp and mark", Head + "tick,temp_c,mark\n1000,21.5,\n2000,,hold\n3000,22,release\n4000,,\n" },
        { "bad temperature", Head + "tick,temp_c\n1000,21.5\n2000,warm\n" },
        { "snapshots", "# freqreadout capture 1\n# clock_hz = 1000000\n# kind = snapshots\ntick,count\n1000,5\n2000,10\n3000,15\n" },
        { "snapshots count back", "# freqreadout capture 1\n# clock_hz = 1000000\n# kind = snapshots\n# count_bits = 64\ntick,count\n1000,5\n2000,4\n" },
        { "only the header", Head + "tick\n" },
        { "header without newline", Head + "tick" },
    };

    [Theory]
    [MemberData(nameof(HandMade))]
    public void Fast_text_path_matches_the_line_based_reader(string name, string text)
    {
        AssertSame(Encoding.UTF8.GetBytes(text), name);
    }

    [Fact]
    public void Fast_text_path_matches_on_invalid_utf8_in_the_data()
    {
        byte[] head = Encoding.UTF8.GetBytes(Head + "tick\n1000\n");
        byte[] bad = { (byte)'2', 0xC3, (byte)'\n', (byte)'3', (byte)'\n' };
        AssertSame(head.Concat(bad).ToArray(), "invalid utf-8");
        byte[] cut = { 0xE2, 0x82 };
        AssertSame(head.Concat(cut).ToArray(), "utf-8 cut at the end");
    }

    [Fact]
    public void Fast_text_path_matches_across_many_buffer_blocks()
    {
        // Rows of every length, CRLF, blank lines, comments and long lines, so that rows straddle the buffer's ends.
        var rng = new Random(12345);
        var text = new StringBuilder(Head + "# timer_bits = 64\ntick\n");
        ulong tick = 1;
        for (int i = 0; i < 9_000; i++)
        {
            tick += (ulong)rng.Next(1, 1_000_000) * (ulong)(rng.Next(10) == 0 ? 1_000_000_000 : 1);
            text.Append(rng.Next(30) switch
            {
                0 => "\r\n",
                1 => "\n",
                2 => "   ",
                _ => string.Empty,
            });
            text.Append(tick.ToString(CultureInfo.InvariantCulture)).Append(rng.Next(8) == 0 ? "\r\n" : "\n");
            if (rng.Next(500) == 0)
            {
                text.Append(' ', rng.Next(100, 3000)).Append('\n');
            }
        }

        text.Append("# frames_lost = 0\n");
        byte[] bytes = Encoding.UTF8.GetBytes(text.ToString());
        AssertSame(bytes, "many blocks");
        using var reader = new TextCaptureReader(new MemoryStream(bytes), "t", 97);
        var batch = new CaptureRowBatch(100);
        long rows = 0;
        while (reader.ReadBatch(batch))
        {
            rows += batch.Count;
        }

        Assert.Equal(9_000, rows);
        Assert.True(reader.FastRows > 8_000, $"most rows take the fast path ({reader.FastRows} of {rows})");
    }

    [Fact]
    public void Fast_paths_match_the_row_paths_on_the_contract_samples_and_regression_inputs()
    {
        var files = Directory.GetFiles(CaptureTestFiles.ContractsDir, "*.csv")
            .Concat(Directory.GetFiles(Path.Combine(AppContext.BaseDirectory, "Data", FuzzRegressionFiles.Folder, "text")))
            .Concat(Directory.GetFiles(Path.Combine(AppContext.BaseDirectory, "Data", FuzzRegressionFiles.Folder, "binary")))
            .OrderBy(p => p, StringComparer.Ordinal)
            .ToList();
        Assert.True(files.Count >= 20, "the samples are there");
        foreach (string path in files)
        {
            AssertSame(File.ReadAllBytes(path), Path.GetFileName(path));
        }

        foreach (byte[] binary in ParserTargets.BinarySamples())
        {
            AssertSame(binary, "converted sample");
        }
    }

    [Theory]
    [InlineData("text", 1500)]
    [InlineData("binary", 1500)]
    public void Fast_paths_match_the_row_paths_on_mutated_inputs(string parser, int count)
    {
        var runner = new FuzzRunner(ParserTargets.ByName(parser));
        for (int i = 0; i < count; i++)
        {
            int seed = FuzzRunner.InputSeed(20261202, i);
            byte[] input = runner.Build(seed, out string operators);
            AssertSame(input, $"{parser} mutant {seed} ({operators})");
        }
    }
}
