using Spectre.Console;

namespace FreqReadout.Host.Commands;

/// <summary>
/// Where commands write: tables and text through a Spectre console over <see cref="Console.Out"/>
/// as it is at the moment of the call, JSON straight to <see cref="Console.Out"/>, diagnostics and
/// errors to <see cref="Console.Error"/>. Tests capture everything with Console.SetOut / SetError.
/// </summary>
public static class CommandOutput
{
    /// <summary>Exit code of a malformed or missing capture file.</summary>
    public const int BadInput = 1;

    /// <summary>Exit code of an invalid option value.</summary>
    public const int BadOption = 2;

    /// <summary>A Spectre console writing to the current <see cref="Console.Out"/> (plain text when redirected).</summary>
    public static IAnsiConsole Stdout()
    {
        return AnsiConsole.Create(new AnsiConsoleSettings
        {
            Out = new AnsiConsoleOutput(Console.Out),
        });
    }

    /// <summary>Writes one diagnostic line to stderr (no markup).</summary>
    public static void Diagnostic(string text)
    {
        Console.Error.WriteLine(text);
    }

    /// <summary>Writes "error: ..." to stderr and returns <paramref name="exitCode"/>.</summary>
    public static int Fail(string message, int exitCode)
    {
        Console.Error.WriteLine("error: " + message);
        return exitCode;
    }
}
