namespace FreqReadout.Host.Output;

/// <summary>
/// A forward-only, write-only stream over another: everything a wrapper that only passes writes on
/// does not support (reading, seeking, length) in one place. <see cref="Stream.Position"/> is the
/// bytes written so far, which the derived stream counts in <see cref="BytesWritten"/>.
/// </summary>
internal abstract class WriteOnlyStream : Stream
{
    /// <summary>Bytes written through this stream.</summary>
    public abstract long BytesWritten { get; }

    public override bool CanRead => false;

    public override bool CanSeek => false;

    public override bool CanWrite => true;

    public override long Length => throw new NotSupportedException();

    public override long Position
    {
        get => BytesWritten;
        set => throw new NotSupportedException();
    }

    public override void Write(byte[] buffer, int offset, int count) => Write(buffer.AsSpan(offset, count));

    public abstract override void Write(ReadOnlySpan<byte> buffer);

    public override int Read(byte[] buffer, int offset, int count) => throw new NotSupportedException();

    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();

    public override void SetLength(long value) => throw new NotSupportedException();
}
