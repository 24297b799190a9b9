namespace FreqReadout.Host.Output;

/// <summary>How an <see cref="OutputFile"/> writes a regular file (devices, pipes and standard output are always written directly).</summary>
public enum OutputWriteMode
{
    /// <summary>
    /// The default for every command: the bytes go to a temporary file beside the target, which is
    /// flushed to disk and moved into place only when the whole command succeeded; on failure only
    /// the temporary file is deleted, so an existing file is never truncated or left half-written.
    /// </summary>
    ReplaceOnSuccess,

    /// <summary>
    /// A recording as data arrives (a serial <c>record</c>): the target is created in place (an
    /// existing file is refused, never overwritten), rows reach it as they are written, and on
    /// failure or interruption the partial file is kept — it holds everything received so far, and
    /// <c>convert --salvage</c> rescues a recording cut mid-row.
    /// </summary>
    Recording,
}
