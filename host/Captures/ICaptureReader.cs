namespace FreqReadout.Host.Captures;

/// <summary>
/// A streaming capture reader (text or binary). Metadata is available after opening; rows stream
/// (a capture larger than memory replays); trailer metadata is complete once <see cref="ReadRows"/>
/// has been enumerated to the end. Malformed input throws <see cref="CaptureFormatException"/>.
/// </summary>
public interface ICaptureReader : IDisposable
{
    /// <summary>The file (or stream) name used in messages.</summary>
    string SourceName { get; }

    /// <summary>Header metadata.</summary>
    CaptureMetadata Metadata { get; }

    /// <summary>Warnings met so far (for example a beat_side given for a search capture, or a fast-wrapping timer).</summary>
    IReadOnlyList<string> Warnings { get; }

    /// <summary>Trailer <c># key = value</c> lines after the data rows, in file order; complete after the rows are read.</summary>
    IReadOnlyList<KeyValuePair<string, string>> Trailer { get; }

    /// <summary>Streams the data rows once.</summary>
    IEnumerable<CaptureRow> ReadRows();
}
