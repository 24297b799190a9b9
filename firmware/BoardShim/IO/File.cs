// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signatures as declared in nanoframework/System.IO.FileSystem, System.IO.FileSystem/File.cs, tag v1.1.85 (c08267d) (written from the signatures; no implementation copied).
using System;

namespace System.IO
{
    /// <summary>Shim of nanoFramework's File: only the members firmware/Board/ uses.</summary>
    public static class File
    {
        /// <summary>True when the file exists (shim: throws). The real method returns false for a bad path instead of throwing.</summary>
        public static bool Exists(string path)
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Reads a whole file as UTF-8 text (shim: throws).</summary>
        public static string ReadAllText(string path)
        {
            throw new NotImplementedException("compile-only shim");
        }

        /// <summary>Creates or overwrites a file with UTF-8 text (shim: throws).</summary>
        public static void WriteAllText(string path, string contents)
        {
            throw new NotImplementedException("compile-only shim");
        }
    }
}
