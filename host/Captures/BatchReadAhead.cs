using System.Collections.Concurrent;
using System.Runtime.ExceptionServices;

namespace FreqReadout.Host.Captures;

/// <summary>
/// Reads batches on a second thread while the caller counts the previous ones (parsing and counting overlapped).
/// A fixed pool of batches circulates: none is allocated after the start, and at most <c>depth</c> are read ahead.
/// The rows, their order and the point where a reader error is raised are those of calling
/// <see cref="ICaptureBatchReader.ReadBatch"/> directly: an error comes after every batch read before it.
/// </summary>
internal sealed class BatchReadAhead : IDisposable
{
    private readonly ICaptureBatchReader _reader;
    private readonly BlockingCollection<CaptureRowBatch> _free = new();
    private readonly BlockingCollection<CaptureRowBatch?> _full;
    private readonly CancellationTokenSource _stop = new();
    private readonly Thread _thread;
    private ExceptionDispatchInfo? _error;
    private CaptureRowBatch? _current;
    private bool _ended;

    /// <summary>Starts reading <paramref name="reader"/> into <paramref name="first"/> and <paramref name="depth"/> - 1 more batches like it.</summary>
    public BatchReadAhead(ICaptureBatchReader reader, CaptureRowBatch first, int depth = 3)
    {
        _reader = reader;
        _free.Add(first);
        for (int i = 1; i < depth; i++)
        {
            _free.Add(new CaptureRowBatch(first.Capacity));
        }

        _full = new BlockingCollection<CaptureRowBatch?>(depth + 1);
        _thread = new Thread(Produce) { IsBackground = true, Name = "capture read-ahead" };
        _thread.Start();
    }

    /// <summary>True when a second thread is worth starting (more than one processor).</summary>
    public static bool Pays => Environment.ProcessorCount > 1;

    /// <summary>The next batch (the previous one goes back to the pool), or null at the end; raises the reader's error where it occurred.</summary>
    public CaptureRowBatch? Next()
    {
        if (_current != null)
        {
            _free.Add(_current);
            _current = null;
        }

        if (_ended)
        {
            return null;
        }

        CaptureRowBatch? batch = _full.Take();
        if (batch == null)
        {
            _ended = true;
            _thread.Join();
            _error?.Throw();
            return null;
        }

        _current = batch;
        return batch;
    }

    /// <summary>Stops the reading thread (waits for the batch it is reading).</summary>
    public void Dispose()
    {
        _stop.Cancel();
        _thread.Join();
        _stop.Dispose();
    }

    private void Produce()
    {
        try
        {
            while (true)
            {
                CaptureRowBatch batch = _free.Take(_stop.Token);
                bool more;
                try
                {
                    more = _reader.ReadBatch(batch);
                }
                catch (Exception e)
                {
                    _error = ExceptionDispatchInfo.Capture(e);
                    _full.Add(null);
                    return;
                }

                _full.Add(more ? batch : null);
                if (!more)
                {
                    return;
                }
            }
        }
        catch (OperationCanceledException)
        {
            // The consumer stopped early (an error downstream, or Ctrl+C): nothing more to read.
        }
    }
}
