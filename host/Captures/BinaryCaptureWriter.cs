using System.Buffers.Binary;
using System.IO.Hashing;

namespace FreqReadout.Host.Captures;

/// <summary>
/// Streaming writer of the binary capture format (hardware-notes/binary-capture-format.md): magic,
/// version, a header block with the same metadata lines and columns as the text format, data blocks
/// of up to <see cref="BinaryCaptureFormat.RowsPerBlock"/> rows (ticks and counts as zigzag varints of
/// the change of their modular step), each block closed by a CRC-32, and an end block with the row
/// total and the trailer. Dispose without <see cref="Complete"/> writes the pending rows but no end
/// block, so a reader reports the file as truncated and still returns every row.
/// </summary>
public sealed class BinaryCaptureWriter : ICaptureWriter
{
    private readonly Stream _stream;
    private readonly bool _leaveOpen;
    private readonly CaptureMetadata _metadata;
    private readonly CaptureRowOrder _order;
    private readonly MemoryStream _block = new();
    private readonly ulong _tickMask;
    private readonly ulong _countMask;
    private readonly bool _snapshots;
    private readonly bool _hasFlags;
    private readonly bool _hasTemperature;
    private readonly bool _hasMark;
    private int _blockRows;
    private ulong _prevTick;
    private ulong _prevTickStep;
    private ulong _prevCount;
    private ulong _prevCountStep;
    private long _totalRows;
    private bool _completed;
    private bool _disposed;

    /// <summary>Writes a binary capture to a stream; the magic, version and header block are written at once.</summary>
    /// <exception cref="ArgumentException">The metadata is not writable (names the property and its allowed range).</exception>
    public BinaryCaptureWriter(Stream stream, CaptureMetadata metadata, bool leaveOpen = false)
    {
        CaptureMetadataFormatter.Validate(metadata);
        _stream = stream;
        _leaveOpen = leaveOpen;
        _metadata = metadata;
        _order = new CaptureRowOrder(metadata);
        _snapshots = metadata.Kind == CaptureKind.Snapshots;
        _hasTemperature = metadata.HasTemperatureColumn;
        _hasMark = metadata.HasMarkColumn;
        _hasFlags = metadata.ExtraColumns.Count > 0;
        _tickMask = metadata.TimerBits >= 64 ? ulong.MaxValue : (1UL << metadata.TimerBits) - 1;
        _countMask = metadata.CountBits >= 64 ? ulong.MaxValue : (1UL << metadata.CountBits) - 1;

        byte[] magic = BinaryCaptureFormat.Magic;
        _stream.Write(magic, 0, magic.Length);
        _stream.WriteByte(BinaryCaptureFormat.Version);

        var header = new MemoryStream();
        var entries = CaptureMetadataFormatter.Entries(metadata);
        BinaryCaptureFormat.WriteUVarint(header, (ulong)entries.Count);
        foreach (var entry in entries)
        {
            if (entry.Key is null)
            {
                header.WriteByte(BinaryCaptureFormat.CommentLine);
                BinaryCaptureFormat.WriteString(header, entry.Text);
            }
            else
            {
                header.WriteByte(BinaryCaptureFormat.KeyValueLine);
                BinaryCaptureFormat.WriteString(header, entry.Key);
                BinaryCaptureFormat.WriteString(header, entry.Text);
            }
        }

        var columns = new List<string> { CaptureColumns.Tick };
        if (_snapshots)
        {
            columns.Add(CaptureColumns.Count);
        }

        columns.AddRange(metadata.ExtraColumns);
        BinaryCaptureFormat.WriteUVarint(header, (ulong)columns.Count);
        foreach (string column in columns)
        {
            BinaryCaptureFormat.WriteString(header, column);
        }

        WriteBlock(BinaryCaptureFormat.HeaderTag, ReadOnlySpan<byte>.Empty, header.GetBuffer().AsSpan(0, (int)header.Length));
    }

    /// <summary>Creates a binary capture file (overwriting).</summary>
    public static BinaryCaptureWriter Create(string path, CaptureMetadata metadata)
    {
        var stream = new FileStream(path, FileMode.Create, FileAccess.Write, FileShare.None, 65536);
        try
        {
            return new BinaryCaptureWriter(stream, metadata);
        }
        catch
        {
            stream.Dispose();
            throw;
        }
    }

    /// <summary>Rows written so far.</summary>
    public long RowsWritten => _totalRows;

