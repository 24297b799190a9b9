namespace FreqReadout.Host.Captures;

/// <summary>A streaming capture writer (text or binary). Call <see cref="Complete"/> once at the end; nothing is lost on Dispose after Complete.</summary>
public interface ICaptureWriter : IDisposable
{
    /// <summary>Appends one data row.</summary>
    void WriteRow(in CaptureRow row);

    /// <summary>Writes the trailer metadata and flushes.</summary>
    void Complete(IReadOnlyList<KeyValuePair<string, string>> trailer);
}
