namespace FreqReadout.Host.Commands;

/// <summary>
/// Standard input as a capture source: <c>-</c> on the command line. The shell's <c>-</c> reaches the command as
/// <see cref="InputToken"/> (Spectre.Console.Cli reads a bare <c>-</c> as an option), which names the stream in messages too.
/// </summary>
public static class StandardStreams
{
    /// <summary>What a bare <c>-</c> argument becomes, and the source name of standard input in messages.</summary>
    public const string InputToken = "<stdin>";

    /// <summary>Opens standard input as bytes (tests replace it to feed a capture).</summary>
    public static Func<Stream> OpenInput { get; set; } = Console.OpenStandardInput;

    /// <summary>True when <paramref name="path"/> means standard input.</summary>
    public static bool IsInput(string? path) => path == InputToken;

    /// <summary>The command line with each bare <c>-</c> replaced by <see cref="InputToken"/>.</summary>
    public static string[] MapArguments(string[] args)
    {
        var mapped = (string[])args.Clone();
        for (int i = 0; i < mapped.Length; i++)
        {
            if (mapped[i] == "-")
            {
                mapped[i] = InputToken;
            }
        }

        return mapped;
    }
}
