using Spectre.Console;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary><c>freqreadout demo</c>: the main job on built-in invented data.</summary>
public sealed class DemoCommand : Command<DemoCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        AnsiConsole.MarkupLine("[yellow]demo: not built yet[/]");
        return 1;
    }
}
