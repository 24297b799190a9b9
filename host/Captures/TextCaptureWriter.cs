using System.Buffers.Text;
using System.Globalization;
using System.Runtime.CompilerServices;
using System.Text;

namespace FreqReadout.Host.Captures;

/// <summary>
/// Streaming writer of the capture text format (docs/capture-text-format.md): UTF-8 without BOM, LF line ends, the
/// magic line, the header lines (in the metadata's own order, see <see cref="CaptureMetadata.HeaderLines"/>),
/// the column header, one line per row, and the trailer on <see cref="Complete"/>. Numbers are
/// written in the shortest invariant form that reads back to the same value, so a capture read by
/// <see cref="TextCaptureReader"/> and written again is byte-identical (blank lines and spacing
/// around '=' aside). Edge rows may also come in batches (<see cref="WriteEdges"/>): on a writer made for a stream they are
/// formatted straight into a byte buffer, with the same text and checks as row by row.
/// </summary>
public sealed class TextCaptureWriter : ICaptureWriter, IEdgeBatchWriter
{
    /// <summary>Most bytes one batched row can take: a 20-digit tick, and per optional column a comma and a temperature (at most 24 characters in the "R" form).</summary>
    private const int MaxBatchRowBytes = 20 + 1 + (2 * 25);

    private readonly TextWriter _writer;
    private readonly Stream? _stream;
    private readonly bool[] _columnIsTemperature;
    private byte[]? _bytes;
    private bool _charsPending;
    private readonly bool _leaveOpen;
    private readonly CaptureMetadata _metadata;
    private readonly bool _hasTemperature;
    private readonly bool _hasMark;
    private readonly bool _snapshots;
    private readonly ulong _tickMax;
    private readonly ulong _countMax;
    private readonly CaptureRowOrder _order;
    private bool _completed;

    /// <summary>Writes a text capture to a stream (UTF-8, no BOM). The header is written at once.</summary>
    /// <exception cref="ArgumentException">The metadata is not writable (names the property and its allowed range).</exception>
    public TextCaptureWriter(Stream stream, CaptureMetadata metadata, bool leaveOpen = false)
        : this(new StreamWriter(stream, new UTF8Encoding(false), 65536, leaveOpen), metadata, leaveOpen: false)
    {
        _stream = stream;
    }

    /// <summary>Writes a text capture to a text writer. The header is written at once.</summary>
    /// <exception cref="ArgumentException">The metadata is not writable (names the property and its allowed range).</exception>
    public TextCaptureWriter(TextWriter writer, CaptureMetadata metadata, bool leaveOpen = false)
    {
        CaptureMetadataFormatter.Validate(metadata);
        _writer = writer;
        _leaveOpen = leaveOpen;
        _metadata = metadata;
        _snapshots = metadata.Kind == CaptureKind.Snapshots;
        _hasTemperature = metadata.HasTemperatureColumn;
        _hasMark = metadata.HasMarkColumn;
        _tickMax = metadata.TimerBits >= 64 ? ulong.MaxValue : (1UL << metadata.TimerBits) - 1;
        _countMax = metadata.CountBits >= 64 ? ulong.MaxValue : (1UL << metadata.CountBits) - 1;
        _order = new CaptureRowOrder(metadata);
        _columnIsTemperature = new bool[metadata.ExtraColumns.Count];
        for (int i = 0; i < _columnIsTemperature.Length; i++)
        {
            _columnIsTemperature[i] = metadata.ExtraColumns[i] == CaptureColumns.TemperatureC;
        }

        _charsPending = true;
        _writer.NewLine = "\n";
        _writer.Write(TextCaptureReader.MagicLine);
        _writer.Write('\n');
        foreach (var entry in CaptureMetadataFormatter.Entries(metadata))
        {
            if (entry.Key is null)
            {
                _writer.Write('#');
                _writer.Write(entry.Text);
            }
            else
            {
                _writer.Write("# ");
                _writer.Write(entry.Key);
                _writer.Write(" = ");
                _writer.Write(entry.Text);
            }

            _writer.Write('\n');
        }

        _writer.Write(CaptureColumns.Tick);
        if (_snapshots)
        {
            _writer.Write(',');
            _writer.Write(CaptureColumns.Count);
        }

        foreach (string column in metadata.ExtraColumns)
        {
            _writer.Write(',');
            _writer.Write(column);
        }

        _writer.Write('\n');
    }

    /// <summary>Creates a text capture file (overwriting).</summary>
    public static TextCaptureWriter Create(string path, CaptureMetadata metadata)
    {
        var stream = new FileStream(path, FileMode.Create, FileAccess.Write, FileShare.None, 65536);
        try
        {
            return new TextCaptureWriter(stream, metadata);
        }
        catch
        {
            stream.Dispose();
            throw;
        }
    }

    /// <inheritdoc/>
    /// <exception cref="ArgumentException">A value the format cannot hold (tick above the timer width, a temperature or mark without its column, a mark with a comma or line break).</exception>
    public void WriteRow(in CaptureRow row)
    {
        if (_completed)
        {
            throw new InvalidOperationException("the capture is complete; no rows may follow the trailer");
        }

        CheckRow(row, _metadata, _tickMax, _countMax);
        string? orderProblem = _order.Check(row, "row");
        if (orderProblem != null)
        {
            throw new ArgumentException(orderProblem, nameof(row));
        }

        _charsPending = true;
        Span<char> buffer = stackalloc char[24];
        row.Tick.TryFormat(buffer, out int n, default, CultureInfo.InvariantCulture);
        _writer.Write(buffer.Slice(0, n));
        if (_snapshots)
        {
            _writer.Write(',');
            row.Count.TryFormat(buffer, out n, default, CultureInfo.InvariantCulture);
            _writer.Write(buffer.Slice(0, n));
        }

        foreach (string column in _metadata.ExtraColumns)
        {
            _writer.Write(',');
            if (column == CaptureColumns.TemperatureC)
            {
                if (row.TemperatureC is double t)
                {
                    _writer.Write(CaptureMetadataFormatter.FormatDouble(t));
                }
            }
            else if (row.Mark != null)
            {
                _writer.Write(row.Mark);
            }
        }

        _writer.Write('\n');
    }

