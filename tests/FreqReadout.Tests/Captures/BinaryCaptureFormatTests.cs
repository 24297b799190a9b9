using System.IO.Hashing;
using System.Text;
using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Captures;

/// <summary>The binary capture format: CRC, varints, lossless round trip, corruption and truncation errors.</summary>
public sealed class BinaryCaptureFormatTests
{
    public static TheoryData<string> GoodSamples() => new()
    {
        "minimal.edges.csv", "beat-with-temp.edges.csv", "snapshots.edges.csv", "wrap16.edges.csv",
    };

    [Fact]
    public void Crc32_check_value_of_123456789_is_CBF43926()
    {
        // CRC-32 (IEEE 802.3, reflected polynomial 0xEDB88320): check value 0xCBF43926 for ASCII "123456789".
        // Source: Williams, "A Painless Guide to CRC Error Detection Algorithms", 1993 (CRC catalogue; memory).
        Assert.Equal(0xCBF43926u, Crc32.HashToUInt32(Encoding.ASCII.GetBytes("123456789")));

        // The same check through the incremental form the writer and reader use, split across appends.
        var crc = new Crc32();
        crc.Append(Encoding.ASCII.GetBytes("1234"));
        crc.Append(Encoding.ASCII.GetBytes("56789"));
        Assert.Equal(0xCBF43926u, crc.GetCurrentHashAsUInt32());
    }

    [Theory]
    [InlineData(0UL, new byte[] { 0x00 })]
    [InlineData(127UL, new byte[] { 0x7F })]
    [InlineData(128UL, new byte[] { 0x80, 0x01 })]
    [InlineData(624485UL, new byte[] { 0xE5, 0x8E, 0x26 })] // the LEB128 example of the DWARF 4 standard, sec. 7.6 (memory)
    [InlineData(ulong.MaxValue, new byte[] { 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0x01 })]
    public void Unsigned_leb128_encodes_seven_bits_per_byte_low_first(ulong value, byte[] expected)
    {
        var buffer = new byte[10];
        int n = BinaryCaptureFormat.WriteUVarint(buffer, value);
        Assert.Equal(expected, buffer.Take(n).ToArray());
        int pos = 0;
        Assert.True(BinaryCaptureFormat.TryReadUVarint(buffer.AsSpan(0, n), ref pos, out ulong back));
        Assert.Equal((value, n), (back, pos));
    }

    [Fact]
    public void Varint_reader_rejects_truncated_and_over_long_input()
    {
        int pos = 0;
        Assert.False(BinaryCaptureFormat.TryReadUVarint(new byte[] { 0x80, 0x80 }, ref pos, out _));
        pos = 0;
        Assert.False(BinaryCaptureFormat.TryReadUVarint(new byte[] { 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0x02 }, ref pos, out _));
    }

    [Theory]
    [InlineData(0L, 0UL)]
    [InlineData(-1L, 1UL)]
    [InlineData(1L, 2UL)]
    [InlineData(-2L, 3UL)]
    [InlineData(long.MaxValue, ulong.MaxValue - 1)]
    [InlineData(long.MinValue, ulong.MaxValue)]
    public void Zigzag_maps_small_magnitudes_to_small_codes(long value, ulong code)
    {
        Assert.Equal(code, BinaryCaptureFormat.ZigZag(value));
        Assert.Equal(value, BinaryCaptureFormat.UnZigZag(code));
    }

    [Theory]
    [MemberData(nameof(GoodSamples))]
    public void Text_to_binary_to_text_is_byte_identical(string name)
    {
        byte[] original = File.ReadAllBytes(Contract(name));
        byte[] binary = Convert(original, CaptureFileFormat.Binary);
        Assert.Equal(BinaryCaptureFormat.Magic, binary.Take(8).ToArray());
        byte[] back = Convert(binary, CaptureFileFormat.Text);
        Assert.Equal(Encoding.UTF8.GetString(original), Encoding.UTF8.GetString(back));
    }

    [Fact]
    public void Steady_edges_take_about_one_byte_per_row()
    {
        byte[] original = File.ReadAllBytes(Contract("minimal.edges.csv"));
        byte[] binary = Convert(original, CaptureFileFormat.Binary);

        // 101 rows of a constant 200-tick step: the change of step is 0, one byte each, plus header.
        Assert.InRange(binary.Length, 101, 101 + 80);
    }

