// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.IO.Ports, System.IO.Ports/SerialPort.cs, tag v1.1.131 (a2dc3fd) (written from the signature; no implementation copied).
using System;

namespace System.IO.Ports
{
    /// <summary>Shim of nanoFramework's SerialPort: only the members firmware/Board/ uses.</summary>
    public sealed class SerialPort : IDisposable
    {
        /// <summary>Names a UART ("COMn") with its line settings (shim: throws).</summary>
        public SerialPort(string portName, int baudRate = 9600, Parity parity = Parity.None, int dataBits = 8, StopBits stopBits = StopBits.One)
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Write time-out, ms (shim: throws).</summary>
        public int WriteTimeout
        {
            get { throw new NotImplementedException("compile-only shim"); }
            set { throw new NotImplementedException("compile-only shim"); }
        }

        /// <summary>Bytes waiting in the receive buffer (shim: throws).</summary>
        public int BytesToRead
        {
            get { throw new NotImplementedException("compile-only shim"); }
        }

        /// <summary>Opens the UART (shim: throws).</summary>
        public void Open()
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Reads received bytes (shim: throws).</summary>
        public int Read(byte[] buffer, int offset, int count)
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Writes bytes (shim: throws).</summary>
        public void Write(byte[] buffer, int offset, int count)
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Closes and releases the UART (shim: throws).</summary>
        public void Dispose()
        {
            throw new NotImplementedException("compile-only shim");
        }
    }
}
