using System.Text.RegularExpressions;

namespace FreqReadout.Tests.Docs;

/// <summary>
/// docs/output-files.md: its command examples run as written (in a scratch folder holding the files they
/// name), and its example salvage warnings are what convert --salvage prints for the cuts it describes
/// (numbers aside, which depend on the simulation's floating point).
/// </summary>
public sealed class OutputFilesDocTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-docs-output").FullName;
    private readonly string _doc = File.ReadAllText(Path.Combine(CliProcess.RepoRoot(), "docs", "output-files.md"));

    public OutputFilesDocTests()
    {
        // The files the examples name: a 3 s simulated capture, its binary form, and both cut as the doc says.
        Run("simulate", "--demo", "--duration-s", "3", "--out", "s3.csv", "--quiet");
        Run("convert", "s3.csv", "capture.frb");
        File.WriteAllBytes(Path.Combine(_dir, "cut.csv"), File.ReadAllBytes(Path.Combine(_dir, "s3.csv")).AsSpan(0, 60000).ToArray());
        File.WriteAllBytes(Path.Combine(_dir, "cut.frb"), File.ReadAllBytes(Path.Combine(_dir, "capture.frb")).AsSpan(0, 8717).ToArray());
    }

    public void Dispose() => Directory.Delete(_dir, true);

    [Fact]
    public void Every_command_example_runs()
    {
        var examples = _doc.Split('\n').Where(l => l.StartsWith("    freqreadout ", StringComparison.Ordinal)).ToList();
        Assert.True(examples.Count >= 3, "expected the page's command examples");
        foreach (string line in examples)
        {
            string command = line.Split('|')[0].Trim(); // "| head" only shortens what a reader sees
            string[] args = command.Split(' ', StringSplitOptions.RemoveEmptyEntries)[1..];
            if (args.Contains("/dev/stdout") && !OperatingSystem.IsLinux())
            {
                continue;
            }

            CliProcess.Result r = CliProcess.Run(_dir, args);
            Assert.True(r.ExitCode == 0, command + ": " + r.Stderr);
        }
    }

    [Theory]
    [InlineData("cut.csv", "--to text")]
    [InlineData("cut.frb", "")]
    public void The_example_warnings_are_what_salvage_prints(string input, string options)
    {
        string[] args = new[] { "convert", input, "rescued.csv" }.Concat(options.Split(' ', StringSplitOptions.RemoveEmptyEntries)).Append("--salvage").ToArray();
        CliProcess.Result r = CliProcess.Run(_dir, args);
        Assert.Equal(0, r.ExitCode);
        string documented = _doc.Split('\n').Single(l => l.StartsWith($"    warning: {input}:", StringComparison.Ordinal)).Trim();
        string printed = r.Stderr.Split('\n').Single(l => l.StartsWith("warning: ", StringComparison.Ordinal)).Trim();
        Assert.Equal(Numbers(documented), Numbers(printed));
    }

    private static string Numbers(string text) => Regex.Replace(text, @"\d+", "N");

    private void Run(params string[] args)
    {
        CliProcess.Result r = CliProcess.Run(_dir, args);
        Assert.True(r.ExitCode == 0, string.Join(' ', args) + ": " + r.Stderr);
    }
}
