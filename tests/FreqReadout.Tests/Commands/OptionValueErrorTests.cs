using System.Globalization;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// Option values as a user types them wrongly: a value left out, a value in the local culture. Each gives one
/// error line naming the option (and, for numbers, its allowed range), exit 2, nothing on stdout, no file written.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class OptionValueErrorTests
{
    private static void AssertOneErrorLine(string stderr, string expected)
    {
        string[] lines = stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.True(lines.Length == 1, $"expected one error line, got:\n{stderr}");
        Assert.StartsWith("error: ", lines[0]);
        Assert.Contains(expected, lines[0]);
        Assert.DoesNotContain("__default_command", stderr);
    }

    [Theory]
    [InlineData("replay", "--threshold-sigma")]
    [InlineData("replay", "--gate-seconds")]
    [InlineData("calibrate", "--settling-s")]
    [InlineData("count", "--gate-seconds")]
    public void An_option_without_its_value_at_the_end_says_it_needs_one(string command, string option)
    {
        var (exit, stdout, stderr) = ConsoleCapture.RunMain(command, Contract("minimal.edges.csv"), option);
        Assert.Equal(2, exit);
        Assert.Equal(string.Empty, stdout);
        AssertOneErrorLine(stderr, option + " needs a value");
    }

    [Theory]
    [InlineData("--seed", "simulate", "--demo", "--out", "never-written.csv", "--seed")]
    [InlineData("--seed", "simulate", "--demo", "--seed", "--out", "never-written.csv")]
    [InlineData("--turns", "coil", "--turns")]
    public void A_typed_option_without_its_value_says_it_needs_one(string option, params string[] args)
    {
        // Typed options (int?, double?) fail in Spectre's binding ("Failed to convert '__default_command'"),
        // which named no option ("an option must be a whole number, got '__default_command'").
        var (exit, stdout, stderr) = ConsoleCapture.RunMain(args);
        Assert.Equal(2, exit);
        Assert.Equal(string.Empty, stdout);
        AssertOneErrorLine(stderr, option + " needs a value");
        Assert.False(File.Exists("never-written.csv"));
    }

    [Fact]
    public void An_option_without_its_value_before_another_option_says_it_needs_one()
    {
        var (exit, stdout, stderr) = ConsoleCapture.RunMain("replay", Contract("minimal.edges.csv"), "--threshold-sigma", "--json");
        Assert.Equal(2, exit);
        Assert.Equal(string.Empty, stdout);
        AssertOneErrorLine(stderr, "--threshold-sigma needs a value");
    }

    [Fact]
    public void A_file_option_without_its_value_writes_no_file_and_fails()
    {
        // Spectre.Console.Cli 0.57 fills a value-less option with its internal command name: before the check,
        // replay ran normally and wrote the readings to a file named __default_command in the working directory.
        string dir = Directory.CreateTempSubdirectory("freqreadout-novalue").FullName;
        string saved = Environment.CurrentDirectory;
        try
        {
            Environment.CurrentDirectory = dir;
            var (exit, stdout, stderr) = ConsoleCapture.RunMain("replay", Contract("minimal.edges.csv"), "--readings");
            Assert.Equal(2, exit);
            Assert.Equal(string.Empty, stdout);
            AssertOneErrorLine(stderr, "--readings needs a value");
            Assert.Empty(Directory.GetFiles(dir));
        }
        finally
        {
            Environment.CurrentDirectory = saved;
            Directory.Delete(dir, true);
        }
    }

    [Fact]
    public void Range_errors_print_numbers_with_a_point_whatever_the_culture()
    {
        CultureInfo saved = CultureInfo.CurrentCulture;
        try
        {
            // A culture with a decimal comma (built by hand: the test process runs in invariant globalization mode,
            // yet a user's LC_ALL=de_DE.UTF-8 gave "got 0,5" before Program.Main pinned the invariant culture).
            var comma = (CultureInfo)CultureInfo.InvariantCulture.Clone();
            comma.NumberFormat.NumberDecimalSeparator = ",";
            CultureInfo.CurrentCulture = comma;
            var (exit, _, stderr) = ConsoleCapture.RunMain("replay", Contract("minimal.edges.csv"), "--threshold-sigma", "0.5");
            Assert.Equal(2, exit);
            AssertOneErrorLine(stderr, "threshold_sigma must be in [1, 1000], got 0.5");
        }
        finally
        {
            CultureInfo.CurrentCulture = saved;
        }
    }

    [Theory]
    [InlineData("--readings", "cannot write the readings: its folder does not exist")]
    [InlineData("--events", "cannot write the events: its folder does not exist")]
    public void A_csv_in_a_missing_folder_names_the_file_and_why(string option, string expected)
    {
        string path = Path.Combine(Path.GetTempPath(), "freqreadout-no-such-folder-" + Guid.NewGuid().ToString("N"), "out.csv");
        var (exit, _, stderr) = ConsoleCapture.RunMain("replay", Contract("snapshots.edges.csv"), option, path, "--json");
        Assert.Equal(1, exit);
        AssertOneErrorLine(stderr, path + ": " + expected);
    }
}