    /// <inheritdoc/>
    /// <exception cref="ArgumentException">A value the format cannot hold (as <see cref="WriteRow"/>), or the spans differ in length.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void WriteEdges(ReadOnlySpan<ulong> ticks, ReadOnlySpan<double> temperaturesC, long firstRowNumber)
    {
        if (_completed)
        {
            throw new InvalidOperationException("the capture is complete; no rows may follow the trailer");
        }

        if (ticks.Length != temperaturesC.Length)
        {
            throw new ArgumentException($"{ticks.Length} ticks but {temperaturesC.Length} temperature entries: one entry per row (NaN for none)", nameof(temperaturesC));
        }

        if (_stream is null || _snapshots)
        {
            for (int i = 0; i < ticks.Length; i++)
            {
                double t = temperaturesC[i];
                WriteRow(new CaptureRow(firstRowNumber + i, ticks[i], 0, double.IsNaN(t) ? null : t, null));
            }

            return;
        }

        if (_charsPending)
        {
            _writer.Flush();
            _charsPending = false;
        }

        byte[] bytes = _bytes ??= new byte[65536];
        int used = 0;
        try
        {
            for (int i = 0; i < ticks.Length; i++)
            {
                if (used > bytes.Length - MaxBatchRowBytes)
                {
                    _stream.Write(bytes, 0, used);
                    used = 0;
                }

                ulong tick = ticks[i];
                double temperatureC = temperaturesC[i];
                var row = new CaptureRow(firstRowNumber + i, tick, 0, double.IsNaN(temperatureC) ? null : temperatureC, null);
                CheckRow(row, _metadata, _tickMax, _countMax);
                string? orderProblem = _order.Check(row, "row");
                if (orderProblem != null)
                {
                    throw new ArgumentException(orderProblem, nameof(ticks));
                }

                Utf8Formatter.TryFormat(tick, bytes.AsSpan(used), out int n);
                used += n;
                for (int c = 0; c < _columnIsTemperature.Length; c++)
                {
                    bytes[used++] = (byte)',';
                    if (_columnIsTemperature[c] && !double.IsNaN(temperatureC))
                    {
                        used += Encoding.ASCII.GetBytes(CaptureMetadataFormatter.FormatDouble(temperatureC), bytes.AsSpan(used));
                    }
                }

                bytes[used++] = (byte)'\n';
            }
        }
        catch (ArgumentException)
        {
            // The rows before the bad one are written, as row by row.
            _stream.Write(bytes, 0, used);
            throw;
        }

        _stream.Write(bytes, 0, used);
    }

    /// <summary>Hands every row written so far to the stream and flushes it, so a recording loses nothing already received (to the operating system; the caller forces the disk now and then).</summary>
    public void Flush()
    {
        _writer.Flush();
        _charsPending = false;
    }

    /// <inheritdoc/>
    public void Complete(IReadOnlyList<KeyValuePair<string, string>> trailer)
    {
        if (_completed)
        {
            throw new InvalidOperationException("Complete was already called");
        }

        CaptureMetadataFormatter.ValidateTrailer(trailer);
        foreach (var pair in trailer)
        {
            _writer.Write("# ");
            _writer.Write(pair.Key);
            _writer.Write(" = ");
            _writer.Write(pair.Value);
            _writer.Write('\n');
        }

        _completed = true;
        _writer.Flush();
    }

    /// <inheritdoc/>
    public void Dispose()
    {
        if (_leaveOpen)
        {
            _writer.Flush();
        }
        else
        {
            _writer.Dispose();
        }
    }

    /// <summary>Checks a row against what the capture can hold; shared with the binary writer.</summary>
    internal static void CheckRow(in CaptureRow row, CaptureMetadata md, ulong tickMax, ulong countMax)
    {
        if (row.Tick > tickMax)
        {
            throw new ArgumentException($"tick {row.Tick} exceeds timer_bits = {md.TimerBits} (allowed 0 to {tickMax})", nameof(row));
        }

        if (md.Kind == CaptureKind.Snapshots ? row.Count > countMax : row.Count != 0)
        {
            throw new ArgumentException(md.Kind == CaptureKind.Snapshots
                ? $"count {row.Count} exceeds count_bits = {md.CountBits} (allowed 0 to {countMax})"
                : "count must be 0 for kind = edges", nameof(row));
        }

        if (row.TemperatureC is double t)
        {
            if (!md.HasTemperatureColumn)
            {
                throw new ArgumentException("the row has a temperature but the capture has no temp_c column (add it to ExtraColumns)", nameof(row));
            }

            if (CaptureColumns.TemperatureProblem(t) is string range)
            {
                throw new ArgumentException(range, nameof(row));
            }
        }

        if (row.Mark != null)
        {
            if (!md.HasMarkColumn)
            {
                throw new ArgumentException("the row has a mark but the capture has no mark column (add it to ExtraColumns)", nameof(row));
            }

            if (row.Mark.Length == 0 || row.Mark.Contains(',') || row.Mark.Contains('\n') || row.Mark.Contains('\r') || row.Mark.Trim().Length != row.Mark.Length)
            {
                throw new ArgumentException($"a mark is non-empty text without commas, line breaks or surrounding spaces, was {TextExcerpt.Quote(row.Mark)}", nameof(row));
            }
        }
    }
}
