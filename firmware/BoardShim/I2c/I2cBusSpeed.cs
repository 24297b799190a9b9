// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.Device.I2c, System.Device.I2c/I2cBusSpeed.cs, tag v1.1.29 (values by declaration order: StandardMode 0, FastMode 1, FastModePlus 2) (written from the signature; no implementation copied).
namespace System.Device.I2c
{
    /// <summary>Shim of nanoFramework's I2cBusSpeed: only the value firmware/Board/ uses, with the real number.</summary>
    public enum I2cBusSpeed
    {
        /// <summary>100 kHz.</summary>
        StandardMode = 0,
    }
}
