using System.Reflection;
using System.Runtime.InteropServices;
using Microsoft.Win32.SafeHandles;

namespace FreqReadout.Host.Output;

/// <summary>
/// The platform calls behind <see cref="FileIdentity"/>: <c>statx(2)</c> on Linux (its struct has one
/// layout on every architecture), <c>stat(2)</c> on macOS (64-bit inode layout), and
/// <c>CreateFileW</c> + <c>GetFileType</c> + <c>GetFileInformationByHandle</c> on Windows; plus
/// <c>fsync</c> of a folder on Unix after a rename. Any other platform, or a call that is missing
/// (glibc before 2.28 has no statx wrapper), reports "unknown" and the caller falls back to comparing
/// resolved paths.
/// </summary>
internal static class NativeFileStatus
{
    private const string Libc = "freqreadout-libc";

    // Linux: struct statx offsets (linux/stat.h, identical on every architecture).
    private const int StatxBufferBytes = 256;
    private const int StatxModeOffset = 0x1C;
    private const int StatxInodeOffset = 0x20;
    private const int StatxDevMajorOffset = 0x88;
    private const int StatxDevMinorOffset = 0x8C;
    private const int AtFdCwd = -100;
    private const uint StatxTypeModeIno = 0x001 | 0x002 | 0x100; // STATX_TYPE | STATX_MODE | STATX_INO

    // macOS: struct stat with 64-bit inodes (sys/stat.h): st_dev int32 at 0, st_mode uint16 at 4, st_ino uint64 at 8; 144 bytes.
    private const int MacStatBufferBytes = 256;

    private const int ENOENT = 2;
    private const int ENOTDIR = 20;

    private static readonly bool s_resolverSet = SetResolver();

    /// <summary>Reads kind, device, index and permission bits of the file <paramref name="path"/> names (links followed).</summary>
    /// <returns>False when the platform cannot tell; true with <paramref name="kind"/> Missing when nothing is there.</returns>
    public static bool TryQuery(string path, out FileNodeKind kind, out ulong device, out ulong index, out int permissionBits)
    {
        kind = FileNodeKind.Unknown;
        device = 0;
        index = 0;
        permissionBits = 0;
        try
        {
            if (OperatingSystem.IsLinux())
            {
                return TryStatx(path, ref kind, ref device, ref index, ref permissionBits);
            }

            if (OperatingSystem.IsMacOS())
            {
                return TryMacStat(path, ref kind, ref device, ref index, ref permissionBits);
            }

            if (OperatingSystem.IsWindows())
            {
                return TryWindows(path, ref kind, ref device, ref index);
            }
        }
        catch (Exception e) when (e is EntryPointNotFoundException or DllNotFoundException or MarshalDirectiveException)
        {
            // An older C library or an unexpected platform: the caller compares resolved paths instead.
        }

        return false;
    }

    /// <summary>Best-effort fsync of a folder (Unix), so a rename inside it survives a power loss; ignored where unsupported.</summary>
    public static void TrySyncFolder(string folder)
    {
        if (OperatingSystem.IsWindows() || !(OperatingSystem.IsLinux() || OperatingSystem.IsMacOS()))
        {
            return;
        }

        try
        {
            _ = s_resolverSet;
            int fd = Open(folder, 0); // O_RDONLY
            if (fd >= 0)
            {
                _ = Fsync(fd);
                _ = Close(fd);
            }
        }
        catch (Exception e) when (e is EntryPointNotFoundException or DllNotFoundException)
        {
        }
    }

    private static bool TryStatx(string path, ref FileNodeKind kind, ref ulong device, ref ulong index, ref int permissionBits)
    {
        _ = s_resolverSet;
        byte[] buffer = new byte[StatxBufferBytes];
        if (Statx(AtFdCwd, path, 0, StatxTypeModeIno, buffer) != 0)
        {
            return Missing(Marshal.GetLastPInvokeError(), ref kind);
        }

        // The struct is in the machine's own byte order, as BitConverter reads it.
        int mode = BitConverter.ToUInt16(buffer, StatxModeOffset);
        ulong inode = BitConverter.ToUInt64(buffer, StatxInodeOffset);
        uint major = BitConverter.ToUInt32(buffer, StatxDevMajorOffset);
        uint minor = BitConverter.ToUInt32(buffer, StatxDevMinorOffset);
        kind = KindOfMode(mode);
        device = ((ulong)major << 32) | minor;
        index = inode;
        permissionBits = mode & 0xFFF;
        return true;
    }

    private static bool TryMacStat(string path, ref FileNodeKind kind, ref ulong device, ref ulong index, ref int permissionBits)
    {
        _ = s_resolverSet;
        byte[] buffer = new byte[MacStatBufferBytes];
        int result = RuntimeInformation.ProcessArchitecture == Architecture.X64 ? MacStatX64(path, buffer) : MacStat(path, buffer);
        if (result != 0)
        {
            return Missing(Marshal.GetLastPInvokeError(), ref kind);
        }

        int mode = BitConverter.ToUInt16(buffer, 4);
        kind = KindOfMode(mode);
        device = BitConverter.ToUInt32(buffer, 0);
        index = BitConverter.ToUInt64(buffer, 8);
        permissionBits = mode & 0xFFF;
        return true;
    }

