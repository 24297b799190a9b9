namespace FreqReadout.Host.Import;

/// <summary>A value change dump that cannot be read; the message names the file, the line and what was expected.</summary>
public sealed class VcdFormatException : Exception
{
    /// <summary>An exception with a one-line message.</summary>
    public VcdFormatException(string message)
        : base(message)
    {
    }
}
