namespace FreqReadout.Host.Commands;

/// <summary>A usage error found while the command line is bound (an empty path, standard input where it cannot be used); exit code <see cref="ExitCodes.Usage"/>.</summary>
public sealed class CommandLineException : Exception
{
    /// <summary>Creates the exception; <paramref name="message"/> is shown after "error: ".</summary>
    public CommandLineException(string message)
        : base(message)
    {
    }
}
