// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.Device.I2c, System.Device.I2c/I2cTransferResult.cs, tag v1.1.29 (written from the signature; no implementation copied).
using System;

namespace System.Device.I2c
{
    /// <summary>Shim of nanoFramework's I2cTransferResult (a struct): only the member firmware/Board/ uses.</summary>
    public struct I2cTransferResult
    {
        /// <summary>How the transfer ended (shim: throws).</summary>
        public I2cTransferStatus Status
        {
            get { throw new NotImplementedException("compile-only shim"); }
        }
    }
}