    private static bool Missing(int errno, ref FileNodeKind kind)
    {
        if (errno is ENOENT or ENOTDIR)
        {
            kind = FileNodeKind.Missing;
            return true;
        }

        return false;
    }

    private static FileNodeKind KindOfMode(int mode) => (mode & 0xF000) switch
    {
        0x8000 => FileNodeKind.Regular,
        0x4000 => FileNodeKind.Directory,
        0x2000 => FileNodeKind.CharacterDevice,
        0x6000 => FileNodeKind.BlockDevice,
        0x1000 => FileNodeKind.Pipe,
        0xC000 => FileNodeKind.Socket,
        _ => FileNodeKind.Unknown,
    };

    private static bool TryWindows(string path, ref FileNodeKind kind, ref ulong device, ref ulong index)
    {
        const uint FileReadAttributes = 0x80;
        const uint ShareAll = 0x1 | 0x2 | 0x4;
        const uint OpenExisting = 3;
        const uint BackupSemantics = 0x02000000; // needed to open a folder
        using SafeFileHandle handle = CreateFileW(path, FileReadAttributes, ShareAll, IntPtr.Zero, OpenExisting, BackupSemantics, IntPtr.Zero);
        if (handle.IsInvalid)
        {
            int error = Marshal.GetLastPInvokeError();
            if (error is 2 or 3) // ERROR_FILE_NOT_FOUND, ERROR_PATH_NOT_FOUND
            {
                kind = FileNodeKind.Missing;
                return true;
            }

            return false;
        }

        uint type = GetFileType(handle);
        if (type == 2)
        {
            kind = FileNodeKind.CharacterDevice; // NUL, CON, a serial port
            return true;
        }

        if (type == 3)
        {
            kind = FileNodeKind.Pipe;
            return true;
        }

        if (!GetFileInformationByHandle(handle, out ByHandleFileInformation info))
        {
            return false;
        }

        kind = (info.FileAttributes & 0x10) != 0 ? FileNodeKind.Directory : FileNodeKind.Regular;
        device = info.VolumeSerialNumber;
        index = ((ulong)info.FileIndexHigh << 32) | info.FileIndexLow;
        return true;
    }

    private static bool SetResolver()
    {
        try
        {
            NativeLibrary.SetDllImportResolver(typeof(NativeFileStatus).Assembly, Resolve);
        }
        catch (InvalidOperationException)
        {
            // Already set for this assembly.
        }

        return true;
    }

    private static IntPtr Resolve(string name, Assembly assembly, DllImportSearchPath? searchPath)
    {
        if (name != Libc)
        {
            return IntPtr.Zero;
        }

        string[] candidates = OperatingSystem.IsMacOS()
            ? new[] { "/usr/lib/libSystem.B.dylib", "libc" }
            : new[] { "libc.so.6", "libc.so", "libc" };
        foreach (string candidate in candidates)
        {
            if (NativeLibrary.TryLoad(candidate, out IntPtr handle))
            {
                return handle;
            }
        }

        return IntPtr.Zero;
    }

    [DllImport(Libc, EntryPoint = "statx", SetLastError = true, CharSet = CharSet.Ansi)]
    private static extern int Statx(int dirfd, string path, int flags, uint mask, [Out] byte[] buffer);

    [DllImport(Libc, EntryPoint = "stat", SetLastError = true, CharSet = CharSet.Ansi)]
    private static extern int MacStat(string path, [Out] byte[] buffer);

    [DllImport(Libc, EntryPoint = "stat$INODE64", SetLastError = true, CharSet = CharSet.Ansi)]
    private static extern int MacStatX64(string path, [Out] byte[] buffer);

    [DllImport(Libc, EntryPoint = "open", SetLastError = true, CharSet = CharSet.Ansi)]
    private static extern int Open(string path, int flags);

    [DllImport(Libc, EntryPoint = "fsync", SetLastError = true)]
    private static extern int Fsync(int fd);

    [DllImport(Libc, EntryPoint = "close", SetLastError = true)]
    private static extern int Close(int fd);

    [DllImport("kernel32.dll", SetLastError = true, CharSet = CharSet.Unicode)]
    private static extern SafeFileHandle CreateFileW(string path, uint access, uint share, IntPtr security, uint creation, uint flags, IntPtr template);

    [DllImport("kernel32.dll", SetLastError = true)]
    private static extern uint GetFileType(SafeFileHandle handle);

    [DllImport("kernel32.dll", SetLastError = true)]
    [return: MarshalAs(UnmanagedType.Bool)]
    private static extern bool GetFileInformationByHandle(SafeFileHandle handle, out ByHandleFileInformation info);

    /// <summary>BY_HANDLE_FILE_INFORMATION (fileapi.h): 13 DWORDs.</summary>
    [StructLayout(LayoutKind.Sequential)]
    private struct ByHandleFileInformation
    {
        public uint FileAttributes;
        public uint CreationTimeLow;
        public uint CreationTimeHigh;
        public uint LastAccessTimeLow;
        public uint LastAccessTimeHigh;
        public uint LastWriteTimeLow;
        public uint LastWriteTimeHigh;
        public uint VolumeSerialNumber;
        public uint FileSizeHigh;
        public uint FileSizeLow;
        public uint NumberOfLinks;
        public uint FileIndexHigh;
        public uint FileIndexLow;
    }
}
