namespace FreqReadout.Host.Captures;

/// <summary>
/// A capture reader that can also hand its rows over in batches (<see cref="CaptureRowBatch"/>), the fast path of
/// replay and count. A reader streams its rows once: either through <see cref="ICaptureReader.ReadRows"/> or through
/// <see cref="ReadBatch"/>, never both. Rows, line numbers, errors and warnings are the same either way.
/// </summary>
public interface ICaptureBatchReader : ICaptureReader
{
    /// <summary>
    /// Empties <paramref name="batch"/> and fills it with the next rows. A malformed row ends the batch before it: the
    /// rows before it are returned first, and the <see cref="CaptureFormatException"/> (or I/O error) is thrown by
    /// the next call, so a consumer sees every good row before the error, as with <see cref="ICaptureReader.ReadRows"/>.
    /// </summary>
    /// <returns>False when the capture has no more rows (the batch is then empty and the trailer complete).</returns>
    bool ReadBatch(CaptureRowBatch batch);
}
