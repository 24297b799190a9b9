// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.Device.I2c, System.Device.I2c/I2cTransferStatus.cs, tag v1.1.29 (values by declaration order: UnknownError 0, FullTransfer 1, ...) (written from the signature; no implementation copied).
namespace System.Device.I2c
{
    /// <summary>Shim of nanoFramework's I2cTransferStatus: only the value firmware/Board/ uses, with the real number.</summary>
    public enum I2cTransferStatus
    {
        /// <summary>Every byte was transferred.</summary>
        FullTransfer = 1,
    }
}
