namespace FreqReadout.Host.Captures;

/// <summary>
/// Hides a reader's batch interface, so counting reads it row by row through <see cref="ICaptureReader.ReadRows"/>:
/// the path kept as the oracle of the batch path (see <see cref="CaptureFile.RowByRowReading"/>).
/// </summary>
internal sealed class RowByRowCaptureReader : ICaptureReader
{
    /// <summary>Wraps <paramref name="inner"/> (owned: disposed with this reader).</summary>
    public RowByRowCaptureReader(ICaptureReader inner)
    {
        Inner = inner;
    }

    /// <summary>The wrapped reader.</summary>
    public ICaptureReader Inner { get; }

    /// <inheritdoc/>
    public string SourceName => Inner.SourceName;

    /// <inheritdoc/>
    public CaptureMetadata Metadata => Inner.Metadata;

    /// <inheritdoc/>
    public IReadOnlyList<string> Warnings => Inner.Warnings;

    /// <inheritdoc/>
    public IReadOnlyList<KeyValuePair<string, string>> Trailer => Inner.Trailer;

    /// <inheritdoc/>
    public IEnumerable<CaptureRow> ReadRows() => Inner.ReadRows();

    /// <inheritdoc/>
    public void Dispose() => Inner.Dispose();
}
