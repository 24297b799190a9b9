namespace FreqReadout.Host.Captures;

/// <summary>
/// A capture writer that also takes edge rows in batches (the simulator's fast path): one call per batch instead of one
/// <see cref="ICaptureWriter.WriteRow"/> per row. The rows are exactly what the same rows written one by one would give
/// (count 0, no mark), with the same checks and errors.
/// </summary>
public interface IEdgeBatchWriter
{
    /// <summary>
    /// Appends <c>ticks.Length</c> edge rows: tick <c>ticks[i]</c>, and a temperature sample <c>temperaturesC[i]</c> where it
    /// is not NaN (NaN = no sample on that row). <paramref name="firstRowNumber"/> numbers the first row for messages.
    /// </summary>
    /// <exception cref="ArgumentException">A row the capture cannot hold (as <see cref="ICaptureWriter.WriteRow"/>); the
    /// rows before it are written.</exception>
    void WriteEdges(ReadOnlySpan<ulong> ticks, ReadOnlySpan<double> temperaturesC, long firstRowNumber);
}
