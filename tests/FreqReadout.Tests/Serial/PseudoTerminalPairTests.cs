using System.IO.Ports;
using System.Runtime.InteropServices;

namespace FreqReadout.Tests.Serial;

/// <summary>
/// End-to-end checks of a System.IO.Ports <see cref="SerialPort"/> on a <see cref="PseudoTerminalPair"/>: every byte
/// value passes unchanged both ways, a burst far larger than the pty's buffer arrives whole, and the pair's end and a
/// missing device behave as documented on <see cref="PseudoTerminalPair"/>. Linux only (skipped, with the reason,
/// elsewhere). Each test runs its work under <see cref="HangBound"/>: a guard that turns a hang into a failure, not a
/// speed check. The payloads are invented: byte values and a seeded pseudo-random burst.
/// </summary>
public class PseudoTerminalPairTests
{
    /// <summary>How long a test's work may take before it counts as hung. A hang guard, never a speed check.</summary>
    private static readonly TimeSpan HangBound = TimeSpan.FromSeconds(60);

    /// <summary>A serial port's read and write timeout: long, so only a lost byte (or a hang) trips it.</summary>
    private const int PortTimeoutMilliseconds = 10_000;

    /// <summary>How long to look for bytes that must not come (an echo, a CR/LF expansion).</summary>
    private const int NothingMoreMilliseconds = 200;

    [PseudoTerminalFact]
    public async Task All_256_byte_values_written_to_the_master_arrive_unchanged_and_in_order_at_the_serial_port()
    {
        byte[] payload = EveryByteValueAndTheSensitiveOnes();
        using var pair = new PseudoTerminalPair();
        using SerialPort port = OpenPort(pair.SlavePath);
        await WithinHangBound(() =>
        {
            pair.WriteMaster(payload, 0, payload.Length);
            byte[] received = ReadExactly(port, payload.Length);
            Assert.Equal(payload, received);

            // No echo: with ECHO on the slave (a cooked tty), what the master wrote would come back to the master.
            Assert.False(pair.TryReadMaster(new byte[16], 0, 16, NothingMoreMilliseconds, out int echoed), $"{echoed} bytes echoed");
        }, pair, port);
    }

    [PseudoTerminalFact]
    public async Task All_256_byte_values_written_to_the_serial_port_arrive_unchanged_and_in_order_at_the_master()
    {
        byte[] payload = EveryByteValueAndTheSensitiveOnes();
        using var pair = new PseudoTerminalPair();
        using SerialPort port = OpenPort(pair.SlavePath);
        await WithinHangBound(() =>
        {
            port.Write(payload, 0, payload.Length);
            byte[] received = ReadMasterExactly(pair, payload.Length);
            Assert.Equal(payload, received);

            // Nothing added: with OPOST/ONLCR each LF would reach the master as CR LF.
            Assert.False(pair.TryReadMaster(new byte[16], 0, 16, NothingMoreMilliseconds, out int extra), $"{extra} bytes more than written");
        }, pair, port);
    }

    [PseudoTerminalFact]
    public async Task Without_a_serial_port_the_pair_itself_is_raw_both_ways()
    {
        // A plain file stream on the slave sets no termios, so this checks the pair's own raw mode: a cooked slave
        // would hold bytes until a newline (ICANON), echo them (ECHO), map CR to LF (ICRNL), eat XON/XOFF (IXON)
        // and ^C (ISIG), and write LF as CR LF (ONLCR). Linux man-pages, termios(3).
        byte[] payload = EveryByteValueAndTheSensitiveOnes();
        using var pair = new PseudoTerminalPair();
        using var slave = new FileStream(pair.SlavePath, FileMode.Open, FileAccess.ReadWrite, FileShare.ReadWrite, bufferSize: 0);
        await WithinHangBound(() =>
        {
            pair.WriteMaster(payload, 0, payload.Length);
            var received = new byte[payload.Length];
            slave.ReadExactly(received);
            Assert.Equal(payload, received);
            Assert.False(pair.TryReadMaster(new byte[16], 0, 16, NothingMoreMilliseconds, out int echoed), $"{echoed} bytes echoed");

            slave.Write(payload);
            Assert.Equal(payload, ReadMasterExactly(pair, payload.Length));
            Assert.False(pair.TryReadMaster(new byte[16], 0, 16, NothingMoreMilliseconds, out int extra), $"{extra} bytes more than written");
        }, pair, slave);
    }

    [PseudoTerminalFact]
    public async Task A_256_KiB_pseudo_random_burst_from_the_master_arrives_complete_and_equal_at_the_serial_port()
    {
        byte[] burst = new byte[256 * 1024];
        new Random(20261203).NextBytes(burst);
        using var pair = new PseudoTerminalPair();
        using SerialPort port = OpenPort(pair.SlavePath);
        await WithinHangBound(() =>
        {
            // The pty holds a few KiB: the write only finishes because the port drains it meanwhile.
            Task writer = Task.Run(() => pair.WriteMaster(burst, 0, burst.Length));
            byte[] received = ReadExactly(port, burst.Length);
            writer.GetAwaiter().GetResult();
            AssertSameBytes(burst, received);
        }, pair, port);
    }

