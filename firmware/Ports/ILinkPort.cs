namespace FreqReadout.Firmware.Ports
{
    /// <summary>
    /// The serial line to the PC (board adapter over nanoFramework's SerialPort). Only the link's writer
    /// thread calls it, never the readout loop: a write may block until the bytes are on the wire, as the
    /// port has no transmit buffer of its own.
    /// </summary>
    public interface ILinkPort
    {
        /// <summary>Writes the bytes, blocking until they are handed to the UART; false when the port failed (the bytes are lost).</summary>
        bool TryWrite(byte[] buffer, int offset, int count);

        /// <summary>Reads bytes that have arrived from the PC without blocking; false when none are waiting or the port failed.</summary>
        /// <param name="buffer">Where the bytes go.</param>
        /// <param name="offset">First byte written.</param>
        /// <param name="count">Room in <paramref name="buffer"/>.</param>
        /// <param name="read">Bytes read, at least 1 when true is returned.</param>
        bool TryRead(byte[] buffer, int offset, int count, out int read);
    }
}
