using System.Runtime.CompilerServices;
using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// Collects the simulator's edge rows (tick, and a temperature sample or NaN) and hands them on in batches of
/// <see cref="Capacity"/>: one <see cref="IEdgeBatchWriter.WriteEdges"/> call per batch when the writer takes batches
/// (the text writer formats them straight into bytes), otherwise one <see cref="ICaptureWriter.WriteRow"/> per row.
/// Rows are numbered from 1 in the order added. Call <see cref="Flush"/> before completing the writer.
/// </summary>
internal sealed class EdgeRowBatch
{
    /// <summary>Rows held before they are handed on.</summary>
    public const int Capacity = 4096;

    private readonly ICaptureWriter _writer;
    private readonly IEdgeBatchWriter? _batchWriter;
    private readonly ulong[] _ticks = new ulong[Capacity];
    private readonly double[] _temperaturesC = new double[Capacity];
    private int _count;
    private long _firstRow = 1;

    public EdgeRowBatch(ICaptureWriter writer)
    {
        _writer = writer;
        _batchWriter = writer as IEdgeBatchWriter;
    }

    /// <summary>Adds a row: its tick and a temperature sample (NaN for none).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Add(ulong tick, double temperatureC)
    {
        _ticks[_count] = tick;
        _temperaturesC[_count] = temperatureC;
        if (++_count == Capacity)
        {
            Flush();
        }
    }

    /// <summary>Hands the rows held to the writer.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Flush()
    {
        if (_count == 0)
        {
            return;
        }

        if (_batchWriter is not null)
        {
            _batchWriter.WriteEdges(_ticks.AsSpan(0, _count), _temperaturesC.AsSpan(0, _count), _firstRow);
        }
        else
        {
            for (int i = 0; i < _count; i++)
            {
                double t = _temperaturesC[i];
                _writer.WriteRow(new CaptureRow(_firstRow + i, _ticks[i], 0, double.IsNaN(t) ? null : t, null));
            }
        }

        _firstRow += _count;
        _count = 0;
    }
}