    [Fact]
    public void Many_blocks_wide_values_and_every_field_round_trip()
    {
        var md = new CaptureMetadata { ClockHz = 1e6, Kind = CaptureKind.Snapshots, TimerBits = 24, CountBits = 16 };
        md.ExtraColumns.Add("mark");
        md.ExtraColumns.Add("temp_c");
        md.Extra.Add(new("rig", "südwest"));
        var rng = new Random(7);
        var rows = new List<CaptureRow>();
        ulong tick = 16_777_000, count = 65_000;
        for (int i = 0; i < 3 * BinaryCaptureFormat.RowsPerBlock + 17; i++)
        {
            tick = (tick + (ulong)rng.Next(1, 9000)) & 0xFFFFFF;
            count = (count + (ulong)rng.Next(0, 1200)) & 0xFFFF;
            double? t = i % 97 == 0 ? rng.NextDouble() * 40 - 10 : null;
            string? mark = i % 1001 == 0 ? "hold" : i % 1003 == 0 ? "pass über rebar" : null;
            rows.Add(new CaptureRow(i + 1, tick, count, t, mark));
        }

        var trailer = new[] { new KeyValuePair<string, string>("frames_lost", "12"), new KeyValuePair<string, string>("crc_errors", "0") };
        byte[] bytes = Write(md, rows, trailer, CaptureFileFormat.Binary);
        using var reader = CaptureFile.Open(new MemoryStream(bytes), "many.frb");
        Assert.IsType<BinaryCaptureReader>(reader);
        Assert.Equal(new[] { "mark", "temp_c" }, reader.Metadata.ExtraColumns);
        Assert.Equal("südwest", reader.Metadata.GetExtra("rig"));
        Assert.Equal(rows, reader.ReadRows().ToList());
        Assert.Equal(trailer, reader.Trailer);
    }

    [Fact]
    public void Sixty_four_bit_extremes_round_trip()
    {
        var md = new CaptureMetadata { ClockHz = 80e6 };
        var rows = new ulong[] { 0UL, 1UL, (ulong)long.MaxValue, (ulong)long.MaxValue + 5, ulong.MaxValue - 1, ulong.MaxValue }
            .Select((t, i) => new CaptureRow(i + 1, t, 0, null, null)).ToList();
        byte[] bytes = Write(md, rows, Array.Empty<KeyValuePair<string, string>>(), CaptureFileFormat.Binary);
        using var reader = CaptureFile.Open(new MemoryStream(bytes), "wide.frb");
        Assert.Equal(rows, reader.ReadRows().ToList());
    }

