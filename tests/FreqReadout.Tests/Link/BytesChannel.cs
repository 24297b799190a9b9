using FreqReadout.Host.Recording;

namespace FreqReadout.Tests.Link;

/// <summary>Test fake of the PC's link channel: serves recorded bytes in chunks of a given size, then cancels the session (as Ctrl+C would) or fails (as a pulled cable would).</summary>
internal sealed class BytesChannel : ILinkChannel
{
    private readonly byte[] _bytes;
    private readonly int _chunk;
    private readonly CancellationTokenSource? _stopAtEnd;
    private int _position;

    public BytesChannel(byte[] bytes, int chunk, CancellationTokenSource? stopAtEnd)
    {
        _bytes = bytes;
        _chunk = chunk;
        _stopAtEnd = stopAtEnd;
    }

    public MemoryStream Sent { get; } = new();

    public bool TryRead(byte[] buffer, int offset, int count, out int read)
    {
        read = Math.Min(Math.Min(count, _chunk), _bytes.Length - _position);
        if (read == 0)
        {
            if (_stopAtEnd == null)
            {
                throw new IOException("the cable was pulled");
            }

            _stopAtEnd.Cancel();
            return false;
        }

        Array.Copy(_bytes, _position, buffer, offset, read);
        _position += read;
        return true;
    }

    public void Write(byte[] buffer, int offset, int count) => Sent.Write(buffer, offset, count);

    public void Dispose()
    {
    }
}
