using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Bench;

/// <summary>
/// A capture held in memory for the bench: the simulator writes its rows here (<see cref="ICaptureWriter"/>), and
/// <see cref="OpenReader"/> replays them as an <see cref="ICaptureReader"/>, so a bench scene goes through the same
/// <c>CaptureGateSource</c> and <c>ReplaySession</c> as a capture file would, without touching the disk. Ticks (and, for
/// snapshots, counts) are kept in chunks of 2^20 values: 8 bytes a row (16 for snapshots), no temperatures or marks.
/// </summary>
public sealed class MemoryCapture : ICaptureWriter
{
    private const int ChunkBits = 20;
    private const int ChunkSize = 1 << ChunkBits;
    private readonly List<ulong[]> _ticks = new();
    private readonly List<ulong[]>? _counts;
    private IReadOnlyList<KeyValuePair<string, string>> _trailer = Array.Empty<KeyValuePair<string, string>>();
    private bool _completed;

    /// <summary>An empty capture with the metadata the rows will be read with.</summary>
    public MemoryCapture(CaptureMetadata metadata, string sourceName)
    {
        Metadata = metadata;
        SourceName = sourceName;
        if (metadata.Kind == CaptureKind.Snapshots)
        {
            _counts = new List<ulong[]>();
        }
    }

    /// <summary>The metadata the capture was opened with.</summary>
    public CaptureMetadata Metadata { get; }

    /// <summary>The name used in messages.</summary>
    public string SourceName { get; }

    /// <summary>Rows written.</summary>
    public long Rows { get; private set; }

    /// <summary>Raw tick of row <paramref name="index"/> (0-based), as written (still wrapped).</summary>
    public ulong TickAt(long index) => _ticks[(int)(index >> ChunkBits)][index & (ChunkSize - 1)];

    /// <summary>Raw count of row <paramref name="index"/> (snapshots; 0 for edges).</summary>
    public ulong CountAt(long index) => _counts is null ? 0 : _counts[(int)(index >> ChunkBits)][index & (ChunkSize - 1)];

    /// <summary>Appends a row's tick (and count); temperature and mark are not kept (bench scenes have none).</summary>
    public void WriteRow(in CaptureRow row)
    {
        if (_completed)
        {
            throw new InvalidOperationException("a row after Complete");
        }

        int chunk = (int)(Rows >> ChunkBits);
        int at = (int)(Rows & (ChunkSize - 1));
        if (chunk == _ticks.Count)
        {
            _ticks.Add(new ulong[ChunkSize]);
            _counts?.Add(new ulong[ChunkSize]);
        }

        _ticks[chunk][at] = row.Tick;
        if (_counts is not null)
        {
            _counts[chunk][at] = row.Count;
        }

        Rows++;
    }

    /// <summary>Keeps the trailer; no row may follow.</summary>
    public void Complete(IReadOnlyList<KeyValuePair<string, string>> trailer)
    {
        _trailer = trailer;
        _completed = true;
    }

    /// <summary>Nothing to release.</summary>
    public void Dispose()
    {
    }

    /// <summary>A reader over the rows written (each call a fresh one; rows numbered from 1).</summary>
    public ICaptureReader OpenReader() => new Reader(this);

    private sealed class Reader : ICaptureReader
    {
        private readonly MemoryCapture _capture;

        public Reader(MemoryCapture capture) => _capture = capture;

        public string SourceName => _capture.SourceName;

        public CaptureMetadata Metadata => _capture.Metadata;

        public IReadOnlyList<string> Warnings { get; } = Array.Empty<string>();

        public IReadOnlyList<KeyValuePair<string, string>> Trailer => _capture._trailer;

        public IEnumerable<CaptureRow> ReadRows()
        {
            long n = _capture.Rows;
            for (long i = 0; i < n; i++)
            {
                yield return new CaptureRow(i + 1, _capture.TickAt(i), _capture.CountAt(i), null, null);
            }
        }

        public void Dispose()
        {
        }
    }
}
