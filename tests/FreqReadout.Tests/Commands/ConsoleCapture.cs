using FreqReadout.Host;

namespace FreqReadout.Tests.Commands;

/// <summary>Commands write through Console.Out / Console.Error; tests that swap them run alone in this collection.</summary>
[CollectionDefinition(Name, DisableParallelization = true)]
public sealed class ConsoleCollection
{
    public const string Name = "Console"; // shared with the other command tests that swap Console.Out (e.g. Simulation)
}

/// <summary>Runs the CLI in-process through <see cref="Program.BuildApp"/>, capturing stdout and stderr.</summary>
internal static class ConsoleCapture
{
    public static (int Exit, string Out, string Err) Run(params string[] args) => Capture(() => Program.BuildApp().Run(args));

    /// <summary>Runs <see cref="Program.Main"/> (which also turns usage errors into one line).</summary>
    public static (int Exit, string Out, string Err) RunMain(params string[] args) => Capture(() => Program.Main(args));

    public static (int Exit, string Out, string Err) Capture(Func<int> run)
    {
        var savedOut = Console.Out;
        var savedErr = Console.Error;
        var savedCulture = System.Globalization.CultureInfo.CurrentCulture;
        var savedDefaultCulture = System.Globalization.CultureInfo.DefaultThreadCurrentCulture;
        var stdout = new StringWriter { NewLine = "\n" };
        var stderr = new StringWriter { NewLine = "\n" };
        try
        {
            Console.SetOut(stdout);
            Console.SetError(stderr);
            int exit = run();
            return (exit, stdout.ToString(), stderr.ToString());
        }
        finally
        {
            Console.SetOut(savedOut);
            Console.SetError(savedErr);
            System.Globalization.CultureInfo.CurrentCulture = savedCulture; // Program.Main switches to the invariant culture
            System.Globalization.CultureInfo.DefaultThreadCurrentCulture = savedDefaultCulture;
        }
    }
}
