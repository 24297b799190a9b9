// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/System.IO.Ports, System.IO.Ports/Parity.cs, tag v1.1.131 (written from the signature; no implementation copied).
namespace System.IO.Ports
{
    /// <summary>Shim of nanoFramework's Parity: only the value firmware/Board/ uses, with the real number.</summary>
    public enum Parity
    {
        /// <summary>No parity bit.</summary>
        None = 0,
    }
}
