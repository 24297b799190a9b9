using FreqReadout.Host.Commands;
using FreqReadout.Tests.Docs;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// Every command's --help prints its usage and exits 0: the help text goes through the terminal library's markup, where
/// a range written as [a, b] in an option's description was once read as a style and crashed `bench speed --help`.
/// </summary>
public class HelpTests
{
    [Theory]
    [InlineData("demo")]
    [InlineData("count")]
    [InlineData("replay")]
    [InlineData("calibrate")]
    [InlineData("convert")]
    [InlineData("simulate")]
    [InlineData("coil")]
    [InlineData("plan")]
    [InlineData("stability")]
    [InlineData("tune")]
    [InlineData("import")]
    [InlineData("import vcd")]
    [InlineData("import wav")]
    [InlineData("record")]
    [InlineData("bench")]
    [InlineData("bench quality")]
    [InlineData("bench speed")]
    public void Help_of_every_command_prints_its_usage(string command)
    {
        string[] args = command.Split(' ').Append("--help").ToArray();
        CliProcess.Result r = CliProcess.Run(Path.GetTempPath(), args, 60_000);
        Assert.True(r.ExitCode == ExitCodes.Ok, $"exit {r.ExitCode}; stderr: {r.Stderr}");
        Assert.Contains("USAGE", r.Stdout);
        Assert.Equal(string.Empty, r.Stderr);
    }

    [Fact]
    public void Every_registered_command_has_its_help_tested()
    {
        var tested = typeof(HelpTests).GetMethod(nameof(Help_of_every_command_prints_its_usage))!
            .GetCustomAttributes(typeof(InlineDataAttribute), false).Cast<InlineDataAttribute>()
            .Select(a => (string)a.GetData(null!).First()[0]).ToHashSet();
        Assert.All(FreqReadout.Host.Program.CommandNames, name => Assert.Contains(name, tested));
    }
}
