using FreqReadout.Host.Commands;
using Spectre.Console.Cli;

namespace FreqReadout.Host;

/// <summary>Entry point of the <c>freqreadout</c> command-line harness.</summary>
public static class Program
{
    public static int Main(string[] args)
    {
        return BuildApp().Run(args);
    }

    /// <summary>The command tree; tests run commands through this too.</summary>
    public static CommandApp BuildApp()
    {
        var app = new CommandApp();
        app.Configure(config =>
        {
            config.SetApplicationName("freqreadout");
            config.PropagateExceptions();
            config.AddCommand<DemoCommand>("demo")
                .WithDescription("Run the whole pipeline on a built-in invented scenario.");
            config.AddCommand<CountCommand>("count")
                .WithDescription("Count a capture gate by gate: frequency, shift from the first gate, edges, error, state.");
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
