// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.Device.I2c, System.Device.I2c/I2cDevice.cs, tag v1.1.29 (ac5858c) (written from the signature; no implementation copied).
using System;

namespace System.Device.I2c
{
    /// <summary>Shim of nanoFramework's I2cDevice: only the members firmware/Board/ uses.</summary>
    public class I2cDevice : IDisposable
    {
        /// <summary>Opens a device on a bus (shim: throws).</summary>
        public I2cDevice(I2cConnectionSettings settings)
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Writes bytes in one transaction (shim: throws). The real method takes and returns structs (SpanByte, I2cTransferResult).</summary>
        public I2cTransferResult Write(SpanByte buffer)
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Writes then reads in one transaction, with a repeated start (shim: throws). Takes and returns structs (SpanByte, I2cTransferResult).</summary>
        public I2cTransferResult WriteRead(SpanByte writeBuffer, SpanByte readBuffer)
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Releases the device (shim: throws).</summary>
        public void Dispose()
        {
            throw new NotImplementedException("compile-only shim");
        }
    }
}
