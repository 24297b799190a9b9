namespace FreqReadout.Tests.Robustness;

/// <summary>The regression inputs: tests/FreqReadout.Tests/Data/fuzz-regressions/&lt;parser&gt;/ (copied to the test output).</summary>
public static class FuzzRegressionFiles
{
    public const string Folder = "fuzz-regressions";

    /// <summary>The copies in the test output, read by the replay test.</summary>
    public static string OutputFolder(string parser) => Path.Combine(AppContext.BaseDirectory, "Data", Folder, parser);

    /// <summary>
    /// Saves a failing input into the source tree (found by walking up to FreqReadout.sln), so it is
    /// committed with the fix; returns the path, or null when the source tree is not there.
    /// </summary>
    public static string? Save(string parser, FuzzFailure failure)
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir != null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "FreqReadout.sln")))
            {
                string folder = Path.Combine(dir.FullName, "tests", "FreqReadout.Tests", "Data", Folder, parser);
                Directory.CreateDirectory(folder);
                string path = Path.Combine(folder, $"{failure.Operators.Replace('+', '-')}-{failure.InputSeed}.bin");
                File.WriteAllBytes(path, failure.Input);
                return path;
            }
        }

        return null;
    }
}