    /// <inheritdoc/>
    /// <exception cref="ArgumentException">A value the capture cannot hold (see <see cref="TextCaptureWriter.WriteRow"/>).</exception>
    public void WriteRow(in CaptureRow row)
    {
        if (_completed)
        {
            throw new InvalidOperationException("the capture is complete; no rows may follow the trailer");
        }

        TextCaptureWriter.CheckRow(row, _metadata, _tickMask, _countMask);
        string? orderProblem = _order.Check(row, "row");
        if (orderProblem != null)
        {
            throw new ArgumentException(orderProblem, nameof(row));
        }

        // Tick: the step from the previous row modulo 2^timer_bits, stored as the zigzag change of
        // that step (steady edges give 0, one byte). The first row of a block starts from 0.
        ulong step = (row.Tick - _prevTick) & _tickMask;
        BinaryCaptureFormat.WriteUVarint(_block, BinaryCaptureFormat.ZigZag((long)(step - _prevTickStep)));
        _prevTick = row.Tick;
        _prevTickStep = step;
        if (_snapshots)
        {
            ulong countStep = (row.Count - _prevCount) & _countMask;
            BinaryCaptureFormat.WriteUVarint(_block, BinaryCaptureFormat.ZigZag((long)(countStep - _prevCountStep)));
            _prevCount = row.Count;
            _prevCountStep = countStep;
        }

        if (_hasFlags)
        {
            byte flags = 0;
            if (_hasTemperature && row.TemperatureC.HasValue)
            {
                flags |= BinaryCaptureFormat.TemperatureFlag;
            }

            if (_hasMark && row.Mark != null)
            {
                flags |= BinaryCaptureFormat.MarkFlag;
            }

            _block.WriteByte(flags);
            if (row.TemperatureC is double t)
            {
                Span<byte> bytes = stackalloc byte[8];
                BinaryPrimitives.WriteDoubleLittleEndian(bytes, t);
                _block.Write(bytes);
            }

            if (row.Mark != null)
            {
                BinaryCaptureFormat.WriteString(_block, row.Mark);
            }
        }

        _blockRows++;
        _totalRows++;
        if (_blockRows >= BinaryCaptureFormat.RowsPerBlock || _block.Length >= 1024 * 1024)
        {
            FlushBlock();
        }
    }

    /// <inheritdoc/>
    public void Complete(IReadOnlyList<KeyValuePair<string, string>> trailer)
    {
        if (_completed)
        {
            throw new InvalidOperationException("Complete was already called");
        }

        CaptureMetadataFormatter.ValidateTrailer(trailer);
        FlushBlock();
        var end = new MemoryStream();
        BinaryCaptureFormat.WriteUVarint(end, (ulong)_totalRows);
        BinaryCaptureFormat.WriteUVarint(end, (ulong)trailer.Count);
        foreach (var pair in trailer)
        {
            BinaryCaptureFormat.WriteString(end, pair.Key);
            BinaryCaptureFormat.WriteString(end, pair.Value);
        }

        WriteBlock(BinaryCaptureFormat.EndTag, ReadOnlySpan<byte>.Empty, end.GetBuffer().AsSpan(0, (int)end.Length));
        _completed = true;
        _stream.Flush();
    }

    /// <inheritdoc/>
    public void Dispose()
    {
        if (_disposed)
        {
            return;
        }

        _disposed = true;
        if (!_completed)
        {
            FlushBlock();
        }

        _stream.Flush();
        if (!_leaveOpen)
        {
            _stream.Dispose();
        }
    }

    private void FlushBlock()
    {
        if (_blockRows == 0)
        {
            return;
        }

        Span<byte> count = stackalloc byte[10];
        int n = BinaryCaptureFormat.WriteUVarint(count, (ulong)_blockRows);
        WriteBlock(BinaryCaptureFormat.DataTag, count.Slice(0, n), _block.GetBuffer().AsSpan(0, (int)_block.Length));
        _block.SetLength(0);
        _blockRows = 0;
        _prevTick = 0;
        _prevTickStep = 0;
        _prevCount = 0;
        _prevCountStep = 0;
    }

    /// <summary>Writes tag, uvarint payload length, payload (= prefix + body) and CRC-32 (little-endian) over all of them.</summary>
    private void WriteBlock(byte tag, ReadOnlySpan<byte> prefix, ReadOnlySpan<byte> body)
    {
        Span<byte> head = stackalloc byte[11];
        head[0] = tag;
        int n = 1 + BinaryCaptureFormat.WriteUVarint(head.Slice(1), (ulong)(prefix.Length + body.Length));
        var crc = new Crc32();
        crc.Append(head.Slice(0, n));
        crc.Append(prefix);
        crc.Append(body);
        Span<byte> crcBytes = stackalloc byte[4];
        BinaryPrimitives.WriteUInt32LittleEndian(crcBytes, crc.GetCurrentHashAsUInt32());
        _stream.Write(head.Slice(0, n));
        _stream.Write(prefix);
        _stream.Write(body);
        _stream.Write(crcBytes);
    }
}
