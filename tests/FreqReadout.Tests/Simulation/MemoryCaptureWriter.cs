using FreqReadout.Host.Captures;

namespace FreqReadout.Tests.Simulation;

/// <summary>Test fake: keeps rows in memory (or only counts them when <c>keep</c> is false).</summary>
internal sealed class MemoryCaptureWriter : ICaptureWriter
{
    private readonly bool _keep;

    public MemoryCaptureWriter(bool keep = true)
    {
        _keep = keep;
    }

    public List<CaptureRow> Rows { get; } = new();

    public long RowCount { get; private set; }

    public ulong LastTick { get; private set; }

    public bool Completed { get; private set; }

    public IReadOnlyList<KeyValuePair<string, string>> Trailer { get; private set; } = Array.Empty<KeyValuePair<string, string>>();

    public void WriteRow(in CaptureRow row)
    {
        if (Completed)
        {
            throw new InvalidOperationException("row after Complete");
        }

        RowCount++;
        LastTick = row.Tick;
        if (_keep)
        {
            Rows.Add(row);
        }
    }

    public void Complete(IReadOnlyList<KeyValuePair<string, string>> trailer)
    {
        Completed = true;
        Trailer = trailer;
    }

    public void Dispose()
    {
    }
}
