using Spectre.Console;

namespace FreqReadout.Host.Commands;

/// <summary>Prints a user error (setting or file named, with the allowed range) to stderr; commands then return 2.</summary>
internal static class CommandErrors
{
    public const int UsageError = 2;

    /// <summary>Writes "error: ..." as one plain line to stderr (never wrapped at the console width) and returns <see cref="UsageError"/>.</summary>
    public static int Fail(string message)
    {
        Console.Error.WriteLine("error: " + message);
        return UsageError;
    }

    /// <summary>A console over the current <see cref="Console.Out"/> (not the cached static one, so redirection is honoured).</summary>
    public static IAnsiConsole Stdout() => AnsiConsole.Create(new AnsiConsoleSettings { Out = new AnsiConsoleOutput(Console.Out) });

    public static IAnsiConsole Stderr() => AnsiConsole.Create(new AnsiConsoleSettings { Out = new AnsiConsoleOutput(Console.Error) });
}
