using FreqReadout.Host.Commands;

namespace FreqReadout.Tests.Commands;

/// <summary>Progress bars and status lines belong on an interactive stderr only, not in a file or pipe it is redirected to.</summary>
[Collection(ConsoleCollection.Name)]
public sealed class ProgressOutputTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-progress").FullName;

    public void Dispose() => Directory.Delete(_dir, true);

    private string Simulate(bool terminal)
    {
        Func<bool> saved = CommandOutput.ErrorIsTerminal;
        try
        {
            CommandOutput.ErrorIsTerminal = () => terminal;
            var (exit, _, stderr) = ConsoleCapture.RunMain("simulate", "--demo", "--duration-s", "2", "--out", Path.Combine(_dir, "p.csv"));
            Assert.True(exit == 0, stderr);
            return stderr;
        }
        finally
        {
            CommandOutput.ErrorIsTerminal = saved;
        }
    }

    [Fact]
    public void Simulate_shows_progress_on_a_terminal_and_none_when_stderr_is_redirected()
    {
        Assert.Contains("simulating", Simulate(terminal: true));
        string redirected = Simulate(terminal: false);
        Assert.DoesNotContain("simulating", redirected);
        Assert.DoesNotContain("%", redirected);
    }
}
