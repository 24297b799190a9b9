using System.Text.Json;

namespace FreqReadout.Tests.Docs;

/// <summary>
/// The CLI examples in README.md (between the examples markers) are run here exactly as written,
/// in order, in a scratch folder, so the README never drifts from the code.
/// </summary>
public class ReadmeExamplesTests
{
    internal static IReadOnlyList<string[]> Examples()
    {
        string readme = File.ReadAllText(Path.Combine(CliProcess.RepoRoot(), "README.md"));
        int begin = readme.IndexOf("<!-- examples:begin -->", StringComparison.Ordinal);
        int end = readme.IndexOf("<!-- examples:end -->", StringComparison.Ordinal);
        Assert.True(begin >= 0 && end > begin, "README.md has no examples block");
        var list = new List<string[]>();
        foreach (string raw in readme[begin..end].Split('\n'))
        {
            string line = raw.Trim();
            if (line.StartsWith("freqreadout ", StringComparison.Ordinal))
            {
                list.Add(line.Split(' ', StringSplitOptions.RemoveEmptyEntries)[1..]);
            }
        }

        return list;
    }

    [Fact]
    public void Every_README_example_runs_and_succeeds()
    {
        IReadOnlyList<string[]> examples = Examples();
        Assert.True(examples.Count >= 5, "expected the README's CLI examples");
        string dir = Directory.CreateTempSubdirectory("freqreadout-readme-").FullName;
        try
        {
            foreach (string[] args in examples)
            {
                CliProcess.Result r = CliProcess.Run(dir, args);
                string shown = "freqreadout " + string.Join(' ', args);
                Assert.True(r.ExitCode == 0, shown + " exited " + r.ExitCode + "\n" + r.Stderr + r.Stdout);
                Assert.False(string.IsNullOrWhiteSpace(r.Stdout + r.Stderr), shown + " printed nothing");
                if (args[0] == "convert")
                {
                    Assert.True(new FileInfo(Path.Combine(dir, args[2])).Length > 0, shown + " did not write " + args[2]);
                }
                if (args.Contains("--json"))
                {
                    // --json output is JSON: one object (replay and the rest) or one object per line (count).
                    string[] lines = r.Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
                    if (args[0] == "count")
                    {
                        foreach (string l in lines)
                        {
                            using JsonDocument d = JsonDocument.Parse(l);
                            Assert.Equal(JsonValueKind.Object, d.RootElement.ValueKind);
                        }
                    }
                    else
                    {
                        using JsonDocument d = JsonDocument.Parse(r.Stdout);
                        Assert.Equal(JsonValueKind.Object, d.RootElement.ValueKind);
                    }
                }

                foreach (string a in args.Where((a, i) => i > 0 && (args[i - 1] == "--out" || args[i - 1] == "--readings" || args[i - 1] == "--events" || args[i - 1] == "--truth")))
                {
                    Assert.True(new FileInfo(Path.Combine(dir, a)).Length > 0, shown + " did not write " + a);
                }

                // --report DIR: the page and its plots (Reports/ReportPageTests checks what they hold).
                foreach (string a in args.Where((a, i) => i > 0 && args[i - 1] == "--report"))
                {
                    string[] plots = args[0] switch
                    {
                        "stability" => new[] { "deviation" },
                        "plan" => args.Contains("--material") ? new[] { "resolution", "depth" } : new[] { "resolution" },
                        _ => new[] { "frequency", "shift", "noise" },
                    };
                    string[] written = new[] { "report.html" }.Concat(plots.SelectMany(p => new[] { p + ".png", p + ".svg" })).ToArray();
                    Assert.All(written, f => Assert.True(new FileInfo(Path.Combine(dir, a, f)).Length > 0, shown + " did not write " + Path.Combine(a, f)));
                }
            }
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }

    [Fact]
    public void README_shows_the_two_fresh_machine_commands_and_the_cautions()
    {
        string readme = File.ReadAllText(Path.Combine(CliProcess.RepoRoot(), "README.md"));
        Assert.Contains("dotnet run --project host -- demo", readme);
        Assert.Contains("dotnet test", readme);
        Assert.Contains("is not proof that a wall or floor holds no live wiring or pipe", readme);
        string ci = File.ReadAllText(Path.Combine(CliProcess.RepoRoot(), ".ci", "run"));
        Assert.Contains("dotnet test", ci);
    }
}
