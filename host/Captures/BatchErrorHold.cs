using System.Runtime.ExceptionServices;

namespace FreqReadout.Host.Captures;

/// <summary>
/// What the batch readers share about errors: a batch that fails part-way hands over the rows before the bad one
/// first, and the error is raised by the next call, as the row-by-row reader (<c>ReadRows</c>) would raise it.
/// </summary>
internal sealed class BatchErrorHold
{
    private ExceptionDispatchInfo? _pending;

    /// <summary>Raises the error held from the last batch, if any (once).</summary>
    public void ThrowIfHeld()
    {
        ExceptionDispatchInfo? error = _pending;
        if (error != null)
        {
            _pending = null;
            error.Throw();
        }
    }

    /// <summary>
    /// Runs <paramref name="fill"/> on the batch; a capture-format or I/O error after some rows were added is held for
    /// the next call (<see cref="ThrowIfHeld"/>), one before any row propagates at once.
    /// </summary>
    /// <returns>True when the batch holds rows.</returns>
    public bool Fill(CaptureRowBatch batch, Action<CaptureRowBatch> fill)
    {
        try
        {
            fill(batch);
        }
        catch (Exception e) when (batch.Count > 0 && e is CaptureFormatException or IOException)
        {
            _pending = ExceptionDispatchInfo.Capture(e);
        }

        return batch.Count > 0;
    }
}
