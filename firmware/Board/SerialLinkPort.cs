using System;
using System.IO.Ports;
using FreqReadout.Firmware.Ports;
using nanoFramework.Hardware.Esp32;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// The serial line to the PC over nanoFramework's <c>System.IO.Ports.SerialPort</c> (package
    /// nanoFramework.System.IO.Ports; signatures from nanoframework/System.IO.Ports tag v1.1.131, SerialPort.cs).
    /// On a classic ESP32 the debugger uses UART0 (the board's own USB bridge), so the link takes COM2 with its
    /// pins routed by <c>Configuration.SetPinFunction</c> to free GPIOs and a 3.3 V USB-UART adapter on them (adapter
    /// RX to the TX pin, adapter TX to the RX pin, grounds joined); boards whose debugger runs over native USB may use
    /// COM1 instead. 8 data bits, no parity, one stop bit, no flow control; 921600 baud by default (the adapter must
    /// support it; 460800 or 115200 are the fall-backs, set the same rate on the PC).
    /// <para>
    /// Only the link's writer thread calls this port (<see cref="ILinkPort"/>). <see cref="TryWrite"/> blocks until
    /// the UART driver has taken the bytes (the port has no transmit buffer of its own); <see cref="TryRead"/> never
    /// blocks: it asks how many bytes are waiting first, because the port's Read throws when none are. A failure is
    /// counted and reported as false; the bytes of a failed write are lost (the link's sequence numbers show it).
    /// </para>
    /// </summary>
    public sealed class SerialLinkPort : ILinkPort, IDisposable
    {
        /// <summary>The link's default line rate, baud.</summary>
        public const int DefaultBaudRate = 921600;

        /// <summary>Longest a write may take before it fails, ms: a 256-byte frame takes under 3 ms at 921600 baud.</summary>
        public const int WriteTimeoutMilliseconds = 500;

        private readonly SerialPort port;
        private long failures;

        /// <summary>Routes the UART's pins and opens the port.</summary>
        /// <param name="portName">"COM2" (classic ESP32 with a USB-UART adapter) or "COM1".</param>
        /// <param name="txPin">GPIO the device transmits on (to the adapter's RX).</param>
        /// <param name="rxPin">GPIO the device receives on (from the adapter's TX).</param>
        /// <param name="baudRate">Line rate, baud (&gt; 0), the same on the PC.</param>
        public SerialLinkPort(string portName, int txPin, int rxPin, int baudRate)
        {
            if (baudRate <= 0)
            {
                throw new ArgumentOutOfRangeException("baudRate", "baud rate must be > 0");
            }

            if (portName == "COM2")
            {
                Configuration.SetPinFunction(txPin, DeviceFunction.COM2_TX);
                Configuration.SetPinFunction(rxPin, DeviceFunction.COM2_RX);
            }
            else if (portName == "COM1")
            {
                Configuration.SetPinFunction(txPin, DeviceFunction.COM1_TX);
                Configuration.SetPinFunction(rxPin, DeviceFunction.COM1_RX);
            }
            else
            {
                throw new ArgumentException("port name must be COM1 or COM2", "portName");
            }

            port = new SerialPort(portName, baudRate, Parity.None, 8, StopBits.One);
            port.WriteTimeout = WriteTimeoutMilliseconds;
            port.Open();
        }

        /// <summary>Writes and reads that failed (the port threw).</summary>
        public long Failures
        {
            get { return failures; }
        }

        /// <inheritdoc />
        public bool TryWrite(byte[] buffer, int offset, int count)
        {
            try
            {
                port.Write(buffer, offset, count);
                return true;
            }
            catch (Exception)
            {
                failures++;
                return false;
            }
        }

        /// <inheritdoc />
        public bool TryRead(byte[] buffer, int offset, int count, out int read)
        {
            read = 0;
            try
            {
                int waiting = port.BytesToRead;
                if (waiting <= 0 || count <= 0)
                {
                    return false;
                }

                read = port.Read(buffer, offset, waiting < count ? waiting : count);
                return read > 0;
            }
            catch (Exception)
            {
                failures++;
                read = 0;
                return false;
            }
        }

        /// <summary>Closes the port.</summary>
        public void Dispose()
        {
            port.Dispose();
        }
    }
}
