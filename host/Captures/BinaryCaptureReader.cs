using System.Buffers.Binary;
using System.IO.Hashing;

namespace FreqReadout.Host.Captures;

/// <summary>
/// Streaming reader of the binary capture format (hardware-notes/binary-capture-format.md). The
/// header block is read and checked when the reader is built; data blocks are read one at a time,
/// each checked against its CRC-32 before any of its rows is returned. A corrupt or truncated block
/// throws a <see cref="CaptureFormatException"/> whose line number is the block number (header = 0,
/// data blocks from 1) and whose text names the block and how many rows before it are readable
/// (those rows have already been returned).
/// </summary>
public sealed class BinaryCaptureReader : ICaptureBatchReader
{
    private readonly Stream _stream;
    private readonly bool _leaveOpen;
    private readonly List<string> _warnings = new();
    private readonly List<KeyValuePair<string, string>> _trailer = new();
    private readonly bool _snapshots;
    private readonly bool _hasFlags;
    private readonly ulong _tickMask;
    private readonly ulong _countMask;
    private byte[] _buffer = new byte[65536];
    private long _blockNumber;
    private long _rowsRead;
    private bool _started;
    private CaptureRowOrder? _batchOrder;
    private bool _rowsEnded;
    private bool _inBlock;
    private int _blockLength;
    private int _blockPos;
    private ulong _blockRows;
    private ulong _blockRow;
    private ulong _blockTick;
    private ulong _blockTickStep;
    private ulong _blockCount;
    private ulong _blockCountStep;
    private readonly BatchErrorHold _errors = new();
    private Action<CaptureRowBatch>? _fillBatch;

    /// <summary>Reads a binary capture from a stream positioned at its magic.</summary>
    /// <param name="stream">The capture bytes (need not be seekable).</param>
    /// <param name="sourceName">Name used in messages.</param>
    /// <param name="leaveOpen">True to leave <paramref name="stream"/> open on dispose.</param>
    /// <exception cref="CaptureFormatException">Not a binary capture, an unsupported version, or a bad header block.</exception>
    public BinaryCaptureReader(Stream stream, string sourceName, bool leaveOpen = false)
    {
        _stream = stream;
        _leaveOpen = leaveOpen;
        SourceName = sourceName;
        try
        {
            Metadata = ReadHeader();
        }
        catch
        {
            if (!leaveOpen)
            {
                stream.Dispose();
            }

            throw;
        }

        _snapshots = Metadata.Kind == CaptureKind.Snapshots;
        _hasFlags = Metadata.ExtraColumns.Count > 0;
        _tickMask = Metadata.TimerBits >= 64 ? ulong.MaxValue : (1UL << Metadata.TimerBits) - 1;
        _countMask = Metadata.CountBits >= 64 ? ulong.MaxValue : (1UL << Metadata.CountBits) - 1;
    }

