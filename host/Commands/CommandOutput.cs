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
    /// <summary>Exit code of a data problem: a malformed, missing or unusable input, an output that cannot be written (<see cref="ExitCodes.DataError"/>).</summary>
    public const int BadInput = ExitCodes.DataError;

    /// <summary>Exit code of a usage problem: an invalid option value (<see cref="ExitCodes.Usage"/>).</summary>
    public const int BadOption = ExitCodes.Usage;

    /// <summary>
    /// Whether stderr is an interactive terminal, where progress bars and status lines belong; redirected to a
    /// file or a pipe they would only fill it. Tests replace it.
    /// </summary>
    public static Func<bool> ErrorIsTerminal { get; set; } = () => !Console.IsErrorRedirected;

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
        // Progress and status displays are only started when ErrorIsTerminal says so: render them live then.
        return AnsiConsole.Create(new AnsiConsoleSettings
        {
            Out = new AnsiConsoleOutput(Console.Error),
            Interactive = ErrorIsTerminal() ? InteractionSupport.Yes : InteractionSupport.Detect,
            Ansi = ErrorIsTerminal() ? AnsiSupport.Yes : AnsiSupport.Detect,
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
        if (string.IsNullOrWhiteSpace(path))
        {
            return Fail("the capture path is empty: expected a file name (or - for standard input)", BadOption);
        }

        try
        {
            reader = StandardStreams.IsInput(path)
                ? CaptureFile.Open(StandardStreams.OpenInput(), StandardStreams.InputToken)
                : CaptureFile.Open(path);
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

    /// <summary>
    /// Prepares a capture's replay through the counters (<see cref="FreqReadout.Host.Counting.CaptureGateSource"/>), which
    /// checks the options against the capture and the capture's first rows against its metadata; on failure writes
    /// the one-line error and gives the exit code (usage for an option that does not suit the capture, data error
    /// for a capture whose data contradict its metadata).
    /// </summary>
    /// <returns>0 with <paramref name="source"/> set, or the exit code with it null.</returns>
    public static int TryCreateGateSource(
        ICaptureReader reader,
        FreqReadout.Counting.CounterSettings options,
        CounterOptionSettings given,
        double? searchHz,
        out FreqReadout.Host.Counting.CaptureGateSource? source)
    {
        source = null;
        try
        {
            source = new FreqReadout.Host.Counting.CaptureGateSource(reader, options, searchHz, given.NoSignalSeconds != null);
            return 0;
        }
        catch (ArgumentException e)
        {
            return Fail(e.Message, BadOption);
        }
        catch (CaptureFormatException e)
        {
            return Fail(e.Message, BadInput);
        }
    }

    /// <summary>The format of an opened capture.</summary>
    public static CaptureFileFormat FormatOf(ICaptureReader reader) =>
        reader is RowByRowCaptureReader wrapped ? FormatOf(wrapped.Inner)
        : reader is BinaryCaptureReader ? CaptureFileFormat.Binary : CaptureFileFormat.Text;
}
