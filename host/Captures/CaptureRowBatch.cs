namespace FreqReadout.Host.Captures;

/// <summary>
/// A batch of capture rows as parallel arrays, filled by <see cref="ICaptureBatchReader.ReadBatch"/> and read by the
/// counting loop without an iterator or a row object per edge. Rows <c>[0, Count)</c> are valid; the arrays are
/// allocated once and reused for every batch.
/// </summary>
public sealed class CaptureRowBatch
{
    /// <summary>Rows a batch holds unless told otherwise (320 KiB of arrays).</summary>
    public const int DefaultCapacity = 8192;

    /// <summary>Makes an empty batch.</summary>
    /// <param name="capacity">Most rows per batch, at least 1.</param>
    public CaptureRowBatch(int capacity = DefaultCapacity)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(capacity, 1);
        Ticks = new ulong[capacity];
        Counts = new ulong[capacity];
        LineNumbers = new long[capacity];
        TemperaturesC = new double[capacity];
        Array.Fill(TemperaturesC, double.NaN);
        Marks = new string?[capacity];
    }

    /// <summary>Raw (still wrapped) timer values.</summary>
    public ulong[] Ticks { get; }

    /// <summary>Raw cumulative counts (snapshots; 0 for edges).</summary>
    public ulong[] Counts { get; }

    /// <summary>1-based line (text) or record ordinal (binary) of each row, for messages.</summary>
    public long[] LineNumbers { get; }

    /// <summary>A new temperature sample, deg C, or NaN for none (NaN in every row of a batch without extras).</summary>
    public double[] TemperaturesC { get; }

    /// <summary>A mark, or null (null in every row of a batch without extras).</summary>
    public string?[] Marks { get; }

    /// <summary>Rows in the batch.</summary>
    public int Count { get; private set; }

    /// <summary>Most rows the batch holds.</summary>
    public int Capacity => Ticks.Length;

    /// <summary>True when the batch is full.</summary>
    public bool IsFull => Count == Ticks.Length;

    /// <summary>True when some row of the batch carries a temperature or a mark; false: every row is a bare tick (and count).</summary>
    public bool HasExtras { get; private set; }

    /// <summary>Empties the batch.</summary>
    public void Clear()
    {
        if (HasExtras)
        {
            // Only rows with extras write these two arrays: between such batches they stay NaN and null.
            Array.Clear(Marks, 0, Count);
            Array.Fill(TemperaturesC, double.NaN, 0, Count);
        }

        Count = 0;
        HasExtras = false;
    }

    /// <summary>Appends a bare row (no temperature, no mark); the caller checks <see cref="IsFull"/> first.</summary>
    public void AddTick(ulong tick, ulong count, long lineNumber)
    {
        int i = Count;
        Ticks[i] = tick;
        Counts[i] = count;
        LineNumbers[i] = lineNumber;
        Count = i + 1;
    }

    /// <summary>
    /// Takes rows [<see cref="Count"/>, <paramref name="count"/>) as bare rows that a reader wrote straight into
    /// <see cref="Ticks"/>, <see cref="Counts"/> and <see cref="LineNumbers"/> (no temperature, no mark).
    /// </summary>
    public void CommitBareRows(int count)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(count, Count);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(count, Capacity);
        Count = count;
    }

    /// <summary>Appends a row as a reader made it; the caller checks <see cref="IsFull"/> first.</summary>
    public void Add(in CaptureRow row)
    {
        AddTick(row.Tick, row.Count, row.LineNumber);
        if (row.TemperatureC is double t)
        {
            TemperaturesC[Count - 1] = t;
            HasExtras = true;
        }

        if (row.Mark != null)
        {
            Marks[Count - 1] = row.Mark;
            HasExtras = true;
        }
    }

    /// <summary>Row <paramref name="index"/> as a row object (for the per-row paths and messages).</summary>
    public CaptureRow RowAt(int index)
    {
        double t = TemperaturesC[index];
        return new CaptureRow(LineNumbers[index], Ticks[index], Counts[index], double.IsNaN(t) ? null : t, Marks[index]);
    }
}
