namespace FreqReadout.Host.Captures;

/// <summary>
/// One header line as it stood in a capture, before the column header: a <c># key = value</c> line
/// (<see cref="Key"/> set) or a comment (<see cref="Comment"/> set: the text after <c>#</c>, untrimmed).
/// Kept so that a capture is written back in its own order, comments included (lossless convert).
/// </summary>
/// <param name="Key">The metadata key of a <c># key = value</c> line, or null for a comment.</param>
/// <param name="Comment">The comment text after <c>#</c> (no <c>=</c>, no line break), or null for a key line.</param>
public readonly record struct CaptureHeaderLine(string? Key, string? Comment)
{
    /// <summary>A <c># key = value</c> line; its value comes from the metadata.</summary>
    public static CaptureHeaderLine ForKey(string key) => new(key, null);

    /// <summary>A comment line: <c>#</c> followed by <paramref name="text"/>.</summary>
    public static CaptureHeaderLine ForComment(string text) => new(null, text);

    /// <summary>True for a comment line.</summary>
    public bool IsComment => Key is null;
}
