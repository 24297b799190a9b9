using System.ComponentModel;
using FreqReadout.Host.Bench;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout bench speed</c>: the speed bench (host/Bench/README.md). Builds its captures in a temporary folder,
/// times whole <c>freqreadout</c> processes side by side (raw read, text and binary replay, start-up, simulate),
/// interleaved, and prints the medians and their ratios to the raw read as a Markdown table.
/// </summary>
public sealed class BenchSpeedCommand : Command<BenchSpeedCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
        [CommandOption("--quick")]
        [Description("The quick subset for CI (a 200 000-edge capture, 5 s simulated, no row-by-row case; well under a minute) instead of the full bench (10 M edges, 60 s simulated).")]
        public bool Quick { get; set; }

        [CommandOption("--edges <N>")]
        [Description("Edges of the large capture, from 100000 to 100000000 (100 000 edges are 1 s of the synthetic capture). Default 10000000 (200000 with --quick).")]
        public long? Edges { get; set; }

        [CommandOption("--runs <N>")]
        [Description("Timed runs per case (the median is reported), from 5 to 100. Default 5.")]
        public int? Runs { get; set; }

        [CommandOption("--keep <DIR>")]
        [Description("Build the captures in DIR and keep them (default: a new temporary folder, removed at the end).")]
        [FilePath]
        public string? Keep { get; set; }

        [CommandOption("--json")]
        [Description("Print the results as one JSON object (keys in docs/json-output.md) instead of the Markdown table.")]
        public bool Json { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        SpeedBenchSize size = settings.Quick ? SpeedBenchSize.Quick() : SpeedBenchSize.Full();
        if (settings.Edges is long edges)
        {
            if (edges < 100_000 || edges > 100_000_000)
            {
                return CommandOutput.Fail($"--edges must be a whole number from 100000 to 100000000, got {edges}", CommandOutput.BadOption);
            }

            size.Edges = edges;
        }

        if (settings.Runs is int runs)
        {
            if (runs < SpeedBenchSize.MinRuns || runs > 100)
            {
                return CommandOutput.Fail($"--runs must be a whole number from {SpeedBenchSize.MinRuns} to 100, got {runs}", CommandOutput.BadOption);
            }

            size.Runs = runs;
        }

        string directory = settings.Keep ?? Path.Combine(Path.GetTempPath(), "freqreadout-speed-" + Guid.NewGuid().ToString("N")[..8]);
        bool remove = settings.Keep == null;
        try
        {
            var bench = new SpeedBench(directory, size);
            if (CommandOutput.ErrorIsTerminal())
            {
                bench.Progress = line => Console.Error.WriteLine(line);
            }

            var cases = bench.Prepare(cancellationToken);
            var results = bench.Run(cases, cancellationToken);
            long textBytes = new FileInfo(Path.Combine(directory, "big.csv")).Length;
            Console.Out.Write(settings.Json ? SpeedBench.Json(results, size, textBytes) + "\n" : SpeedBench.Markdown(results, size, textBytes));
            return ExitCodes.Ok;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            return CommandOutput.Fail($"{directory}: {e.Message}", CommandOutput.BadInput);
        }
        catch (InvalidOperationException e)
        {
            // A timed process failed: its command line and stderr are in the message.
            return CommandOutput.Fail(e.Message, CommandOutput.BadInput);
        }
        finally
        {
            if (remove && Directory.Exists(directory))
            {
                Directory.Delete(directory, recursive: true);
            }
        }
    }
}
