using System.Runtime.InteropServices;
using System.Text;

namespace FreqReadout.Tests.Serial;

/// <summary>
/// A pseudo-terminal opened through libc for end-to-end serial tests: the test plays the device on the master side
/// (<see cref="WriteMaster"/>, <see cref="TryReadMaster"/>) and the code under test opens <see cref="SlavePath"/> as a
/// serial port, as it would open a USB serial adapter. Linux only (<see cref="IsSupported"/>).
/// </summary>
/// <remarks>
/// <para>Opening: posix_openpt(O_RDWR | O_NOCTTY), grantpt, unlockpt, ptsname_r (POSIX.1-2017; Linux man-pages,
/// posix_openpt(3), ptsname(3)); the slave is then opened and kept open while the pair lives, because on Linux a read
/// on the master fails with EIO whenever no slave descriptor is open (Linux behaviour, from memory, and seen here:
/// without that descriptor <c>TryReadMaster</c> threw "read(master) failed: errno 5 (Input/output error)"), for example
/// between a test's serial ports. Both ends are put into raw mode with tcgetattr, cfmakeraw and tcsetattr (Linux
/// man-pages, termios(3)): no echo, no CR/LF translation, no XON/XOFF, no signal characters, 8 bits. The master is
/// non-blocking and every wait is a poll in short slices, so <see cref="Dispose"/> from another thread ends a pending
/// <see cref="WriteMaster"/> or <see cref="TryReadMaster"/> (with <see cref="ObjectDisposedException"/>) rather than
/// leaving it blocked.</para>
/// <para>System.IO.Ports on a pty, as observed here (System.IO.Ports 10.0.15, .NET 10, Linux 6.18, run as root); worth
/// knowing for <c>freqreadout record</c>:</para>
/// <list type="bullet">
/// <item><description>Open works: the port sets its termios (921600 baud, 8N1, no handshake) on the slave and the pty
/// accepts it, baud changes included (a pty ignores the speed, from memory). Bytes pass both ways unchanged
/// (<c>PseudoTerminalPairTests</c>).</description></item>
/// <item><description>A pty has no modem lines: setting or reading <c>DtrEnable</c> or <c>RtsEnable</c>, and reading
/// <c>CDHolding</c>, <c>CtsHolding</c> or <c>DsrHolding</c>, throws <see cref="IOException"/> "Inappropriate ioctl for
/// device" (ENOTTY). Open with the defaults (both false) does not. So <c>record</c> must not require DTR/RTS, or must
/// catch that exception. <c>BreakState</c>, <c>DiscardInBuffer</c> and <c>DiscardOutBuffer</c> do not
/// throw.</description></item>
/// <item><description><c>Read</c> on an empty port throws <see cref="TimeoutException"/> after about <c>ReadTimeout</c>
/// (it never returns 0). <c>BytesToRead</c> counts the bytes waiting, and <c>DataReceived</c> is raised (on the thread
/// pool) while the master is open.</description></item>
/// <item><description>When the master closes (this pair disposed; for <c>record</c>, the device gone), a <c>Read</c>
/// pending or made next throws <see cref="ObjectDisposedException"/> "The port is closed." although <c>IsOpen</c> stays
/// true; later <c>Read</c>s only time out, since the port's I/O loop has stopped; <c>BytesToRead</c> returns -1 rather
/// than throwing. <c>Close</c> then returns. But a <c>Write</c> after that exception times out, and <c>Close</c>
/// afterwards did not return within 10 s in any of four exploratory runs (System.IO.Ports' Flush waits for its write
/// queue, which the stopped loop no longer empties). So <c>record</c> should take that exception as "device gone",
/// write nothing more, and close.</description></item>
/// <item><description>A path that does not exist: <c>Open</c> throws <see cref="UnauthorizedAccessException"/> "Access
/// to the port '&lt;path&gt;' is denied." although nothing was denied; the cause is its <c>InnerException</c>, an <see
/// cref="IOException"/> with strerror's text ("No such file or directory"). A directory ("Is a directory") and a file
/// that is not a terminal, such as /dev/null ("Inappropriate ioctl for device"), are wrapped the same way. The one-line
/// error should quote the inner message.</description></item>
/// <item><description>A second <c>SerialPort</c> opened the same slave while the first was open (as root; no exclusive
/// lock was seen).</description></item>
/// </list>
/// </remarks>
public sealed class PseudoTerminalPair : IDisposable
{
    /// <summary>The longest single poll, so a pending call notices <see cref="Dispose"/> within about this time.</summary>
    private const int PollSliceMilliseconds = 50;

    private readonly PtyFileDescriptor _master;
    private readonly PtyFileDescriptor _slave;
    private volatile bool _disposed;

