namespace FreqReadout.Host.Captures;

/// <summary>
/// One data row of a capture, as recorded: the raw (still wrapped) timer value, for snapshots the raw
/// (still wrapped) cumulative count, an optional temperature sample and an optional mark.
/// </summary>
/// <param name="LineNumber">1-based line (text) or record ordinal (binary) the row came from, for messages.</param>
/// <param name="Tick">Raw timer value, below 2^timer_bits.</param>
/// <param name="Count">Raw cumulative pulse count (snapshots; 0 for edges).</param>
/// <param name="TemperatureC">A new temperature sample, or null.</param>
/// <param name="Mark">A mark (<c>rebaseline</c>, <c>hold</c>, <c>release</c> or free text), or null.</param>
public readonly record struct CaptureRow(long LineNumber, ulong Tick, ulong Count, double? TemperatureC, string? Mark);
