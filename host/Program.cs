using FreqReadout.Host.Commands;
using Spectre.Console.Cli;

namespace FreqReadout.Host;

/// <summary>Entry point of the <c>freqreadout</c> command-line harness.</summary>
public static class Program
{
    public static int Main(string[] args)
    {
        try
        {
            return BuildApp().Run(args);
        }
        catch (CommandAppException e)
        {
            // Usage errors (unknown option, missing argument, a value of the wrong type): one line, no stack trace.
            string detail = e.InnerException is { } inner && inner.Message != e.Message ? " (" + inner.Message + ")" : string.Empty;
            Console.Error.WriteLine("error: " + e.Message.TrimEnd('.') + detail + "; see freqreadout --help");
            return 2;
        }
    }

    /// <summary>The command tree; tests run commands through this too.</summary>
    public static CommandApp BuildApp()
    {
        var app = new CommandApp();
        app.Configure(config =>
        {
            config.SetApplicationName("freqreadout");
            config.PropagateExceptions();
            config.UseStrictParsing(); // an unknown or misspelt option is an error, never silently ignored
            config.AddCommand<DemoCommand>("demo")
                .WithDescription("Run the whole pipeline on a built-in invented scenario.");
            config.AddCommand<CountCommand>("count")
                .WithDescription("Count a capture gate by gate: frequency, shift from the first gate, edges, error, state.");
            config.AddCommand<ReplayCommand>("replay")
                .WithDescription("Replay a capture through the device's readout pipeline: baseline, noise, drift, re-baselines and events (ferrous / non-ferrous / unclear).");
            config.AddCommand<CalibrateCommand>("calibrate")
                .WithDescription("Fit the search oscillator's tempco (ppm/K with its standard error) from the target-free stretches of a capture with temp_c.");
            config.AddCommand<ConvertCommand>("convert")
                .WithDescription("Convert a capture between the text and binary formats, losslessly, optionally trimmed to a time range.");
            config.AddCommand<SimulateCommand>("simulate")
                .WithDescription("Generate a capture from physics (scene file or built-in demo scene) plus a truth file.");
            config.AddCommand<CoilCommand>("coil")
                .WithDescription("Search coil figures and a target's expected shift against distance and its ferrous crossover.");
        });
        return app;
    }
}
