namespace FreqReadout.Host.Commands;

/// <summary>
/// The exit codes of every <c>freqreadout</c> command: one table (docs/exit-codes.md), the same meaning everywhere.
/// </summary>
public static class ExitCodes
{
    /// <summary>The command did what was asked.</summary>
    public const int Ok = 0;

    /// <summary>
    /// A data problem: an input that cannot be read or is not valid (a malformed, empty or damaged capture, one
    /// too short for a gate, one whose data contradict its metadata, a bad scene file), or an output that cannot
    /// be written. The message names the file (and line, block or JSON path) and what was expected.
    /// </summary>
    public const int DataError = 1;

    /// <summary>
    /// A usage problem: the command line itself (an unknown command or option, a missing argument or value, a
    /// value out of its range or of the wrong kind, options that conflict, a value that does not suit this
    /// capture). Bare <c>freqreadout</c> prints the help and exits with this code too.
    /// </summary>
    public const int Usage = 2;

    /// <summary>A bug in freqreadout (an unexpected exception); FREQREADOUT_TRACE=1 shows the stack trace.</summary>
    public const int Bug = 70;

    /// <summary>Interrupted (Ctrl+C): 128 + SIGINT, as shells report it.</summary>
    public const int Interrupted = 130;
}