    /// <summary>Opens a binary capture file.</summary>
    public static BinaryCaptureReader Open(string path)
    {
        var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 65536, FileOptions.SequentialScan);
        return new BinaryCaptureReader(stream, path);
    }

    /// <inheritdoc/>
    public string SourceName { get; }

    /// <inheritdoc/>
    public CaptureMetadata Metadata { get; }

    /// <inheritdoc/>
    public IReadOnlyList<string> Warnings => _warnings;

    /// <inheritdoc/>
    public IReadOnlyList<KeyValuePair<string, string>> Trailer => _trailer;

    /// <summary>Data blocks read so far.</summary>
    public long BlocksRead => Math.Max(0, _blockNumber);

    /// <inheritdoc/>
    public IEnumerable<CaptureRow> ReadRows()
    {
        if (_started)
        {
            throw new InvalidOperationException("ReadRows streams the capture once; open the file again to read it again");
        }

        _started = true;
        return Rows();
    }

    /// <inheritdoc/>
    public void Dispose()
    {
        if (!_leaveOpen)
        {
            _stream.Dispose();
        }
    }

    private IEnumerable<CaptureRow> Rows()
    {
        var order = new CaptureRowOrder(Metadata);
        while (true)
        {
            _blockNumber++;
            if (!TryReadBlock(out byte tag, out int length))
            {
                throw Error(_blockNumber, $"the file ends after block {_blockNumber - 1} without the end block: the capture is truncated (its writer did not complete); all {_rowsRead} rows before it are readable");
            }

            if (tag == BinaryCaptureFormat.EndTag)
            {
                ReadEnd(length);
                yield break;
            }

            if (tag != BinaryCaptureFormat.DataTag)
            {
                throw Error(_blockNumber, $"block {_blockNumber} has the unknown tag 0x{tag:X2}, expected a data block ('D') or the end block ('E'); {ReadableBefore()}");
            }

            int pos = 0;
            if (!BinaryCaptureFormat.TryReadUVarint(_buffer.AsSpan(0, length), ref pos, out ulong rowCount) || rowCount == 0)
            {
                throw Malformed("its row count");
            }

            ulong tick = 0;
            ulong tickStep = 0;
            ulong count = 0;
            ulong countStep = 0;
            for (ulong i = 0; i < rowCount; i++)
            {
                var data = new ReadOnlySpan<byte>(_buffer, 0, length);
                if (!BinaryCaptureFormat.TryReadUVarint(data, ref pos, out ulong tickDelta))
                {
                    throw Malformed($"the tick of its row {i + 1}");
                }

                tickStep = (tickStep + (ulong)BinaryCaptureFormat.UnZigZag(tickDelta)) & _tickMask;
                tick = (tick + tickStep) & _tickMask;
                if (_snapshots)
                {
                    if (!BinaryCaptureFormat.TryReadUVarint(data, ref pos, out ulong countDelta))
                    {
                        throw Malformed($"the count of its row {i + 1}");
                    }

                    countStep = (countStep + (ulong)BinaryCaptureFormat.UnZigZag(countDelta)) & _countMask;
                    count = (count + countStep) & _countMask;
                }

                double? temperature = null;
                string? mark = null;
                if (_hasFlags)
                {
                    if (pos >= length)
                    {
                        throw Malformed($"the flags of its row {i + 1}");
                    }

                    byte flags = data[pos++];
                    if ((flags & ~(BinaryCaptureFormat.TemperatureFlag | BinaryCaptureFormat.MarkFlag)) != 0
                        || ((flags & BinaryCaptureFormat.TemperatureFlag) != 0 && !Metadata.HasTemperatureColumn)
                        || ((flags & BinaryCaptureFormat.MarkFlag) != 0 && !Metadata.HasMarkColumn))
                    {
                        throw Malformed($"the flags of its row {i + 1} (0x{flags:X2})");
                    }

                    if ((flags & BinaryCaptureFormat.TemperatureFlag) != 0)
                    {
                        if (pos + 8 > length)
                        {
                            throw Malformed($"the temperature of its row {i + 1}");
                        }

                        temperature = BinaryPrimitives.ReadDoubleLittleEndian(data.Slice(pos, 8));
                        if (CaptureColumns.TemperatureProblem(temperature.Value) is string range)
                        {
                            throw Error(_blockNumber, $"block {_blockNumber}, row {_rowsRead + 1}: {range}");
                        }

                        pos += 8;
                    }

                    if ((flags & BinaryCaptureFormat.MarkFlag) != 0)
                    {
                        if (!BinaryCaptureFormat.TryReadString(data, ref pos, out string text) || text.Length == 0 || text.Contains(','))
                        {
                            throw Malformed($"the mark of its row {i + 1}");
                        }

                        mark = text;
                    }
                }

                var row = new CaptureRow(_rowsRead + 1, tick, count, temperature, mark);
                string? orderProblem = order.Check(row, "row");
                if (orderProblem != null)
                {
                    throw Error(_blockNumber, $"block {_blockNumber}, row {row.LineNumber}: {orderProblem}");
                }

                _rowsRead++;
                yield return row;
            }

            if (pos != length)
            {
                throw Malformed($"its length ({length - pos} bytes left after {rowCount} rows)");
            }
        }
    }

    /// <inheritdoc/>
    public bool ReadBatch(CaptureRowBatch batch)
    {
        batch.Clear();
        if (!_started)
        {
            _started = true;
            _batchOrder = new CaptureRowOrder(Metadata);
        }

        _errors.ThrowIfHeld();
        if (_rowsEnded)
        {
            return false;
        }

        return _errors.Fill(batch, _fillBatch ??= FillBatch);
    }

    /// <summary>
    /// Decodes rows straight into the batch, resuming inside a block where the last batch stopped. The checks and
    /// messages are those of the row-by-row decoder (<see cref="Rows"/>, kept as the oracle), in the same order.
    /// </summary>
    private void FillBatch(CaptureRowBatch batch)
    {
        CaptureRowOrder order = _batchOrder!;
        bool checkOrder = order.ChecksOrder;
        while (!batch.IsFull)
        {
            if (_blockRow == _blockRows)
            {
                if (_inBlock)
                {
                    _inBlock = false;
                    if (_blockPos != _blockLength)
                    {
                        throw Malformed($"its length ({_blockLength - _blockPos} bytes left after {_blockRows} rows)");
                    }
                }

                _blockNumber++;
                if (!TryReadBlock(out byte tag, out int length))
                {
                    throw Error(_blockNumber, $"the file ends after block {_blockNumber - 1} without the end block: the capture is truncated (its writer did not complete); all {_rowsRead} rows before it are readable");
                }

                if (tag == BinaryCaptureFormat.EndTag)
                {
                    ReadEnd(length);
                    _rowsEnded = true;
                    return;
                }

                if (tag != BinaryCaptureFormat.DataTag)
                {
                    throw Error(_blockNumber, $"block {_blockNumber} has the unknown tag 0x{tag:X2}, expected a data block ('D') or the end block ('E'); {ReadableBefore()}");
                }

                int start = 0;
                if (!BinaryCaptureFormat.TryReadUVarint(_buffer.AsSpan(0, length), ref start, out ulong rowCount) || rowCount == 0)
                {
                    throw Malformed("its row count");
                }

                _inBlock = true;
                _blockLength = length;
                _blockPos = start;
                _blockRows = rowCount;
                _blockRow = 0;
                _blockTick = 0;
                _blockTickStep = 0;
                _blockCount = 0;
                _blockCountStep = 0;
            }

            var data = new ReadOnlySpan<byte>(_buffer, 0, _blockLength);
            int pos = _blockPos;
            ulong tick = _blockTick;
            ulong tickStep = _blockTickStep;
            ulong count = _blockCount;
            ulong countStep = _blockCountStep;
            ulong tickMask = _tickMask;
            bool bare = !_snapshots && !_hasFlags && !checkOrder;
            while (_blockRow < _blockRows && !batch.IsFull)
            {
                if (bare)
                {
                    // The common case: an edge capture's rows, each a one-byte tick varint (a second difference of
                    // -64 to 63 ticks), written straight into the batch; a longer varint takes the general steps below.
                    int taken = DecodeOneByteRows(batch, ref pos, ref tick, ref tickStep, count);
                    if (taken > 0)
                    {
                        _blockRow += (ulong)taken;
                        _rowsRead += taken;
                        continue;
                    }
                }

                ulong i = _blockRow;
                if (!BinaryCaptureFormat.TryReadUVarint(data, ref pos, out ulong tickDelta))
                {
                    throw Malformed($"the tick of its row {i + 1}");
                }

                tickStep = (tickStep + (ulong)BinaryCaptureFormat.UnZigZag(tickDelta)) & tickMask;
                tick = (tick + tickStep) & tickMask;
                if (_snapshots)
                {
                    if (!BinaryCaptureFormat.TryReadUVarint(data, ref pos, out ulong countDelta))
                    {
                        throw Malformed($"the count of its row {i + 1}");
                    }

                    countStep = (countStep + (ulong)BinaryCaptureFormat.UnZigZag(countDelta)) & _countMask;
                    count = (count + countStep) & _countMask;
                }

                double? temperature = null;
                string? mark = null;
                if (_hasFlags)
                {
                    if (pos >= _blockLength)
                    {
                        throw Malformed($"the flags of its row {i + 1}");
                    }

                    byte flags = data[pos++];
                    if ((flags & ~(BinaryCaptureFormat.TemperatureFlag | BinaryCaptureFormat.MarkFlag)) != 0
                        || ((flags & BinaryCaptureFormat.TemperatureFlag) != 0 && !Metadata.HasTemperatureColumn)
                        || ((flags & BinaryCaptureFormat.MarkFlag) != 0 && !Metadata.HasMarkColumn))
                    {
                        throw Malformed($"the flags of its row {i + 1} (0x{flags:X2})");
                    }

                    if ((flags & BinaryCaptureFormat.TemperatureFlag) != 0)
                    {
                        if (pos + 8 > _blockLength)
                        {
                            throw Malformed($"the temperature of its row {i + 1}");
                        }

                        temperature = BinaryPrimitives.ReadDoubleLittleEndian(data.Slice(pos, 8));
                        if (CaptureColumns.TemperatureProblem(temperature.Value) is string range)
                        {
                            throw Error(_blockNumber, $"block {_blockNumber}, row {_rowsRead + 1}: {range}");
                        }

                        pos += 8;
                    }

                    if ((flags & BinaryCaptureFormat.MarkFlag) != 0)
                    {
                        if (!BinaryCaptureFormat.TryReadString(data, ref pos, out string text) || text.Length == 0 || text.Contains(','))
                        {
                            throw Malformed($"the mark of its row {i + 1}");
                        }

                        mark = text;
                    }
                }

                long line = _rowsRead + 1;
                if (checkOrder)
                {
                    string? orderProblem = order.Check(new CaptureRow(line, tick, count, null, null), "row");
                    if (orderProblem != null)
                    {
                        throw Error(_blockNumber, $"block {_blockNumber}, row {line}: {orderProblem}");
                    }
                }

                _rowsRead = line;
                _blockRow = i + 1;
                if (temperature == null && mark == null)
                {
                    batch.AddTick(tick, count, line);
                }
                else
                {
                    batch.Add(new CaptureRow(line, tick, count, temperature, mark));
                }
            }

            _blockPos = pos;
            _blockTick = tick;
            _blockTickStep = tickStep;
            _blockCount = count;
            _blockCountStep = countStep;
        }
    }

    /// <summary>
    /// The bare rows of the current block from <paramref name="pos"/> on whose tick varint is one byte (below 0x80),
    /// decoded as the general steps of <see cref="FillBatch"/> decode them (zigzag second difference, masked sums),
    /// into the batch's arrays, stopping at the first longer varint, the end of the block's rows or of its bytes, or a
    /// full batch. Returns the rows taken (0 when the first is not such a row).
    /// </summary>
    private int DecodeOneByteRows(CaptureRowBatch batch, ref int pos, ref ulong tick, ref ulong tickStep, ulong count)
    {
        int start = batch.Count;
        ulong rowsLeft = _blockRows - _blockRow;
        int room = batch.Capacity - start;
        int n = rowsLeft < (ulong)room ? (int)rowsLeft : room;
        n = Math.Min(n, _blockLength - pos);
        if (n <= 0)
        {
            return 0;
        }

        byte[] data = _buffer;
        ulong[] ticks = batch.Ticks;
        ulong[] counts = batch.Counts;
        long[] lines = batch.LineNumbers;
        ulong mask = _tickMask;
        ulong t = tick;
        ulong step = tickStep;
        long line = _rowsRead;
        int p = pos;
        int k = 0;
        while (k < n)
        {
            uint b = data[p + k];
            if (b >= 0x80)
            {
                break;
            }

            step = (step + (ulong)BinaryCaptureFormat.UnZigZag(b)) & mask;
            t = (t + step) & mask;
            ticks[start + k] = t;
            counts[start + k] = count;
            lines[start + k] = ++line;
            k++;
        }

        if (k > 0)
        {
            pos = p + k;
            tick = t;
            tickStep = step;
            batch.CommitBareRows(start + k);
        }

        return k;
    }

    private void ReadEnd(int length)
    {
        var data = new ReadOnlySpan<byte>(_buffer, 0, length);
        int pos = 0;
        if (!BinaryCaptureFormat.TryReadUVarint(data, ref pos, out ulong total) || !BinaryCaptureFormat.TryReadUVarint(data, ref pos, out ulong pairs))
        {
            throw Error(_blockNumber, $"the end block (block {_blockNumber}) is malformed: expected the row total and trailer count; all {_rowsRead} rows are readable");
        }

        if (total != (ulong)_rowsRead)
        {
            throw Error(_blockNumber, $"the end block (block {_blockNumber}) says {total} rows but the data blocks hold {_rowsRead}: a data block is missing; the {_rowsRead} rows read are readable");
        }

        var keys = new HashSet<string>(StringComparer.Ordinal);
        for (ulong i = 0; i < pairs; i++)
        {
            if (!BinaryCaptureFormat.TryReadString(data, ref pos, out string key) || !BinaryCaptureFormat.TryReadString(data, ref pos, out string value)
                || CaptureMetadataParser.CheckKeySyntax(key) != null || !keys.Add(key))
            {
                throw Error(_blockNumber, $"the end block (block {_blockNumber}) is malformed: expected trailer pair {i + 1} of {pairs} as a unique lowercase key and a value; all {_rowsRead} rows are readable");
            }

            _trailer.Add(new KeyValuePair<string, string>(key, value));
        }

        if (pos != length)
        {
            throw Error(_blockNumber, $"the end block (block {_blockNumber}) is malformed: {length - pos} bytes left after the trailer; all {_rowsRead} rows are readable");
        }

        if (_stream.ReadByte() >= 0)
        {
            throw Error(_blockNumber + 1, $"expected the end of the file after the end block (block {_blockNumber}), found more bytes; all {_rowsRead} rows are readable");
        }
    }

    private CaptureMetadata ReadHeader()
    {
        byte[] magic = BinaryCaptureFormat.Magic;
        Span<byte> head = stackalloc byte[magic.Length + 1];
        int n = ReadFully(head);
        if (n < magic.Length || !head.Slice(0, magic.Length).SequenceEqual(magic))
        {
            throw Error(0, "not a binary capture: expected the magic bytes 89 46 52 43 41 50 0D 0A at the start of the file");
        }

        if (n < head.Length)
        {
            throw Error(0, "the file ends after the magic: expected the format version and the header block");
        }

        if (head[magic.Length] != BinaryCaptureFormat.Version)
        {
            throw Error(0, $"unsupported binary capture version {head[magic.Length]}: expected version {BinaryCaptureFormat.Version}");
        }

        _blockNumber = 0;
        if (!TryReadBlock(out byte tag, out int length))
        {
            throw Error(0, "the file ends before the header block: expected the metadata after the version byte");
        }

        if (tag != BinaryCaptureFormat.HeaderTag)
        {
            throw Error(0, $"expected the header block ('H') after the version byte, found the tag 0x{tag:X2}");
        }

        var data = new ReadOnlySpan<byte>(_buffer, 0, length);
        int pos = 0;
        var parser = new CaptureMetadataParser(SourceName, _warnings);
        if (!BinaryCaptureFormat.TryReadUVarint(data, ref pos, out ulong lines))
        {
            throw HeaderMalformed("the count of header lines");
        }

        for (ulong i = 0; i < lines; i++)
        {
            if (pos >= length)
            {
                throw HeaderMalformed($"header line {i + 1} of {lines}");
            }

            byte type = data[pos++];
            if (type == BinaryCaptureFormat.KeyValueLine)
            {
                if (!BinaryCaptureFormat.TryReadString(data, ref pos, out string key) || !BinaryCaptureFormat.TryReadString(data, ref pos, out string value))
                {
                    throw HeaderMalformed($"header line {i + 1} of {lines} (key and value)");
                }

                parser.Add(key, value, 0);
            }
            else if (type == BinaryCaptureFormat.CommentLine)
            {
                if (!BinaryCaptureFormat.TryReadString(data, ref pos, out string comment) || comment.Contains('='))
                {
                    throw HeaderMalformed($"header line {i + 1} of {lines} (a comment)");
                }

                parser.AddComment(comment);
            }
            else
            {
                throw HeaderMalformed($"header line {i + 1} of {lines} (type 0x{type:X2}, expected 1 = key/value or 2 = comment)");
            }
        }

        if (!BinaryCaptureFormat.TryReadUVarint(data, ref pos, out ulong columnCount) || columnCount == 0 || columnCount > 4)
        {
            throw HeaderMalformed("the column count (1 to 4)");
        }

        var columns = new List<string>();
        for (ulong i = 0; i < columnCount; i++)
        {
            if (!BinaryCaptureFormat.TryReadString(data, ref pos, out string column))
            {
                throw HeaderMalformed($"column {i + 1}");
            }

            columns.Add(column);
        }

        if (pos != length)
        {
            throw HeaderMalformed($"the end of the header block ({length - pos} bytes left)");
        }

        parser.Finish(0);
        var md = parser.Metadata;
        int first = md.Kind == CaptureKind.Snapshots ? 2 : 1;
        string expected = md.Kind == CaptureKind.Snapshots ? "tick,count" : "tick";
        if (columns.Count < first || columns[0] != CaptureColumns.Tick || (first == 2 && columns[1] != CaptureColumns.Count))
        {
            throw Error(0, $"expected the columns to start with '{expected}' (kind = {(first == 2 ? "snapshots" : "edges")}), found {TextExcerpt.Quote(string.Join(",", columns))}");
        }

        for (int i = first; i < columns.Count; i++)
        {
            if (!CaptureColumns.Optional.Contains(columns[i]) || md.ExtraColumns.Contains(columns[i]))
            {
                throw Error(0, $"unknown or repeated column {TextExcerpt.Quote(columns[i])}; expected only temp_c and mark after '{expected}', each once");
            }

            md.ExtraColumns.Add(columns[i]);
        }

        return md;
    }

    /// <summary>Reads one block into <see cref="_buffer"/> and checks its CRC. False at a clean end of file (no byte of a new block).</summary>
    private bool TryReadBlock(out byte tag, out int length)
    {
        length = 0;
        int first = _stream.ReadByte();
        if (first < 0)
        {
            tag = 0;
            return false;
        }

        tag = (byte)first;
        Span<byte> head = stackalloc byte[11];
        head[0] = tag;
        int headLength = 1;
        ulong payload = 0;
        for (int shift = 0; ; shift += 7)
        {
            int b = _stream.ReadByte();
            if (b < 0)
            {
                throw Error(_blockNumber, $"{BlockName()} is truncated: the file ends inside its length; {ReadableBefore()}");
            }

            if (headLength >= head.Length)
            {
                throw Error(_blockNumber, $"{BlockName()} is corrupt: its length is not a valid varint; {ReadableBefore()}");
            }

            head[headLength++] = (byte)b;
            payload |= (ulong)(b & 0x7F) << shift;
            if ((b & 0x80) == 0)
            {
                break;
            }
        }

        if (payload > BinaryCaptureFormat.MaxPayloadBytes)
        {
            throw Error(_blockNumber, $"{BlockName()} is corrupt: it claims {payload} bytes (more than {BinaryCaptureFormat.MaxPayloadBytes}); {ReadableBefore()}");
        }

        length = (int)payload;
        if (_buffer.Length < length + 4)
        {
            _buffer = new byte[Math.Max(length + 4, _buffer.Length * 2)];
        }

        int got = ReadFully(_buffer.AsSpan(0, length + 4));
        if (got < length + 4)
        {
            throw Error(_blockNumber, $"{BlockName()} is truncated: the file ends after {got} of its {length + 4} payload and CRC bytes; {ReadableBefore()}");
        }

        var crc = new Crc32();
        crc.Append(head.Slice(0, headLength));
        crc.Append(_buffer.AsSpan(0, length));
        uint computed = crc.GetCurrentHashAsUInt32();
        uint stored = BinaryPrimitives.ReadUInt32LittleEndian(_buffer.AsSpan(length, 4));
        if (computed != stored)
        {
            throw Error(_blockNumber, $"{BlockName()} is corrupt: its CRC-32 is 0x{stored:X8} but its bytes give 0x{computed:X8}; {ReadableBefore()}");
        }

        return true;
    }

    private string BlockName() => _blockNumber == 0 ? "the header block (block 0)" : $"block {_blockNumber}";

    private string ReadableBefore() => _blockNumber switch
    {
        0 => "no rows are readable",
        1 => "no rows come before it",
        2 => $"the {_rowsRead} rows in block 1 before it are readable",
        _ => $"the {_rowsRead} rows in blocks 1 to {_blockNumber - 1} before it are readable",
    };

    private int ReadFully(Span<byte> buffer)
    {
        int n = 0;
        while (n < buffer.Length)
        {
            int got = _stream.Read(buffer.Slice(n));
            if (got == 0)
            {
                break;
            }

            n += got;
        }

        return n;
    }

    private CaptureFormatException Malformed(string what) =>
        Error(_blockNumber, $"block {_blockNumber} is malformed though its CRC-32 matches (a writer fault): could not decode {what}; {ReadableBefore()}");

    private CaptureFormatException HeaderMalformed(string what) =>
        Error(0, $"the header block (block 0) is malformed though its CRC-32 matches: could not decode {what}");

    private CaptureFormatException Error(long block, string problem) => new(SourceName, block, problem);
}
