using FreqReadout.Host;

namespace FreqReadout.Tests.Commands;

/// <summary>Commands write through Console.Out / Console.Error; tests that swap them run alone in this collection.</summary>
[CollectionDefinition(Name, DisableParallelization = true)]
public sealed class ConsoleCollection
{
    public const string Name = "Console output";
}

/// <summary>Runs the CLI in-process through <see cref="Program.BuildApp"/>, capturing stdout and stderr.</summary>
internal static class ConsoleCapture
{
    public static (int Exit, string Out, string Err) Run(params string[] args)
    {
        var savedOut = Console.Out;
        var savedErr = Console.Error;
        var stdout = new StringWriter { NewLine = "\n" };
        var stderr = new StringWriter { NewLine = "\n" };
        try
        {
            Console.SetOut(stdout);
            Console.SetError(stderr);
            int exit = Program.BuildApp().Run(args);
            return (exit, stdout.ToString(), stderr.ToString());
        }
        finally
        {
            Console.SetOut(savedOut);
            Console.SetError(savedErr);
        }
    }
}