    [Fact]
    public void Format_is_picked_by_content_not_by_name()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-sniff").FullName;
        try
        {
            string binaryNamedCsv = Path.Combine(dir, "really-binary.csv");
            string textNamedBin = Path.Combine(dir, "really-text.frb");
            File.WriteAllBytes(binaryNamedCsv, Convert(File.ReadAllBytes(Contract("wrap16.edges.csv")), CaptureFileFormat.Binary));
            File.Copy(Contract("wrap16.edges.csv"), textNamedBin);
            Assert.Equal(CaptureFileFormat.Binary, CaptureFile.DetectFormat(binaryNamedCsv));
            Assert.Equal(CaptureFileFormat.Text, CaptureFile.DetectFormat(textNamedBin));
            using (var a = CaptureFile.Open(binaryNamedCsv))
            using (var b = CaptureFile.Open(textNamedBin))
            {
                Assert.IsType<BinaryCaptureReader>(a);
                Assert.IsType<TextCaptureReader>(b);
                Assert.Equal(b.ReadRows().Select(r => r.Tick), a.ReadRows().Select(r => r.Tick));
            }
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    [Fact]
    public void A_corrupt_block_names_the_block_and_the_rows_readable_before_it()
    {
        var (bytes, offsets, rows) = ThreeBlockCapture();
        bytes[offsets[1] + 40] ^= 0x10; // a bit flipped inside data block 2
        var read = new List<CaptureRow>();
        var e = Assert.Throws<CaptureFormatException>(() =>
        {
            using var reader = CaptureFile.Open(new MemoryStream(bytes), "flip.frb");
            foreach (var row in reader.ReadRows())
            {
                read.Add(row);
            }
        });
        Assert.Equal(2L, e.LineNumber);
        Assert.Contains("block 2 is corrupt: its CRC-32 is 0x", e.Problem);
        Assert.Contains($"the {BinaryCaptureFormat.RowsPerBlock} rows in block 1 before it are readable", e.Problem);
        Assert.Equal(rows.Take(BinaryCaptureFormat.RowsPerBlock), read); // and they were returned
    }

    [Fact]
    public void A_truncated_block_names_the_block_and_the_rows_readable_before_it()
    {
        var (bytes, offsets, _) = ThreeBlockCapture();
        byte[] cut = bytes.Take(offsets[2] + 100).ToArray(); // the file ends inside data block 3
        var e = ReadAllError(cut, "cut.frb");
        Assert.Equal(3L, e.LineNumber);
        Assert.Contains("block 3 is truncated: the file ends after", e.Problem);
        Assert.Contains($"the {2 * BinaryCaptureFormat.RowsPerBlock} rows in blocks 1 to 2 before it are readable", e.Problem);
    }

    [Fact]
    public void A_file_without_its_end_block_is_reported_truncated_with_every_row_readable()
    {
        var (bytes, offsets, rows) = ThreeBlockCapture();
        byte[] cut = bytes.Take(offsets[3]).ToArray(); // everything but the end block
        var read = new List<CaptureRow>();
        var e = Assert.Throws<CaptureFormatException>(() =>
        {
            using var reader = CaptureFile.Open(new MemoryStream(cut), "noend.frb");
            foreach (var row in reader.ReadRows())
            {
                read.Add(row);
            }
        });
        Assert.Contains("without the end block: the capture is truncated", e.Problem);
        Assert.Contains($"all {rows.Count} rows before it are readable", e.Problem);
        Assert.Equal(rows, read);
    }

    [Fact]
    public void Bytes_after_the_end_block_are_an_error()
    {
        var (bytes, _, _) = ThreeBlockCapture();
        var e = ReadAllError(bytes.Append((byte)0).ToArray(), "tail.frb");
        Assert.Contains("expected the end of the file after the end block", e.Problem);
    }

    [Fact]
    public void A_dropped_block_is_caught_by_the_row_total()
    {
        var (bytes, offsets, _) = ThreeBlockCapture();
        byte[] dropped = bytes.Take(offsets[1]).Concat(bytes.Skip(offsets[2])).ToArray();
        var e = ReadAllError(dropped, "dropped.frb");
        Assert.Contains("a data block is missing", e.Problem);
    }

    [Theory]
    [InlineData(8, 2, "unsupported binary capture version 2: expected version 1")]
    [InlineData(12, 0x55, "the header block (block 0) is corrupt")]
    public void Bad_version_or_header_fails_at_open(int offset, byte value, string expected)
    {
        var (bytes, _, _) = ThreeBlockCapture();
        bytes[offset] = value;
        var e = Assert.Throws<CaptureFormatException>(() => CaptureFile.Open(new MemoryStream(bytes), "head.frb"));
        Assert.Equal(0L, e.LineNumber);
        Assert.Contains(expected, e.Problem);
    }

    [Fact]
    public void Disposing_without_complete_keeps_the_rows_written()
    {
        var md = new CaptureMetadata { ClockHz = 1e6 };
        var stream = new MemoryStream();
        using (var writer = new BinaryCaptureWriter(stream, md, leaveOpen: true))
        {
            writer.WriteRow(new CaptureRow(1, 10, 0, null, null));
            writer.WriteRow(new CaptureRow(2, 20, 0, null, null));
        }

        var read = new List<CaptureRow>();
        var e = Assert.Throws<CaptureFormatException>(() =>
        {
            using var reader = CaptureFile.Open(new MemoryStream(stream.ToArray()), "crash.frb");
            read.AddRange(reader.ReadRows());
        });
        Assert.Contains("truncated", e.Problem);
        Assert.Equal(new ulong[] { 10, 20 }, read.Select(r => r.Tick));
    }

    [Fact]
    public void Binary_metadata_follows_the_text_rules()
    {
        // A beat capture without beat_side cannot be written, and its header rules are the text reader's.
        var md = new CaptureMetadata { ClockHz = 1e6, Signal = SignalKind.Beat };
        var e = Assert.Throws<ArgumentException>(() => new BinaryCaptureWriter(new MemoryStream(), md));
        Assert.Contains("beat_side", e.Message);
    }

    [Fact]
    public void Binary_reader_streams_lazily()
    {
        var source = new GeneratedCaptureStream(200_000);
        byte[] binary;
        using (var text = CaptureFile.Open(source, "gen.csv"))
        {
            var output = new MemoryStream();
            using (var writer = new BinaryCaptureWriter(output, text.Metadata, leaveOpen: true))
            {
                foreach (var row in text.ReadRows())
                {
                    writer.WriteRow(row);
                }

                writer.Complete(text.Trailer);
            }

            binary = output.ToArray();
        }

        long blocks = (200_000 + BinaryCaptureFormat.RowsPerBlock - 1) / BinaryCaptureFormat.RowsPerBlock;
        long bytesPerBlock = binary.Length / blocks + 64;
        Assert.True(binary.Length > 70_000 + 20 * bytesPerBlock, "the capture is much larger than the read-ahead");
        var counting = new CountingStream(new MemoryStream(binary));
        using var reader = CaptureFile.Open(counting, "gen.frb");
        long n = 0;
        foreach (var row in reader.ReadRows())
        {
            Assert.Equal(GeneratedCaptureStream.TickOf(n), row.Tick);
            if (n % 10_000 == 0)
            {
                // At most the blocks up to the current one (plus stream buffering) have been pulled.
                long bound = 70_000 + (n / BinaryCaptureFormat.RowsPerBlock + 1) * bytesPerBlock;
                Assert.True(counting.BytesRead <= bound, $"row {n}: {counting.BytesRead} bytes pulled (bound {bound})");
            }

            n++;
        }

        Assert.Equal(200_000, n);
    }

    private static CaptureFormatException ReadAllError(byte[] bytes, string name)
    {
        return Assert.Throws<CaptureFormatException>(() =>
        {
            using var reader = CaptureFile.Open(new MemoryStream(bytes), name);
            foreach (var unused in reader.ReadRows())
            {
            }
        });
    }

    /// <summary>A binary capture of exactly three full data blocks; offsets of data blocks 1, 2, 3 and the end block.</summary>
    private static (byte[] Bytes, int[] Offsets, List<CaptureRow> Rows) ThreeBlockCapture()
    {
        var md = new CaptureMetadata { ClockHz = 8e6, TimerBits = 16 };
        var rows = new List<CaptureRow>();
        var rng = new Random(3);
        ulong tick = 0;
        for (int i = 0; i < 3 * BinaryCaptureFormat.RowsPerBlock; i++)
        {
            tick = (tick + 266 + (ulong)rng.Next(0, 3)) & 0xFFFF;
            rows.Add(new CaptureRow(i + 1, tick, 0, null, null));
        }

        var stream = new MemoryStream();
        using (var writer = new BinaryCaptureWriter(stream, md, leaveOpen: true))
        {
            foreach (var row in rows)
            {
                writer.WriteRow(row);
            }

            writer.Complete(Array.Empty<KeyValuePair<string, string>>());
        }

        byte[] bytes = stream.ToArray();
        Assert.Equal(4, BlockOffsets(bytes).Length); // three data blocks and the end block
        return (bytes, BlockOffsets(bytes), rows);
    }

    /// <summary>Walks the block structure: returns the offsets of every block after the header.</summary>
    private static int[] BlockOffsets(byte[] bytes)
    {
        var result = new List<int>();
        int pos = 9;
        bool first = true;
        while (pos < bytes.Length)
        {
            if (!first)
            {
                result.Add(pos);
            }

            first = false;
            int p = pos + 1;
            Assert.True(BinaryCaptureFormat.TryReadUVarint(bytes, ref p, out ulong length));
            pos = p + (int)length + 4;
        }

        return result.ToArray();
    }

    private static byte[] Convert(byte[] input, CaptureFileFormat to)
    {
        using var reader = CaptureFile.Open(new MemoryStream(input), "in");
        var output = new MemoryStream();
        using (var writer = CaptureFile.Create(output, reader.Metadata, to))
        {
            foreach (var row in reader.ReadRows())
            {
                writer.WriteRow(row);
            }

            writer.Complete(reader.Trailer);
        }

        return output.ToArray();
    }

    private static byte[] Write(CaptureMetadata md, IEnumerable<CaptureRow> rows, IReadOnlyList<KeyValuePair<string, string>> trailer, CaptureFileFormat format)
    {
        var output = new MemoryStream();
        using (var writer = CaptureFile.Create(output, md, format))
        {
            foreach (var row in rows)
            {
                writer.WriteRow(row);
            }

            writer.Complete(trailer);
        }

        return output.ToArray();
    }

    private sealed class CountingStream(Stream inner) : Stream
    {
        public long BytesRead { get; private set; }

        public override bool CanRead => true;

        public override bool CanSeek => false;

        public override bool CanWrite => false;

        public override long Length => throw new NotSupportedException();

        public override long Position { get => BytesRead; set => throw new NotSupportedException(); }

        public override int Read(byte[] buffer, int offset, int count)
        {
            int n = inner.Read(buffer, offset, count);
            BytesRead += n;
            return n;
        }

        public override void Flush()
        {
        }

        public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();

        public override void SetLength(long value) => throw new NotSupportedException();

        public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();
    }
}
