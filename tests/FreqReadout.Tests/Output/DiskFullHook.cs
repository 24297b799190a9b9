using FreqReadout.Host.Output;

namespace FreqReadout.Tests.Output;

/// <summary>
/// Injects "no space left on device" into the outputs of a command: after <see cref="AfterBytes"/>
/// bytes, every write (and the flush) of a matching output throws the IOException the runtime gives for
/// ENOSPC (HResult 28 on Unix, ERROR_DISK_FULL on Windows), as a disk filling up mid-run would.
/// </summary>
internal sealed class DiskFullHook : IOutputStreamHook
{
    public DiskFullHook(long afterBytes, string? onlyLabel = null)
    {
        AfterBytes = afterBytes;
        OnlyLabel = onlyLabel;
    }

    /// <summary>Bytes each matching output accepts before the disk is "full".</summary>
    public long AfterBytes { get; }

    /// <summary>Only the output with this label (e.g. "--truth") fails; null for every output.</summary>
    public string? OnlyLabel { get; }

    /// <summary>Labels of the outputs that hit the full disk.</summary>
    public List<string> Failed { get; } = new();

    public Stream Wrap(OutputFile file, Stream stream) =>
        OnlyLabel == null || file.Label == OnlyLabel ? new FullStream(this, file.Label, stream) : stream;

    /// <summary>The exception the runtime throws when the disk is full.</summary>
    public static IOException DiskFull() =>
        new("No space left on device (injected by the test)", OperatingSystem.IsWindows() ? unchecked((int)0x80070070) : 28);

    private sealed class FullStream : WriteOnlyStream
    {
        private readonly DiskFullHook _hook;
        private readonly string _label;
        private readonly Stream _inner;
        private long _written;

        public FullStream(DiskFullHook hook, string label, Stream inner)
        {
            _hook = hook;
            _label = label;
            _inner = inner;
        }

        public override long BytesWritten => _written;

        public override void Write(ReadOnlySpan<byte> buffer)
        {
            long room = Math.Max(0, _hook.AfterBytes - _written);
            if (buffer.Length > room)
            {
                _inner.Write(buffer.Slice(0, (int)room));
                _written += room;
                Fail();
            }

            _inner.Write(buffer);
            _written += buffer.Length;
        }

        public override void Flush()
        {
            if (_written >= _hook.AfterBytes && _hook.Failed.Contains(_label))
            {
                Fail();
            }

            _inner.Flush();
        }

        private void Fail()
        {
            if (!_hook.Failed.Contains(_label))
            {
                _hook.Failed.Add(_label);
            }

            throw DiskFull();
        }
    }
}
