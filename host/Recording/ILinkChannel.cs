namespace FreqReadout.Host.Recording;

/// <summary>The byte stream to and from the device (a serial port; a fake in tests).</summary>
public interface ILinkChannel : IDisposable
{
    /// <summary>Reads the bytes that arrived, waiting at most the channel's read timeout; false when none came in that time.</summary>
    /// <exception cref="IOException">The channel failed (a pulled cable, a closed port).</exception>
    bool TryRead(byte[] buffer, int offset, int count, out int read);

    /// <summary>Writes bytes to the device.</summary>
    /// <exception cref="IOException">The channel failed.</exception>
    void Write(byte[] buffer, int offset, int count);
}
