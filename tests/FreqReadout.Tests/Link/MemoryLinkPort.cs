using FreqReadout.Firmware.Ports;

namespace FreqReadout.Tests.Link;

/// <summary>Test fake of the device's serial port: keeps every byte written; bytes put in <see cref="ToDevice"/> are read back by the device.</summary>
internal sealed class MemoryLinkPort : ILinkPort
{
    private readonly object _gate = new();
    private readonly MemoryStream _written = new();
    private readonly Queue<byte> _toDevice = new();

    /// <summary>When false, every write fails (a port that broke).</summary>
    public bool Working { get; set; } = true;

    public byte[] Written()
    {
        lock (_gate)
        {
            return _written.ToArray();
        }
    }

    public void ToDevice(byte[] bytes)
    {
        lock (_gate)
        {
            foreach (byte b in bytes)
            {
                _toDevice.Enqueue(b);
            }
        }
    }

    public bool TryWrite(byte[] buffer, int offset, int count)
    {
        lock (_gate)
        {
            if (!Working)
            {
                return false;
            }

            _written.Write(buffer, offset, count);
            return true;
        }
    }

    public bool TryRead(byte[] buffer, int offset, int count, out int read)
    {
        lock (_gate)
        {
            read = 0;
            while (read < count && _toDevice.Count > 0)
            {
                buffer[offset + read++] = _toDevice.Dequeue();
            }

            return read > 0;
        }
    }
}
