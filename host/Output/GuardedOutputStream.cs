namespace FreqReadout.Host.Output;

/// <summary>
/// The stream a command writes an <see cref="OutputFile"/> through: passes writes on, turns a write
/// failure of the file system into an <see cref="OutputFileException"/> that names the user's path
/// (not the temporary file's), and never closes the file itself — disposing it only flushes, and
/// the <see cref="OutputFileSet"/> decides whether the file is moved into place or deleted.
/// </summary>
internal sealed class GuardedOutputStream : Stream
{
    private readonly OutputFile _file;
    private readonly Stream _inner;
    private long _written;

    public GuardedOutputStream(OutputFile file, Stream inner)
    {
        _file = file;
        _inner = inner;
    }

    /// <summary>Bytes written through this stream.</summary>
    public long BytesWritten => _written;

    public override bool CanRead => false;

    public override bool CanSeek => false;

    public override bool CanWrite => true;

    public override long Length => throw new NotSupportedException();

    public override long Position
    {
        get => _written;
        set => throw new NotSupportedException();
    }

    public override void Write(byte[] buffer, int offset, int count) => Write(buffer.AsSpan(offset, count));

    public override void Write(ReadOnlySpan<byte> buffer)
    {
        try
        {
            _inner.Write(buffer);
            _written += buffer.Length;
        }
        catch (Exception e) when (e is IOException and not OutputFileException || e is UnauthorizedAccessException)
        {
            throw _file.WriteFailure(e);
        }
    }

    public override void WriteByte(byte value)
    {
        Span<byte> one = stackalloc byte[1];
        one[0] = value;
        Write(one);
    }

    public override void Flush()
    {
        try
        {
            _inner.Flush();
        }
        catch (Exception e) when (e is IOException and not OutputFileException || e is UnauthorizedAccessException)
        {
            throw _file.WriteFailure(e);
        }
    }

    public override int Read(byte[] buffer, int offset, int count) => throw new NotSupportedException();

    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();

    public override void SetLength(long value) => throw new NotSupportedException();

    protected override void Dispose(bool disposing)
    {
        // Writers dispose the stream they own; the file stays open until the set commits or aborts it.
        if (disposing)
        {
            Flush();
        }

        base.Dispose(disposing);
    }
}
