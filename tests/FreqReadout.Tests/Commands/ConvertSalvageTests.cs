using System.Text;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Commands;
using FreqReadout.Tests.Output;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// <c>convert --salvage</c> on damaged captures: a recording cut by a power loss at an arbitrary byte
/// (text and binary), a zero-filled tail, a corrupt block or line in the middle. The salvaged capture
/// holds exactly the original rows before the damage (compared with the undamaged capture, and for
/// binary with the block layout read by a walker of the test's own), stderr says where the damage
/// starts and what was lost, and the salvaged capture replays.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ConvertSalvageTests : IClassFixture<OutputSafetyInputs>, IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-salvage").FullName;
    private readonly string _text;
    private readonly string _binary;
    private readonly List<(ulong Tick, ulong Count, double? Temp, string? Mark)> _rows;

    public ConvertSalvageTests(OutputSafetyInputs inputs)
    {
        _text = Path.Combine(_dir, "cap.csv");
        _binary = Path.Combine(_dir, "cap.frb");
        File.Copy(Path.Combine(inputs.Dir, "cap.csv"), _text);
        Assert.Equal(0, ConsoleCapture.Run("convert", _text, _binary).Exit);
        _rows = Rows(_text);
    }

    public void Dispose() => Directory.Delete(_dir, true);

    /// <summary>Cut points spread over the whole file, the same on every run (a fixed seed), plus the ends.</summary>
    private static IEnumerable<long> CutPoints(long length, long headerEnd)
    {
        var random = new Random(20240611);
        yield return headerEnd + 1;
        for (int i = 0; i < 12; i++)
        {
            yield return headerEnd + 1 + (long)(random.NextDouble() * (length - headerEnd - 2));
        }

        yield return length - 1;
    }

    [Fact]
    public void A_text_recording_cut_by_a_power_loss_keeps_every_whole_row_and_replays()
    {
        byte[] bytes = File.ReadAllBytes(_text);
        long headerEnd = HeaderEnd(bytes);
        foreach (long cut in CutPoints(bytes.Length, headerEnd).Append(LineStartAfter(bytes, bytes.Length / 2)))
        {
            string damaged = Path.Combine(_dir, $"cut-{cut}.csv");
            File.WriteAllBytes(damaged, bytes.AsSpan(0, (int)cut).ToArray());
            int wholeRows = WholeDataLines(bytes, (int)headerEnd, (int)cut);
            bool midLine = bytes[cut - 1] != (byte)'\n';
            bool inTrailer = midLine && bytes[Array.LastIndexOf(bytes, (byte)'\n', (int)cut - 1) + 1] == (byte)'#';
            string output = Path.Combine(_dir, $"cut-{cut}.salvaged.csv");
            var (exit, _, stderr) = ConsoleCapture.RunMain("convert", damaged, output, "--to", "text", "--salvage");
            if (wholeRows == 0)
            {
                Assert.True(exit == 1, $"cut at {cut}: {stderr}");
                Assert.Contains("nothing to salvage: no row comes before the damage", stderr);
                Assert.False(File.Exists(output));
                continue;
            }

            Assert.True(exit == 0, $"cut at {cut}: {stderr}");
            Assert.Equal(_rows.Take(wholeRows), Rows(output));
            if (inTrailer)
            {
                long line = CountByte(bytes, 0, (int)cut, (byte)'\n') + 1;
                Assert.Contains($"warning: {damaged}: damaged at line {line}: the last line, a trailer line, has no line end, so its value may be cut", stderr);
                Assert.Contains($"kept every row ({wholeRows}) in {output}; lost: the trailer key simulated_rows", stderr);
            }
            else if (midLine)
            {
                long line = CountByte(bytes, 0, (int)cut, (byte)'\n') + 1;
                // A cut row either fails to parse (too few fields) or, when it still parses, is dropped for having no line end.
                Assert.True(stderr.Contains($"warning: {damaged}: damaged at line {line}"), $"cut at {cut}: {stderr}");
                Assert.Contains($"kept the {wholeRows} rows before it in {output}; lost: 1 data line", stderr);
                Assert.Contains("no line end", stderr);
                Assert.Contains($"{output}: text capture, {wholeRows} of ", stderr);
                using var reader = CaptureFile.Open(output);
                _ = reader.ReadRows().Count();
                Assert.Contains(reader.Trailer, kv => kv.Key == ConvertCommand.SalvageTrailerKey && kv.Value.StartsWith($"line {line} of {Path.GetFileName(damaged)}", StringComparison.Ordinal));
            }
            else
            {
                Assert.Contains("no damage found: every row was read", stderr);
            }
        }

        // Cut just after a row's comma: the row still parses (its tick looks whole), but without a line end
        // it cannot be trusted, so it is dropped and said so.
        int comma = Array.IndexOf(bytes, (byte)',', bytes.Length / 2) + 1;
        string parses = Path.Combine(_dir, "cut-after-comma.csv");
        File.WriteAllBytes(parses, bytes.AsSpan(0, comma).ToArray());
        string kept = Path.Combine(_dir, "cut-after-comma.salvaged.csv");
        var cutRun = ConsoleCapture.RunMain("convert", parses, kept, "--to", "text", "--salvage");
        Assert.True(cutRun.Exit == 0, cutRun.Err);
        long cutLine = CountByte(bytes, 0, comma, (byte)'\n') + 1;
        int before = WholeDataLines(bytes, (int)headerEnd, comma);
        Assert.Contains($"damaged at line {cutLine}: the last line has no line end, so it may be cut mid-row (as a power loss leaves a recording); kept the {before} rows before it in {kept}; lost: 1 data line (line {cutLine})", cutRun.Err);
        Assert.Equal(_rows.Take(before), Rows(kept));

        // The salvaged recording replays through the device pipeline.
        string half = Path.Combine(_dir, "half.csv");
        File.WriteAllBytes(half, bytes.AsSpan(0, bytes.Length / 2 + 3).ToArray());
        string rescued = Path.Combine(_dir, "half.rescued.frb");
        Assert.Equal(0, ConsoleCapture.RunMain("convert", half, rescued, "--salvage").Exit);
        var replay = ConsoleCapture.RunMain("replay", rescued, "--json");
        Assert.True(replay.Exit == 0, replay.Err);
        Assert.Contains("\"gates\":", replay.Out);
    }

    [Fact]
    public void A_binary_recording_cut_by_a_power_loss_keeps_every_whole_block_and_replays()
    {
        byte[] bytes = File.ReadAllBytes(_binary);
        List<Block> blocks = Walk(bytes);
        Assert.True(blocks.Count(b => b.Tag == 'D') >= 3, "the test capture spans several data blocks");
        long headerEnd = blocks[0].End;
        foreach (long cut in CutPoints(bytes.Length, headerEnd).Append(blocks[2].End))
        {
            string damaged = Path.Combine(_dir, $"cut-{cut}.frb");
            File.WriteAllBytes(damaged, bytes.AsSpan(0, (int)cut).ToArray());
            int wholeRows = blocks.Where(b => b.Tag == 'D' && b.End <= cut).Sum(b => b.Rows);
            Block firstCut = blocks.First(b => b.End > cut); // the first block the cut reaches (cut < length: the end block at the latest)
            string output = Path.Combine(_dir, $"cut-{cut}.salvaged.csv");
            var (exit, _, stderr) = ConsoleCapture.RunMain("convert", damaged, output, "--salvage");
            if (wholeRows == 0)
            {
                Assert.True(exit == 1, $"cut at {cut}: {stderr}");
                Assert.Contains("nothing to salvage: no row comes before the damage", stderr);
                Assert.False(File.Exists(output));
                continue;
            }

            Assert.True(exit == 0, $"cut at {cut}: {stderr}");
            Assert.Equal(_rows.Take(wholeRows), Rows(output));
            int number = blocks.IndexOf(firstCut); // block numbers: header 0, data blocks from 1
            Assert.Contains($"warning: {damaged}: damaged at block {number} (byte {firstCut.Start})", stderr);
            Assert.Contains($"kept the {wholeRows} rows before it in {output}; lost: ", stderr);
            if (firstCut.Start >= cut)
            {
                Assert.Contains("lost: no rows: the file ends there, without the end block", stderr);
            }
            else if (firstCut.Tag == 'D' && cut - firstCut.Start > 4)
            {
                Assert.Contains($"lost: block {number} ({firstCut.Rows} rows by its row count), cut after {cut - firstCut.Start} of its {firstCut.End - firstCut.Start} bytes; nothing follows it", stderr);
            }
            else if (firstCut.Tag == 'E')
            {
                Assert.Contains("lost: only the end block", stderr);
            }
        }

        string rescued = Path.Combine(_dir, "rescued.frb");
        File.WriteAllBytes(Path.Combine(_dir, "short.frb"), bytes.AsSpan(0, (int)blocks[2].Start + 100).ToArray());
        Assert.Equal(0, ConsoleCapture.RunMain("convert", Path.Combine(_dir, "short.frb"), rescued, "--to", "binary", "--salvage").Exit);
        var replay = ConsoleCapture.RunMain("replay", rescued, "--json");
        Assert.True(replay.Exit == 0, replay.Err);
    }

    [Fact]
    public void A_corrupt_block_in_the_middle_keeps_the_rows_before_it_and_counts_what_follows()
    {
        byte[] bytes = File.ReadAllBytes(_binary);
        List<Block> blocks = Walk(bytes);
        Block second = blocks[2]; // header, data 1, data 2, ...
        bytes[second.Start + 20] ^= 0x5A;
        string damaged = Path.Combine(_dir, "crc.frb");
        File.WriteAllBytes(damaged, bytes);
        string output = Path.Combine(_dir, "crc.csv");

        var plain = ConsoleCapture.RunMain("convert", damaged, output);
        Assert.Equal(CommandOutput.BadInput, plain.Exit);
        Assert.Contains("block 2 is corrupt", plain.Err);
        Assert.Contains($"(nothing written: {output} was not created; convert --salvage keeps the rows before the damage)", plain.Err);
        Assert.False(File.Exists(output));

        var (exit, _, stderr) = ConsoleCapture.RunMain("convert", damaged, output, "--salvage");
        Assert.True(exit == 0, stderr);
        int before = blocks[1].Rows;
        Assert.Equal(_rows.Take(before), Rows(output));
        int after = blocks.Skip(3).Where(b => b.Tag == 'D').Sum(b => b.Rows);
        int afterBlocks = blocks.Skip(3).Count(b => b.Tag == 'D');
        Assert.Contains($"damaged at block 2 (byte {second.Start})", stderr);
        Assert.Contains($"lost: block 2 ({second.Rows} rows by its row count, corrupt (CRC-32 mismatch)) and the {afterBlocks} intact-looking block{(afterBlocks == 1 ? "" : "s")} after it ({after} rows; then the end block)", stderr);
        Assert.Contains($"by the end block's total, {_rows.Count - before} rows in all", stderr);
    }

    [Fact]
    public void A_bad_line_or_a_zero_filled_tail_keeps_the_rows_before_it()
    {
        string[] lines = File.ReadAllLines(_text);
        int firstRowLine = Array.FindIndex(lines, l => l.StartsWith("tick", StringComparison.Ordinal)) + 2; // 1-based
        int badLine = firstRowLine + 500;
        lines[badLine - 1] = "12a4";
        string damaged = Path.Combine(_dir, "bad-line.csv");
        File.WriteAllText(damaged, string.Join("\n", lines) + "\n");
        string output = Path.Combine(_dir, "bad-line.salvaged.frb");
        var (exit, _, stderr) = ConsoleCapture.RunMain("convert", damaged, output, "--salvage");
        Assert.True(exit == 0, stderr);
        Assert.Equal(_rows.Take(500), Rows(output));
        int dataLinesFromBad = lines.Skip(badLine - 1).Count(l => l.Trim().Length > 0 && !l.TrimStart().StartsWith('#'));
        Assert.Contains($"damaged at line {badLine} (expected ", stderr);
        Assert.Contains($"lost: {dataLinesFromBad} data lines, from line {badLine} to line {lines.Length}", stderr);

        // A power loss can leave the file's last blocks full of zero bytes after the last good line.
        byte[] bytes = File.ReadAllBytes(_text);
        int cut = LineStartAfter(bytes, bytes.Length / 3) + 4;
        string zeroed = Path.Combine(_dir, "zeroed.csv");
        File.WriteAllBytes(zeroed, bytes.AsSpan(0, cut).ToArray().Concat(new byte[4096]).ToArray());
        output = Path.Combine(_dir, "zeroed.salvaged.csv");
        (exit, _, stderr) = ConsoleCapture.RunMain("convert", zeroed, output, "--to", "text", "--salvage");
        Assert.True(exit == 0, stderr);
        int whole = WholeDataLines(bytes, (int)HeaderEnd(bytes), cut);
        Assert.Equal(_rows.Take(whole), Rows(output));
        Assert.Contains($"damaged at line {CountByte(bytes, 0, cut, (byte)'\n') + 1}", stderr);
    }

    [Fact]
    public void An_undamaged_capture_is_written_whole_and_a_header_cut_is_refused()
    {
        string output = Path.Combine(_dir, "whole.frb");
        var (exit, _, stderr) = ConsoleCapture.RunMain("convert", _text, output, "--salvage");
        Assert.True(exit == 0, stderr);
        Assert.Contains("no damage found: every row was read", stderr);
        Assert.DoesNotContain("warning", stderr);
        Assert.Equal(_rows, Rows(output));
        using (var reader = CaptureFile.Open(output))
        {
            _ = reader.ReadRows().Count();
            Assert.DoesNotContain(reader.Trailer, kv => kv.Key == ConvertCommand.SalvageTrailerKey);
            Assert.Contains(reader.Metadata.HeaderLines, l => l.IsComment && l.Comment!.Contains("freqreadout convert --salvage"));
        }

        string headerOnly = Path.Combine(_dir, "header-cut.csv");
        File.WriteAllBytes(headerOnly, File.ReadAllBytes(_text).AsSpan(0, 40).ToArray());
        var before = FileSnapshot.Of(_dir);
        (exit, _, stderr) = ConsoleCapture.RunMain("convert", headerOnly, Path.Combine(_dir, "nothing.frb"), "--salvage");
        Assert.Equal(1, exit);
        Assert.StartsWith($"error: {headerOnly}:", stderr);
        FileSnapshot.AssertUnchanged(before, _dir, "header cut");
    }

    [Fact]
    public void Convert_help_documents_salvage_and_its_exit_codes()
    {
        string stdout = Docs.CliProcess.Run(_dir, new[] { "convert", "--help" }).Stdout;
        string help = string.Join(" ", stdout.Split((char[])['\n', '│', ' '], StringSplitOptions.RemoveEmptyEntries));
        Assert.Contains("--salvage", help);
        Assert.Contains("Exit 0 when rows were rescued (or no damage was found), 1 when no row comes before the damage", help);
    }

    private static List<(ulong Tick, ulong Count, double? Temp, string? Mark)> Rows(string path)
    {
        using var reader = CaptureFile.Open(path);
        return reader.ReadRows().Select(r => (r.Tick, r.Count, r.TemperatureC, r.Mark)).ToList();
    }

    /// <summary>Offset just after the column header line of a text capture.</summary>
    private static long HeaderEnd(byte[] bytes)
    {
        string text = Encoding.UTF8.GetString(bytes, 0, Math.Min(bytes.Length, 4096));
        int header = text.IndexOf("\ntick", StringComparison.Ordinal) + 1;
        return Encoding.UTF8.GetByteCount(text.AsSpan(0, text.IndexOf('\n', header) + 1));
    }

    /// <summary>Lines between <paramref name="from"/> and <paramref name="to"/> that end with a line break and are not '#' lines.</summary>
    private static int WholeDataLines(byte[] bytes, int from, int to)
    {
        int n = 0;
        int start = from;
        for (int i = from; i < to; i++)
        {
            if (bytes[i] == (byte)'\n')
            {
                if (i > start && bytes[start] != (byte)'#')
                {
                    n++;
                }

                start = i + 1;
            }
        }

        return n;
    }

    private static int LineStartAfter(byte[] bytes, int position) => Array.IndexOf(bytes, (byte)'\n', position) + 1;

    private static int CountByte(byte[] bytes, int from, int to, byte value)
    {
        int n = 0;
        for (int i = from; i < to; i++)
        {
            if (bytes[i] == value)
            {
                n++;
            }
        }

        return n;
    }

    private sealed record Block(char Tag, long Start, long End, int Rows);

    /// <summary>
    /// The test's own walk over a binary capture (hardware-notes/binary-capture-format.md): 8 magic bytes
    /// and a version byte, then blocks of tag, LEB128 length, payload and a 4-byte CRC; a data block's
    /// payload starts with its row count.
    /// </summary>
    private static List<Block> Walk(byte[] bytes)
    {
        var blocks = new List<Block>();
        long pos = 9;
        while (pos < bytes.Length)
        {
            long start = pos;
            char tag = (char)bytes[pos++];
            long length = ReadLeb128(bytes, ref pos);
            long payloadStart = pos;
            int rows = tag == 'D' ? (int)ReadLeb128(bytes, ref pos) : 0;
            pos = payloadStart + length + 4;
            blocks.Add(new Block(tag, start, pos, rows));
        }

        Assert.Equal(bytes.Length, pos);
        return blocks;
    }

    private static long ReadLeb128(byte[] bytes, ref long pos)
    {
        long value = 0;
        for (int shift = 0; ; shift += 7)
        {
            byte b = bytes[pos++];
            value |= (long)(b & 0x7F) << shift;
            if ((b & 0x80) == 0)
            {
                return value;
            }
        }
    }
}
