namespace FreqReadout.Host.Bench;

/// <summary>
/// The speed bench's yardstick: read a file in 1 MiB blocks with a <see cref="FileStream"/> and count its '\n' bytes
/// with the vectorised <c>span.Count</c>, nothing else. Run as <c>freqreadout __raw-read FILE</c>, a hidden argument
/// that <see cref="Program.Main"/> handles before the command framework is touched, so the process does exactly
/// what a minimal console program would, started the same way as the CLI (host/Bench/README.md says why).
/// </summary>
public static class RawRead
{
    /// <summary>The hidden first argument.</summary>
    public const string Argument = "__raw-read";

    /// <summary>Reads <paramref name="path"/>, prints its line count, returns the exit code.</summary>
    public static int Run(string path)
    {
        var buffer = new byte[1 << 20];
        long lines = 0;
        using (var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1, FileOptions.SequentialScan))
        {
            int got;
            while ((got = stream.Read(buffer, 0, buffer.Length)) > 0)
            {
                lines += buffer.AsSpan(0, got).Count((byte)'\n');
            }
        }

        Console.Out.WriteLine(lines);
        return 0;
    }
}
