namespace FreqReadout.Host.Captures;

/// <summary>A malformed capture: names the source, the line (or block) and what was expected.</summary>
public sealed class CaptureFormatException : Exception
{
    public CaptureFormatException(string sourceName, long lineNumber, string problem)
        : base($"{sourceName}:{lineNumber}: {problem}")
    {
        SourceName = sourceName;
        LineNumber = lineNumber;
        Problem = problem;
    }

    /// <summary>File or stream name.</summary>
    public string SourceName { get; }

    /// <summary>1-based line number (text) or block number (binary); 0 when the problem is the whole file.</summary>
    public long LineNumber { get; }

    /// <summary>What was wrong and what was expected.</summary>
    public string Problem { get; }
}
