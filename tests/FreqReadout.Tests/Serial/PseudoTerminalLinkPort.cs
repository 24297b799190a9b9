using FreqReadout.Firmware.Ports;

namespace FreqReadout.Tests.Serial;

/// <summary>The device's serial port in the end-to-end tests: the master side of a pseudo-terminal pair (the PC opens the slave with System.IO.Ports).</summary>
internal sealed class PseudoTerminalLinkPort : ILinkPort
{
    private readonly PseudoTerminalPair _pty;

    public PseudoTerminalLinkPort(PseudoTerminalPair pty)
    {
        _pty = pty;
    }

    public bool TryWrite(byte[] buffer, int offset, int count)
    {
        _pty.WriteMaster(buffer, offset, count);    // blocks while the pty is full: the writer thread waits, as on a UART
        return true;
    }

    public bool TryRead(byte[] buffer, int offset, int count, out int read) => _pty.TryReadMaster(buffer, offset, count, 0, out read);
}
