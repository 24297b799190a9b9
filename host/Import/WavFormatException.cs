namespace FreqReadout.Host.Import;

/// <summary>A WAVE file that cannot be read; the message names the file, the byte offset and what was expected.</summary>
public sealed class WavFormatException : Exception
{
    /// <summary>An exception with a one-line message.</summary>
    public WavFormatException(string message)
        : base(message)
    {
    }

    /// <summary>An exception about the options asked for rather than the file (a channel it does not have).</summary>
    public WavFormatException(string message, bool optionOutOfRange)
        : base(message)
    {
        OptionOutOfRange = optionOutOfRange;
    }

    /// <summary>True when an option is out of range for this file (a usage problem, exit code 2).</summary>
    public bool OptionOutOfRange { get; }
}
