using FreqReadout.Host.Commands;
using FreqReadout.Tests.Commands;

namespace FreqReadout.Tests.Reports;

/// <summary>
/// <c>--report DIR</c> where a file stands in the way: one line naming the file and what was expected (docs/exit-codes.md,
/// code 1), not .NET's "The file ... already exists" or a wrong "its folder does not exist".
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ReportFolderTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-report-folder-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void A_report_path_that_is_a_file_says_so()
    {
        string file = Path.Combine(_dir, "notes.txt");
        File.WriteAllText(file, "x");
        var (exit, _, error) = ConsoleCapture.Run("plan", "--gates-s", "0.1", "--report", file);
        Assert.Equal(ExitCodes.DataError, exit);
        Assert.Equal($"error: --report {file}: is a file, expected a folder\n", error);
        Assert.Equal("x", File.ReadAllText(file));
    }

    [Fact]
    public void A_report_path_under_a_file_names_that_file()
    {
        string file = Path.Combine(_dir, "notes.txt");
        File.WriteAllText(file, "x");
        string folder = Path.Combine(file, "plots");
        var (exit, _, error) = ConsoleCapture.Run("plan", "--gates-s", "0.1", "--report", folder);
        Assert.Equal(ExitCodes.DataError, exit);
        Assert.Equal($"error: --report {folder}: {file} is a file, not a folder\n", error);
    }
}