    /// <summary>Opens a new pseudo-terminal pair, both ends raw.</summary>
    /// <exception cref="PlatformNotSupportedException">Not on Linux.</exception>
    /// <exception cref="IOException">A libc call failed; the message names it and its errno.</exception>
    public PseudoTerminalPair()
    {
        if (!IsSupported)
        {
            throw new PlatformNotSupportedException(UnsupportedReason);
        }

        _master = new PtyFileDescriptor(PtyNative.posix_openpt(PtyNative.O_RDWR | PtyNative.O_NOCTTY));
        _slave = new PtyFileDescriptor(-1);
        try
        {
            if (_master.IsInvalid)
            {
                throw PtyNative.Failure("posix_openpt(O_RDWR | O_NOCTTY)", LastError());
            }

            // Not inherited by processes other tests start, which would keep the pty alive after Dispose.
            Check(PtyNative.fcntl(_master, PtyNative.F_SETFD, PtyNative.FD_CLOEXEC), "fcntl(master, F_SETFD, FD_CLOEXEC)");
            Check(PtyNative.grantpt(_master), "grantpt");
            Check(PtyNative.unlockpt(_master), "unlockpt");
            SlavePath = ReadSlavePath(_master);

            int slave = PtyNative.open(SlavePath, PtyNative.O_RDWR | PtyNative.O_NOCTTY | PtyNative.O_CLOEXEC);
            if (slave < 0)
            {
                throw PtyNative.Failure($"open(\"{SlavePath}\")", LastError());
            }

            _slave.Dispose();
            _slave = new PtyFileDescriptor(slave);
            MakeRaw(_slave, "slave");
            MakeRaw(_master, "master");

            int flags = PtyNative.fcntl(_master, PtyNative.F_GETFL, 0);
            Check(flags, "fcntl(master, F_GETFL)");
            Check(PtyNative.fcntl(_master, PtyNative.F_SETFL, flags | PtyNative.O_NONBLOCK), "fcntl(master, F_SETFL, O_NONBLOCK)");
        }
        catch
        {
            _slave.Dispose();
            _master.Dispose();
            throw;
        }
    }

    /// <summary>True where this class works: Linux on x86-64 or arm64 (see the constants in its libc bindings).</summary>
    public static bool IsSupported =>
        OperatingSystem.IsLinux() && RuntimeInformation.ProcessArchitecture is Architecture.X64 or Architecture.Arm64;

    /// <summary>Why the pair is not available on this system; the skip reason of <see cref="PseudoTerminalFactAttribute"/>.</summary>
    public static string UnsupportedReason =>
        "PseudoTerminalPair needs Linux on x86-64 or arm64: it opens a pty through libc with those constants and " +
        "calling conventions (macOS, the BSDs and some Linux architectures differ; Windows has no pty a SerialPort can open)";

    /// <summary>The slave's device path (for example <c>/dev/pts/3</c>), which a System.IO.Ports.SerialPort can open.</summary>
    public string SlavePath { get; }

    /// <summary>
    /// Writes all <paramref name="count"/> bytes to the master, for the slave's reader. Loops over partial writes;
    /// when the pty's buffer (a few KiB) is full it waits, in poll slices, for the reader to drain it, so a reader must
    /// run concurrently for a large write to finish. EINTR and EAGAIN are retried.
    /// </summary>
    /// <exception cref="ObjectDisposedException">The pair is or gets disposed.</exception>
    /// <exception cref="IOException">write or poll failed; the message names the errno.</exception>
    public void WriteMaster(byte[] buffer, int offset, int count)
    {
        ArgumentNullException.ThrowIfNull(buffer);
        ArgumentOutOfRangeException.ThrowIfNegative(offset);
        ArgumentOutOfRangeException.ThrowIfNegative(count);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(count, buffer.Length - offset);
        ObjectDisposedException.ThrowIf(_disposed, this);

        int done = 0;
        while (done < count)
        {
            nint written = PtyNative.write(_master, ref buffer[offset + done], (nuint)(count - done));
            if (written > 0)
            {
                done += (int)written;
                continue;
            }

            int errno = written < 0 ? LastError() : PtyNative.EAGAIN;
            if (errno == PtyNative.EAGAIN)
            {
                // Full (or nothing taken): wait until the master is writable again, with no limit but Dispose.
                WaitMaster(PtyNative.POLLOUT, Timeout.Infinite);
            }
            else if (errno != PtyNative.EINTR)
            {
                // Dispose closes the slave before the master: a read or write racing it sees EIO, which is the disposal.
                ObjectDisposedException.ThrowIf(_disposed, this);
                throw PtyNative.Failure("write(master)", errno);
            }
        }
    }

