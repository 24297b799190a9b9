namespace FreqReadout.Host.Recording;

/// <summary>A link channel could not be opened; the message is one line that names the port and why.</summary>
public sealed class LinkChannelException : IOException
{
    /// <summary>An exception with a one-line message.</summary>
    public LinkChannelException(string message, Exception? inner = null)
        : base(message, inner)
    {
    }
}