    [PseudoTerminalFact]
    public async Task A_256_KiB_pseudo_random_burst_from_the_serial_port_arrives_complete_and_equal_at_the_master()
    {
        byte[] burst = new byte[256 * 1024];
        new Random(3).NextBytes(burst);
        using var pair = new PseudoTerminalPair();
        using SerialPort port = OpenPort(pair.SlavePath);
        await WithinHangBound(() =>
        {
            // In 4 KiB writes, so WriteTimeout bounds a stall, not the time the whole burst takes.
            Task writer = Task.Run(() =>
            {
                for (int offset = 0; offset < burst.Length; offset += 4096)
                {
                    port.Write(burst, offset, Math.Min(4096, burst.Length - offset));
                }
            });
            byte[] received = ReadMasterExactly(pair, burst.Length);
            writer.GetAwaiter().GetResult();
            AssertSameBytes(burst, received);
        }, pair, port);
    }

    [PseudoTerminalFact]
    public async Task Disposing_the_pair_under_an_open_serial_port_ends_its_pending_read_and_the_port_closes()
    {
        var pair = new PseudoTerminalPair();
        SerialPort port = OpenPort(pair.SlavePath);
        await WithinHangBound(() =>
        {
            // Queued before the hang-up (ReadAsync enqueues the request before it returns).
            Task<int> pending = port.BaseStream.ReadAsync(new byte[64], 0, 64);
            pair.Dispose();

            // Observed behaviour of System.IO.Ports 10.0.15 (see PseudoTerminalPair's remarks): the hang-up ends the
            // pending read with ObjectDisposedException although IsOpen is still true.
            Assert.Throws<ObjectDisposedException>(() => pending.GetAwaiter().GetResult());
            Assert.True(port.IsOpen);
            port.Close();
            Assert.False(port.IsOpen);
            pair.Dispose();
        }, pair, port);
    }

    [PseudoTerminalFact]
    public async Task Disposing_the_pair_ends_a_pending_master_read_and_a_master_write_blocked_on_a_full_pty()
    {
        var pair = new PseudoTerminalPair();
        await WithinHangBound(() =>
        {
            // Nothing reads the slave, so this write fills the pty and waits.
            Task writer = Task.Run(() => pair.WriteMaster(new byte[1024 * 1024], 0, 1024 * 1024));
            Task<bool> reader = Task.Run(() => pair.TryReadMaster(new byte[16], 0, 16, Timeout.Infinite, out _));
            Assert.False(writer.Wait(NothingMoreMilliseconds), "a 1 MiB write finished with no reader");
            pair.Dispose();
            Assert.Throws<ObjectDisposedException>(() => writer.GetAwaiter().GetResult());
            Assert.Throws<ObjectDisposedException>(() => reader.GetAwaiter().GetResult());
        }, pair);
    }

    [PseudoTerminalFact]
    public async Task After_a_serial_port_closes_the_master_still_works_for_the_next_port()
    {
        // The pair's own slave descriptor keeps the pty's slave side open between ports; without it a read on the
        // master fails with EIO once the last slave descriptor closes (Linux behaviour, from memory; this test fails
        // with errno 5 when the pair releases its descriptor).
        using var pair = new PseudoTerminalPair();
        await WithinHangBound(() =>
        {
            for (int round = 0; round < 2; round++)
            {
                using (SerialPort port = OpenPort(pair.SlavePath))
                {
                    pair.WriteMaster([0x55, (byte)round], 0, 2);
                    Assert.Equal(new byte[] { 0x55, (byte)round }, ReadExactly(port, 2));
                    port.Write([0xAA, (byte)round], 0, 2);
                    Assert.Equal(new byte[] { 0xAA, (byte)round }, ReadMasterExactly(pair, 2));
                }

                Assert.False(pair.TryReadMaster(new byte[8], 0, 8, NothingMoreMilliseconds, out int read), $"{read} bytes after the port closed");
            }
        }, pair);
    }

    [PseudoTerminalFact]
    public async Task TryReadMaster_with_nothing_sent_returns_false_and_zero_bytes()
    {
        using var pair = new PseudoTerminalPair();
        await WithinHangBound(() =>
        {
            Assert.False(pair.TryReadMaster(new byte[8], 0, 8, 0, out int read));
            Assert.Equal(0, read);
            Assert.False(pair.TryReadMaster(new byte[8], 2, 6, 20, out read));
            Assert.Equal(0, read);
            Assert.StartsWith("/dev/", pair.SlavePath, StringComparison.Ordinal);
            Assert.True(File.Exists(pair.SlavePath), pair.SlavePath);
        }, pair);
    }

