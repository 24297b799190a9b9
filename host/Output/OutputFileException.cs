namespace FreqReadout.Host.Output;

/// <summary>
/// An output that cannot be used or written: the message is the one line a user sees (it names the
/// path, what the file was for, why, and what became of the file). An <see cref="IOException"/>, so a
/// command that does not catch it still ends with that line and exit code 1.
/// </summary>
public sealed class OutputFileException : IOException
{
    /// <summary>Exit code of an output that clashes with an input or another output (the command line is wrong).</summary>
    public const int UsageExitCode = 2;

    /// <summary>Exit code of an output the file system refuses (missing folder, a directory, a full disk, ...).</summary>
    public const int FileExitCode = 1;

    public OutputFileException(string message, int exitCode, Exception? inner = null)
        : base(message, inner)
    {
        ExitCode = exitCode;
    }

    /// <summary>The exit code the command should end with: <see cref="UsageExitCode"/> or <see cref="FileExitCode"/>.</summary>
    public int ExitCode { get; }
}
