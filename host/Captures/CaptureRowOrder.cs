namespace FreqReadout.Host.Captures;

/// <summary>
/// The order rules every reader and writer applies to consecutive rows: with a 64-bit timer ticks
/// strictly increase; with a 64-bit counter the cumulative count never decreases. Narrower timers
/// and counters wrap, so their steps are judged by the unwrapper (<c>CaptureGateSource</c>).
/// </summary>
internal sealed class CaptureRowOrder
{
    private readonly bool _strictTicks;
    private readonly bool _monotonicCounts;
    private bool _haveLast;
    private ulong _lastTick;
    private ulong _lastCount;
    private long _lastLine;

    public CaptureRowOrder(CaptureMetadata md)
    {
        _strictTicks = md.TimerBits == 64;
        _monotonicCounts = md.Kind == CaptureKind.Snapshots && md.CountBits == 64;
    }

    /// <summary>True when <see cref="Check"/> can refuse a row (a 64-bit timer, or a 64-bit counter of snapshots).</summary>
    public bool ChecksOrder => _strictTicks || _monotonicCounts;

    /// <summary>Checks the next row; returns the problem (what was expected) or null, and remembers the row when it is good.</summary>
    /// <param name="row">The row.</param>
    /// <param name="where">"line" (text) or "row" (binary ordinal), for the message.</param>
    public string? Check(in CaptureRow row, string where)
    {
        if (_haveLast)
        {
            if (_strictTicks && row.Tick <= _lastTick)
            {
                return $"expected a tick greater than {_lastTick} ({where} {_lastLine}): with timer_bits = 64 ticks strictly increase, found {row.Tick}";
            }

            if (_monotonicCounts && row.Count < _lastCount)
            {
                return $"expected a count of at least {_lastCount} ({where} {_lastLine}): with count_bits = 64 the cumulative count never decreases, found {row.Count}";
            }
        }

        _haveLast = true;
        _lastTick = row.Tick;
        _lastCount = row.Count;
        _lastLine = row.LineNumber;
        return null;
    }
}
