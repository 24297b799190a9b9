using System.IO.Ports;

namespace FreqReadout.Host.Recording;

/// <summary>
/// A serial port as the link's channel (System.IO.Ports): 8 data bits, no parity, 1 stop bit, no handshake, reads that
/// wait at most 100 ms. Opening a missing, busy or forbidden port throws <see cref="LinkChannelException"/> with a
/// one-line message that names the port.
/// </summary>
public sealed class SerialLinkChannel : ILinkChannel
{
    private readonly SerialPort _port;
    private bool _broken;

    /// <summary>Opens <paramref name="portName"/> at <paramref name="baud"/>.</summary>
    /// <exception cref="LinkChannelException">The port does not exist, is in use, or may not be opened.</exception>
    public SerialLinkChannel(string portName, int baud)
    {
        _port = new SerialPort(portName, baud, Parity.None, 8, StopBits.One)
        {
            Handshake = Handshake.None,
            ReadTimeout = 100,
            WriteTimeout = 2000,
            ReadBufferSize = 1 << 20,
        };
        if (portName.StartsWith('/') && !File.Exists(portName))
        {
            _port.Dispose();
            throw new LinkChannelException($"serial port {portName}: no such device; `freqreadout record --list` lists the ports");
        }

        try
        {
            _port.Open();
        }
        catch (UnauthorizedAccessException e)
        {
            _port.Dispose();
            // System.IO.Ports reports most failures to open as access denied; the cause is in the inner exception.
            string why = (e.InnerException ?? e).Message.TrimEnd('.');
            throw new LinkChannelException($"serial port {portName}: cannot open it ({why}): in use by another program, not a serial port, or this user may not open it (on Linux, usually the dialout group's right)", e);
        }
        catch (Exception e) when (e is IOException or ArgumentException or InvalidOperationException)
        {
            _port.Dispose();
            throw new LinkChannelException($"serial port {portName}: cannot open it ({e.Message.TrimEnd('.')}); `freqreadout record --list` lists the ports", e);
        }
    }

    /// <summary>The names of the serial ports this machine has (System.IO.Ports' list, sorted).</summary>
    public static IReadOnlyList<string> PortNames()
    {
        string[] names = SerialPort.GetPortNames();
        Array.Sort(names, StringComparer.Ordinal);
        return names;
    }

    /// <inheritdoc/>
    public bool TryRead(byte[] buffer, int offset, int count, out int read)
    {
        try
        {
            read = _port.Read(buffer, offset, count);
            return read > 0;
        }
        catch (TimeoutException)
        {
            read = 0;
            return false;
        }
        catch (InvalidOperationException e)
        {
            // A device that went away (a pulled USB cable, a hung-up line): System.IO.Ports throws ObjectDisposedException here.
            _broken = true;
            throw new IOException("the serial port closed: the device is gone", e);
        }
    }

    /// <inheritdoc/>
    public void Write(byte[] buffer, int offset, int count)
    {
        try
        {
            _port.Write(buffer, offset, count);
        }
        catch (Exception e) when (e is TimeoutException or InvalidOperationException or IOException)
        {
            _broken = true;
            throw new IOException("writing to the serial port failed: " + e.Message.TrimEnd('.'), e);
        }
    }

    /// <summary>Closes the port. After the device went away, closing can block for a long time when bytes were written since (seen with a pseudo-terminal): then it is given 2 s on a worker and left behind.</summary>
    public void Dispose()
    {
        if (!_broken)
        {
            _port.Dispose();
            return;
        }

        Task.Run(() => _port.Dispose()).Wait(TimeSpan.FromSeconds(2));
    }
}
