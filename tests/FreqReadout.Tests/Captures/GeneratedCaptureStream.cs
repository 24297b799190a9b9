using System.Text;

namespace FreqReadout.Tests.Captures;

/// <summary>
/// A read-only stream that produces a text capture on the fly: the header, then <c>rows</c> edge rows
/// (tick = 1000 + 250 i, a temperature every 1000th row), never holding more than one row's bytes.
/// <see cref="BytesProduced"/> tells how far a reader has pulled.
/// </summary>
internal sealed class GeneratedCaptureStream : Stream
{
    private readonly long _rows;
    private byte[] _pending;
    private int _pendingPos;
    private long _nextRow;

    public GeneratedCaptureStream(long rows)
    {
        _rows = rows;
        _pending = Encoding.UTF8.GetBytes("# freqreadout capture 1\n# clock_hz = 80000000\n# note = generated lazily\ntick,temp_c\n");
        HeaderBytes = _pending.Length;
    }

    public int HeaderBytes { get; }

    /// <summary>Longest row in bytes ("18446744073709551615,-12.5\n" would be 28; ours stay below 24).</summary>
    public const int MaxRowBytes = 24;

    public long BytesProduced { get; private set; }

    public static ulong TickOf(long row) => 1000UL + 250UL * (ulong)row;

    public override bool CanRead => true;

    public override bool CanSeek => false;

    public override bool CanWrite => false;

    public override long Length => throw new NotSupportedException();

    public override long Position
    {
        get => BytesProduced;
        set => throw new NotSupportedException();
    }

    public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));

    public override int Read(Span<byte> buffer)
    {
        int written = 0;
        while (written < buffer.Length)
        {
            if (_pendingPos == _pending.Length)
            {
                if (_nextRow == _rows)
                {
                    break;
                }

                string temp = _nextRow % 1000 == 0 ? "-12.5" : string.Empty;
                _pending = Encoding.ASCII.GetBytes($"{TickOf(_nextRow)},{temp}\n");
                _pendingPos = 0;
                _nextRow++;
            }

            int n = Math.Min(buffer.Length - written, _pending.Length - _pendingPos);
            _pending.AsSpan(_pendingPos, n).CopyTo(buffer.Slice(written));
            _pendingPos += n;
            written += n;
        }

        BytesProduced += written;
        return written;
    }

    public override void Flush()
    {
    }

    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();

    public override void SetLength(long value) => throw new NotSupportedException();

    public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();
}