    /// <summary>
    /// Reads what the slave's writer sent: waits up to <paramref name="timeoutMilliseconds"/> (0 polls once,
    /// <see cref="Timeout.Infinite"/> waits until data or Dispose) for at least one byte, then reads what is there, up
    /// to <paramref name="count"/> bytes.
    /// </summary>
    /// <returns>True with <paramref name="read"/> &gt; 0 when bytes were read; false with 0 when none came in time.</returns>
    /// <exception cref="ObjectDisposedException">The pair is or gets disposed.</exception>
    /// <exception cref="IOException">read or poll failed; the message names the errno.</exception>
    public bool TryReadMaster(byte[] buffer, int offset, int count, int timeoutMilliseconds, out int read)
    {
        ArgumentNullException.ThrowIfNull(buffer);
        ArgumentOutOfRangeException.ThrowIfNegative(offset);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(count);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(count, buffer.Length - offset);
        ArgumentOutOfRangeException.ThrowIfLessThan(timeoutMilliseconds, Timeout.Infinite);
        ObjectDisposedException.ThrowIf(_disposed, this);

        long deadline = timeoutMilliseconds == Timeout.Infinite ? long.MaxValue : Environment.TickCount64 + timeoutMilliseconds;
        while (true)
        {
            nint got = PtyNative.read(_master, ref buffer[offset], (nuint)count);
            if (got > 0)
            {
                read = (int)got;
                return true;
            }

            if (got < 0)
            {
                int errno = LastError();
                if (errno != PtyNative.EAGAIN && errno != PtyNative.EINTR)
                {
                    // Dispose closes the slave before the master: a read or write racing it sees EIO, which is the disposal.
                    ObjectDisposedException.ThrowIf(_disposed, this);
                    throw PtyNative.Failure("read(master)", errno);
                }
            }

            long remaining = deadline == long.MaxValue ? Timeout.Infinite : deadline - Environment.TickCount64;
            if (remaining != Timeout.Infinite && remaining <= 0)
            {
                read = 0;
                return false;
            }

            if (!WaitMaster(PtyNative.POLLIN, remaining == Timeout.Infinite ? Timeout.Infinite : (int)Math.Min(remaining, int.MaxValue)))
            {
                read = 0;
                return false;
            }
        }
    }

    /// <summary>
    /// Closes the master and the slave descriptor the pair holds. A serial port still open on <see cref="SlavePath"/>
    /// then sees a hang-up. Safe to call more than once and from another thread than a pending read or write.
    /// </summary>
    public void Dispose()
    {
        _disposed = true;
        _slave.Dispose();
        _master.Dispose();
    }

    /// <summary>
    /// Polls the master for <paramref name="events"/> in slices of <see cref="PollSliceMilliseconds"/>, up to
    /// <paramref name="timeoutMilliseconds"/> (or without limit), checking for Dispose between slices.
    /// </summary>
    /// <returns>True when an event (or an error or hang-up, which the next read or write reports) came; false at the timeout.</returns>
    private bool WaitMaster(short events, int timeoutMilliseconds)
    {
        long deadline = timeoutMilliseconds == Timeout.Infinite ? long.MaxValue : Environment.TickCount64 + timeoutMilliseconds;
        while (true)
        {
            ObjectDisposedException.ThrowIf(_disposed, this);
            long remaining = deadline == long.MaxValue ? PollSliceMilliseconds : deadline - Environment.TickCount64;
            if (remaining <= 0)
            {
                return false;
            }

            bool added = false;
            int ready;
            int errno = 0;
            var poll = new PtyNative.PollFd { Events = events };
            try
            {
                _master.DangerousAddRef(ref added);
                poll.Fd = _master.Number;
                ready = PtyNative.poll(ref poll, 1, (int)Math.Min(remaining, PollSliceMilliseconds));
                if (ready < 0)
                {
                    errno = LastError();
                }
            }
            finally
            {
                if (added)
                {
                    _master.DangerousRelease();
                }
            }

            if (ready < 0 && errno != PtyNative.EINTR)
            {
                // Dispose closes the slave before the master: a read or write racing it sees EIO, which is the disposal.
                ObjectDisposedException.ThrowIf(_disposed, this);
                throw PtyNative.Failure("poll(master)", errno);
            }

            if (ready > 0)
            {
                if ((poll.Revents & PtyNative.POLLNVAL) != 0)
                {
                    throw new IOException("poll(master) reported POLLNVAL: the master descriptor is not open");
                }

                return true;
            }
        }
    }

    private static void MakeRaw(PtyFileDescriptor fd, string end)
    {
        var termios = new byte[PtyNative.TermiosBufferBytes];
        Check(PtyNative.tcgetattr(fd, termios), $"tcgetattr({end})");
        PtyNative.cfmakeraw(termios);
        Check(PtyNative.tcsetattr(fd, PtyNative.TCSANOW, termios), $"tcsetattr({end}, TCSANOW, raw)");
    }

    private static string ReadSlavePath(PtyFileDescriptor master)
    {
        var path = new byte[256];
        int error = PtyNative.ptsname_r(master, path, (nuint)path.Length);
        if (error != 0)
        {
            // ptsname_r returns the error number (glibc also sets errno; some older C libraries returned -1 and set only
            // errno, from memory).
            throw PtyNative.Failure("ptsname_r", error > 0 ? error : LastError());
        }

        int end = Array.IndexOf(path, (byte)0);
        if (end <= 0)
        {
            throw new IOException("ptsname_r returned an empty or unterminated path");
        }

        return Encoding.UTF8.GetString(path, 0, end);
    }

    private static void Check(int result, string call)
    {
        if (result < 0)
        {
            throw PtyNative.Failure(call, LastError());
        }
    }

    private static int LastError() => Marshal.GetLastPInvokeError();
}
