namespace FreqReadout.Host.Output;

/// <summary>
/// The stream a command writes an <see cref="OutputFile"/> through: passes writes on, turns a write
/// failure of the file system into an <see cref="OutputFileException"/> that names the user's path
/// (not the temporary file's), and never closes the file itself — disposing it only flushes, and
/// the <see cref="OutputFileSet"/> decides whether the file is moved into place or deleted.
/// </summary>
internal sealed class GuardedOutputStream : WriteOnlyStream
{
    private readonly OutputFile _file;
    private readonly Stream _inner;
    private long _written;

    public GuardedOutputStream(OutputFile file, Stream inner)
    {
        _file = file;
        _inner = inner;
    }

    /// <inheritdoc/>
    public override long BytesWritten => _written;

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
