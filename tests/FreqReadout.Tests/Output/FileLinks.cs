using System.Diagnostics;

namespace FreqReadout.Tests.Output;

/// <summary>Makes hard links and named pipes for the tests (through the system's own ln and mkfifo; Unix).</summary>
internal static class FileLinks
{
    public static void Hard(string existing, string newPath) => Run("ln", existing, newPath);

    public static void Fifo(string path) => Run("mkfifo", path);

    /// <summary>What `stat` (GNU coreutils) says a path is, e.g. "character special file" — a second opinion beside our own FileIdentity.</summary>
    public static string StatKind(string path) => Run("stat", "-c", "%F", path).Trim();

    private static string Run(string program, params string[] args)
    {
        var psi = new ProcessStartInfo(program) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (string a in args)
        {
            psi.ArgumentList.Add(a);
        }

        using var process = Process.Start(psi)!;
        string output = process.StandardOutput.ReadToEnd();
        string error = process.StandardError.ReadToEnd();
        process.WaitForExit();
        Assert.True(process.ExitCode == 0, $"{program} {string.Join(' ', args)}: {error}");
        return output;
    }
}
