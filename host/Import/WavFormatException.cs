namespace FreqReadout.Host.Import;

/// <summary>A WAVE file that cannot be read; the message names the file, the byte offset and what was expected.</summary>
public sealed class WavFormatException : Exception
{
    /// <summary>An exception with a one-line message.</summary>
    public WavFormatException(string message)
        : base(message)
    {
    }
}
