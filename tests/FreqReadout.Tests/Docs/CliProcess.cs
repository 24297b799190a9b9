using System.Diagnostics;

namespace FreqReadout.Tests.Docs;

/// <summary>Runs the built <c>freqreadout</c> CLI as a separate process, as a user would.</summary>
internal static class CliProcess
{
    internal sealed record Result(int ExitCode, string Stdout, string Stderr);

    public static Result Run(string workingDirectory, IEnumerable<string> args, int timeoutMs = 300_000)
    {
        string dll = Path.Combine(AppContext.BaseDirectory, "freqreadout.dll");
        Assert.True(File.Exists(dll), "CLI not built beside the tests: " + dll);
        string dotnet = Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") is { Length: > 0 } p && File.Exists(p) ? p : "dotnet";
        var psi = new ProcessStartInfo(dotnet)
        {
            WorkingDirectory = workingDirectory,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        psi.ArgumentList.Add(dll);
        foreach (string a in args)
        {
            psi.ArgumentList.Add(a);
        }

        psi.Environment["NO_COLOR"] = "1";
        psi.Environment["COLUMNS"] = "120";
        using var process = Process.Start(psi)!;
        Task<string> stdout = process.StandardOutput.ReadToEndAsync();
        Task<string> stderr = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(timeoutMs))
        {
            process.Kill(entireProcessTree: true);
            Assert.Fail("freqreadout " + string.Join(' ', args) + " did not finish within " + timeoutMs / 1000 + " s");
        }

        return new Result(process.ExitCode, stdout.Result, stderr.Result);
    }

    public static string RepoRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir != null && !File.Exists(Path.Combine(dir.FullName, "FreqReadout.sln")))
        {
            dir = dir.Parent;
        }

        Assert.True(dir != null, "FreqReadout.sln not found above " + AppContext.BaseDirectory);
        return dir!.FullName;
    }
}