    [PseudoTerminalFact]
    public async Task Opening_a_serial_port_on_a_path_that_does_not_exist_throws_UnauthorizedAccessException_with_the_errno_inside()
    {
        string path = Path.Combine(Path.GetTempPath(), "freqreadout-no-such-dir-" + Guid.NewGuid().ToString("N"), "tty");
        using var port = new SerialPort(path, 921600, Parity.None, 8, StopBits.One);
        await WithinHangBound(() =>
        {
            // Observed with System.IO.Ports 10.0.15 on Linux: "Access to the port '<path>' is denied." even for
            // ENOENT; the cause is the inner IOException, whose message is strerror's text. ENOENT is 2 (from memory,
            // Linux asm-generic/errno-base.h).
            var error = Assert.Throws<UnauthorizedAccessException>(port.Open);
            Assert.Contains(path, error.Message, StringComparison.Ordinal);
            IOException inner = Assert.IsType<IOException>(error.InnerException);
            Assert.Equal(Marshal.GetPInvokeErrorMessage(2), inner.Message);
            Assert.False(port.IsOpen);
        }, port);
    }

    /// <summary>
    /// 0x00 to 0xFF in order, then the values a cooked tty or a serial driver would act on, in the pairs it would act
    /// on: CR LF and LF CR (ICRNL, INLCR, IGNCR, ONLCR), XOFF XON (IXON), ^C ^\ ^Z ^D (ISIG, VEOF), DEL (VERASE),
    /// 0xFF 0xFF and 0xFF 0x00 (PARMRK's escape), NUL. Linux man-pages, termios(3).
    /// </summary>
    private static byte[] EveryByteValueAndTheSensitiveOnes()
    {
        var payload = new List<byte>();
        for (int value = 0; value <= 0xFF; value++)
        {
            payload.Add((byte)value);
        }

        payload.AddRange([0x0D, 0x0A, 0x0A, 0x0D, 0x13, 0x11, 0x03, 0x1C, 0x1A, 0x04, 0x7F, 0xFF, 0xFF, 0xFF, 0x00, 0x00]);
        return [.. payload];
    }

    private static SerialPort OpenPort(string path)
    {
        var port = new SerialPort(path, 921600, Parity.None, 8, StopBits.One)
        {
            Handshake = Handshake.None,
            ReadTimeout = PortTimeoutMilliseconds,
            WriteTimeout = PortTimeoutMilliseconds,
        };
        port.Open();
        return port;
    }

    /// <summary>Reads exactly <paramref name="count"/> bytes; a gap longer than the port's ReadTimeout throws TimeoutException.</summary>
    private static byte[] ReadExactly(SerialPort port, int count)
    {
        var received = new byte[count];
        int got = 0;
        while (got < count)
        {
            got += port.Read(received, got, count - got);
        }

        return received;
    }

    /// <summary>Reads exactly <paramref name="count"/> bytes from the master; fails on a gap longer than the port timeout.</summary>
    private static byte[] ReadMasterExactly(PseudoTerminalPair pair, int count)
    {
        var received = new byte[count];
        int got = 0;
        while (got < count)
        {
            Assert.True(
                pair.TryReadMaster(received, got, count - got, PortTimeoutMilliseconds, out int read),
                $"the master received {got} of {count} bytes, then nothing for {PortTimeoutMilliseconds} ms");
            got += read;
        }

        return received;
    }

    private static void AssertSameBytes(byte[] expected, byte[] actual)
    {
        Assert.Equal(expected.Length, actual.Length);
        int same = expected.AsSpan().CommonPrefixLength(actual);
        Assert.True(same == expected.Length, $"first difference at byte {same}: expected 0x{expected[Math.Min(same, expected.Length - 1)]:X2}, got 0x{actual[Math.Min(same, actual.Length - 1)]:X2}");
    }

    /// <summary>
    /// Runs <paramref name="work"/> on the thread pool and fails the test if it has not finished within
    /// <see cref="HangBound"/>; then disposes <paramref name="toRelease"/> (without waiting) to free the stuck thread.
    /// Exceptions and assertion failures of the work are rethrown as they are.
    /// </summary>
    private static async Task WithinHangBound(Action work, params IDisposable[] toRelease)
    {
        Task running = Task.Run(work);
        if (await Task.WhenAny(running, Task.Delay(HangBound)) != running)
        {
            _ = Task.Run(() =>
            {
                foreach (IDisposable resource in toRelease)
                {
                    resource.Dispose();
                }
            });
            Assert.Fail($"the test's work did not finish within {HangBound.TotalSeconds} s (a hang guard, not a speed check)");
        }

        await running;
    }
}
