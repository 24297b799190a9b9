using System.Runtime.InteropServices;

namespace FreqReadout.Tests.Serial;

/// <summary>
/// A file descriptor of one end of a pseudo-terminal, closed once when released. Being a <see cref="SafeHandle"/>, it
/// is not closed while a libc call that was given it is still running on another thread (the call holds a reference),
/// so a descriptor number can never be closed and reused under a read, write or poll.
/// </summary>
internal sealed class PtyFileDescriptor : SafeHandle
{
    /// <summary>Takes ownership of <paramref name="fd"/> (-1 for none).</summary>
    public PtyFileDescriptor(int fd)
        : base(new IntPtr(-1), ownsHandle: true)
    {
        SetHandle(new IntPtr(fd));
    }

    /// <inheritdoc />
    public override bool IsInvalid => handle.ToInt64() < 0;

    /// <summary>The descriptor number, for struct pollfd; only valid between DangerousAddRef and DangerousRelease.</summary>
    public int Number => (int)handle.ToInt64();

    /// <inheritdoc />
    protected override bool ReleaseHandle() => PtyNative.close(Number) == 0;
}
