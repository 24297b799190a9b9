namespace FreqReadout.Host.Captures;

/// <summary>A header line ready to write: a key with its value, or a comment (key null).</summary>
internal readonly record struct CaptureHeaderEntry(string? Key, string Text);
