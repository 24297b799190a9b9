using System.Runtime.InteropServices;

namespace FreqReadout.Tests.Serial;

/// <summary>
/// The libc calls <see cref="PseudoTerminalPair"/> makes, and the Linux constants it passes them. Linux only: the
/// numeric values below are Linux's (glibc and musl agree on them for x86-64 and arm64) and differ on macOS and the
/// BSDs, and <c>fcntl</c> is variadic, which is only safe to declare with fixed arguments where the calling convention
/// passes variadic integers like fixed ones (Linux x86-64 and arm64; not macOS on arm64).
/// </summary>
internal static class PtyNative
{
    private const string Libc = "libc";

    // open(2) flags, Linux (asm-generic/fcntl.h and x86), from memory: O_RDWR 02, O_NOCTTY 0400, O_NONBLOCK 04000,
    // O_CLOEXEC 02000000 (octal).
    public const int O_RDWR = 0x2;
    public const int O_NOCTTY = 0x100;
    public const int O_NONBLOCK = 0x800;
    public const int O_CLOEXEC = 0x80000;

    // fcntl(2) commands and the descriptor flag, Linux, from memory.
    public const int F_SETFD = 2;
    public const int F_GETFL = 3;
    public const int F_SETFL = 4;
    public const int FD_CLOEXEC = 1;

    // errno values, Linux, from memory (asm-generic/errno-base.h).
    public const int EINTR = 4;
    public const int EAGAIN = 11;

    // poll(2) event bits, Linux, from memory (asm-generic/poll.h).
    public const short POLLIN = 0x1;
    public const short POLLOUT = 0x4;
    public const short POLLNVAL = 0x20;

    // tcsetattr() optional_actions, Linux, from memory.
    public const int TCSANOW = 0;

    /// <summary>
    /// Bytes given to tcgetattr / cfmakeraw / tcsetattr as the struct termios. Linux glibc's struct is 60 bytes and
    /// the kernel's 44, macOS's 72 (from memory); the calls treat the buffer as opaque, so a much larger one is safe
    /// whatever the exact size.
    /// </summary>
    public const int TermiosBufferBytes = 256;

    /// <summary>struct pollfd (POSIX.1-2017, poll()): int fd; short events; short revents.</summary>
    [StructLayout(LayoutKind.Sequential)]
    public struct PollFd
    {
        public int Fd;
        public short Events;
        public short Revents;
    }

    /// <summary>POSIX.1-2017, posix_openpt(): a new master, or -1 and errno.</summary>
    [DllImport(Libc, SetLastError = true)]
    public static extern int posix_openpt(int flags);

    /// <summary>POSIX.1-2017, grantpt(): 0, or -1 and errno.</summary>
    [DllImport(Libc, SetLastError = true)]
    public static extern int grantpt(SafeHandle masterFd);

    /// <summary>POSIX.1-2017, unlockpt(): 0, or -1 and errno.</summary>
    [DllImport(Libc, SetLastError = true)]
    public static extern int unlockpt(SafeHandle masterFd);

    /// <summary>
    /// Linux man-pages, ptsname(3): the thread-safe ptsname_r (a GNU extension; also in musl, from memory) writes
    /// the slave's path, NUL-ended, into buf; returns 0, or an error number (glibc also sets errno).
    /// </summary>
    [DllImport(Libc, SetLastError = true)]
    public static extern int ptsname_r(SafeHandle masterFd, byte[] buf, nuint buflen);

    /// <summary>POSIX.1-2017, open(); declared without the variadic mode argument, which O_CREAT alone needs.</summary>
    [DllImport(Libc, SetLastError = true)]
    public static extern int open([MarshalAs(UnmanagedType.LPUTF8Str)] string path, int flags);

    /// <summary>POSIX.1-2017, close().</summary>
    [DllImport(Libc, SetLastError = true)]
    public static extern int close(int fd);

    /// <summary>POSIX.1-2017, fcntl(), with one int argument (see the class summary on variadic calls).</summary>
    [DllImport(Libc, SetLastError = true)]
    public static extern int fcntl(SafeHandle fd, int cmd, int arg);

    /// <summary>POSIX.1-2017, tcgetattr(); termios is a buffer of <see cref="TermiosBufferBytes"/>.</summary>
    [DllImport(Libc, SetLastError = true)]
    public static extern int tcgetattr(SafeHandle fd, byte[] termios);

    /// <summary>POSIX.1-2017, tcsetattr().</summary>
    [DllImport(Libc, SetLastError = true)]
    public static extern int tcsetattr(SafeHandle fd, int optionalActions, byte[] termios);

    /// <summary>Linux man-pages, termios(3), cfmakeraw() (not in POSIX; in glibc, musl and the BSDs).</summary>
    [DllImport(Libc)]
    public static extern void cfmakeraw(byte[] termios);

    /// <summary>POSIX.1-2017, poll(); nfds_t is unsigned long on Linux (from memory).</summary>
    [DllImport(Libc, SetLastError = true)]
    public static extern int poll(ref PollFd fds, nuint nfds, int timeoutMilliseconds);

    /// <summary>POSIX.1-2017, read(): bytes read, 0 at end of file, or -1 and errno.</summary>
    [DllImport(Libc, SetLastError = true)]
    public static extern nint read(SafeHandle fd, ref byte buf, nuint count);

    /// <summary>POSIX.1-2017, write(): bytes written (possibly fewer than count), or -1 and errno.</summary>
    [DllImport(Libc, SetLastError = true)]
    public static extern nint write(SafeHandle fd, ref byte buf, nuint count);

    /// <summary>
    /// An <see cref="IOException"/> naming the call and the errno it left, with the C library's text for it
    /// (strerror, through <see cref="Marshal.GetPInvokeErrorMessage"/>).
    /// </summary>
    public static IOException Failure(string call, int errno) =>
        new($"{call} failed: errno {errno} ({Marshal.GetPInvokeErrorMessage(errno)})");
}
