using FreqReadout.Firmware.Ports;
using FreqReadout.Host.Captures;

namespace FreqReadout.Tests.Link;

/// <summary>Test fake of the pulse counter: hands out the rows of a snapshots capture one read at a time, as the board would read them.</summary>
internal sealed class RowPulseCounter : IPulseCounterPort
{
    private readonly IReadOnlyList<CaptureRow> _rows;
    private int _next;

    public RowPulseCounter(IReadOnlyList<CaptureRow> rows)
    {
        _rows = rows;
    }

    public bool Done => _next >= _rows.Count;

    public bool TryReadSnapshot(out ulong count, out ulong timeTicks)
    {
        if (Done)
        {
            count = 0;
            timeTicks = 0;
            return false;
        }

        count = _rows[_next].Count;
        timeTicks = _rows[_next].Tick;
        _next++;
        return true;
    }
}
