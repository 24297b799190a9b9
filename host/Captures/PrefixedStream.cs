namespace FreqReadout.Host.Captures;

/// <summary>A read-only stream that gives back some already-read bytes, then the rest of an inner stream (format sniffing without seeking).</summary>
internal sealed class PrefixedStream : Stream
{
    private readonly byte[] _prefix;
    private readonly int _prefixLength;
    private readonly Stream _inner;
    private int _prefixPos;
    private long _position;

    public PrefixedStream(byte[] prefix, int prefixLength, Stream inner)
    {
        _prefix = prefix;
        _prefixLength = prefixLength;
        _inner = inner;
    }

    public override bool CanRead => true;

    public override bool CanSeek => false;

    public override bool CanWrite => false;

    public override long Length => throw new NotSupportedException();

    public override long Position
    {
        get => _position;
        set => throw new NotSupportedException();
    }

    public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));

    public override int Read(Span<byte> buffer)
    {
        if (buffer.IsEmpty)
        {
            return 0;
        }

        int n;
        if (_prefixPos < _prefixLength)
        {
            n = Math.Min(buffer.Length, _prefixLength - _prefixPos);
            _prefix.AsSpan(_prefixPos, n).CopyTo(buffer);
            _prefixPos += n;
        }
        else
        {
            n = _inner.Read(buffer);
        }

        _position += n;
        return n;
    }

    public override void Flush()
    {
    }

    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();

    public override void SetLength(long value) => throw new NotSupportedException();

    public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();

    protected override void Dispose(bool disposing)
    {
        if (disposing)
        {
            _inner.Dispose();
        }

        base.Dispose(disposing);
    }
}
