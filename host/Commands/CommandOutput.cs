using FreqReadout.Host.Captures;
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

    /// <summary>A Spectre console writing to the current <see cref="Console.Error"/> (progress and status displays).</summary>
    public static IAnsiConsole Stderr()
    {
        return AnsiConsole.Create(new AnsiConsoleSettings
        {
            Out = new AnsiConsoleOutput(Console.Error),
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

    /// <summary>
    /// Opens a capture (text or binary, by content) for a command; on failure writes the one-line
    /// error ("file:line: what was expected", or why the file cannot be opened) and gives the exit code.
    /// </summary>
    /// <returns>0 with <paramref name="reader"/> set, or <see cref="BadInput"/> with it null.</returns>
    public static int TryOpenCapture(string path, out ICaptureReader? reader)
    {
        reader = null;
        try
        {
            reader = CaptureFile.Open(path);
            return 0;
        }
        catch (CaptureFormatException e)
        {
            return Fail(e.Message, BadInput);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            return Fail($"{path}: cannot open the capture: {FileErrorText.Reason(path, e)}", BadInput);
        }
    }

    /// <summary>The format of an opened capture.</summary>
    public static CaptureFileFormat FormatOf(ICaptureReader reader) =>
        reader is BinaryCaptureReader ? CaptureFileFormat.Binary : CaptureFileFormat.Text;
}
