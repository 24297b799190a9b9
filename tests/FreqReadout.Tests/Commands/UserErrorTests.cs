using FreqReadout.Host.Commands;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// What a user sees when something is wrong: one line on stderr naming the file (and line or block) or the
/// option and its allowed range, a non-zero exit, no stack trace, and no output lost before the error.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class UserErrorTests
{
    private static void AssertOneErrorLine(string stderr, string expectedPart)
    {
        string[] lines = stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.True(lines.Length == 1, $"expected one error line, got:\n{stderr}");
        Assert.StartsWith("error: ", lines[0]);
        Assert.Contains(expectedPart, lines[0]);
        Assert.DoesNotContain("   at ", stderr);
    }

    [Fact]
    public void A_directory_given_as_a_capture_says_so()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-dir").FullName;
        try
        {
            var (exit, _, stderr) = ConsoleCapture.RunMain("count", dir);
            Assert.Equal(CommandOutput.BadInput, exit);
            AssertOneErrorLine(stderr, dir + ": cannot open the capture: is a directory, expected a file");

            (exit, _, stderr) = ConsoleCapture.RunMain("convert", Contract("minimal.edges.csv"), dir);
            Assert.NotEqual(0, exit);
            AssertOneErrorLine(stderr, dir + ": cannot write the capture: is a directory, expected a file");

            (exit, _, stderr) = ConsoleCapture.RunMain("simulate", "--scene", dir, "--out", Path.Combine(dir, "x.csv"));
            Assert.NotEqual(0, exit);
            AssertOneErrorLine(stderr, dir + ": cannot read the scene file: is a directory, expected a file");
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    [Fact]
    public void A_scene_file_that_is_not_json_names_file_and_line_on_one_line()
    {
        var (exit, _, stderr) = ConsoleCapture.RunMain("simulate", "--scene", Contract("minimal.edges.csv"), "--out", "unused.csv");
        Assert.NotEqual(0, exit);
        AssertOneErrorLine(stderr, Contract("minimal.edges.csv") + ":1: not a valid scene file (JSON");
        Assert.False(File.Exists("unused.csv"));
    }

    [Theory]
    [InlineData("--turns", "1e3", "--turns must be a whole number")]
    [InlineData("--diameter-mm", "180,5", "--diameter-mm must be a number with '.' as the decimal separator, got '180,5'")]
    public void A_value_of_the_wrong_type_names_the_option(string option, string value, string expected)
    {
        var (exit, _, stderr) = ConsoleCapture.RunMain("coil", option, value);
        Assert.Equal(2, exit);
        AssertOneErrorLine(stderr, expected);
        Assert.DoesNotContain("Nullable", stderr);
    }

    [Fact]
    public void The_seed_option_names_itself_when_it_is_not_a_number()
    {
        var (exit, _, stderr) = ConsoleCapture.RunMain("simulate", "--demo", "--out", "unused.csv", "--seed", "abc");
        Assert.Equal(2, exit);
        AssertOneErrorLine(stderr, "--seed must be a whole number (digits only), got 'abc'");
    }

    [Theory]
    [InlineData(new[] { "--diameter-mm", "-1" }, "--diameter-mm must be (5, 5000] mm (got -1)")]
    [InlineData(new[] { "--wire-mm", "500" }, "--wire-mm must be (0, 10) mm (got 500)")]
    [InlineData(new[] { "--material", "custom" }, "--material custom needs --conductivity")]
    [InlineData(new[] { "--material", "custom", "--conductivity", "-5" }, "--conductivity must be in (0, 1e9] S/m (got -5)")]
    [InlineData(new[] { "--material", "copper", "--mu-r", "0.5" }, "--mu-r must be in [1, 1e6] (got 0.5)")]
    [InlineData(new[] { "--material", "copper", "--radius-mm", "1000" }, "the small-dipole model does not hold this close")]
    [InlineData(new[] { "--material", "unobtainium" }, "--material must be one of silver, copper")]
    [InlineData(new[] { "--turns", "100000", "--wire-mm", "0.05", "--diameter-mm", "6" }, "the coil cannot be built from --turns")]
    public void Coil_settings_out_of_range_give_one_line_in_the_users_units(string[] options, string expected)
    {
        var (exit, _, stderr) = ConsoleCapture.RunMain(new[] { "coil" }.Concat(options).ToArray());
        Assert.Equal(2, exit);
        // One line even when the message is longer than a console is wide (no wrapping on stderr).
        AssertOneErrorLine(stderr, expected);
    }

    [Fact]
    public void Gates_before_a_truncated_binary_block_are_still_printed()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-trunc").FullName;
        try
        {
            string bin = Path.Combine(dir, "s.bin");
            Assert.Equal(0, ConsoleCapture.Run("convert", Contract("snapshots.edges.csv"), bin).Exit);
            byte[] bytes = File.ReadAllBytes(bin);
            string cut = Path.Combine(dir, "cut.bin");
            // Drop the last bytes (like `head -c`): the closing block is cut, the rows before it stay readable.
            File.WriteAllBytes(cut, bytes.AsSpan(0, bytes.Length - 3).ToArray());
            var (exit, stdout, stderr) = ConsoleCapture.RunMain("count", cut);
            Assert.Equal(CommandOutput.BadInput, exit);
            AssertOneErrorLine(stderr, "cut.bin:");
            Assert.Contains("truncated", stderr);
            // The contract sample is about 2 s of 130 kHz: the 0.1 s gates read before the cut are in the table.
            Assert.True(stdout.Split('\n').Count(l => l.TrimEnd().EndsWith(" ok", StringComparison.Ordinal)) >= 15, stdout);
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    [Theory]
    [InlineData(1)]
    [InlineData(3)]
    [InlineData(7)]
    public void A_binary_capture_cut_inside_its_magic_says_it_is_truncated(int keep)
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-magic").FullName;
        try
        {
            string bin = Path.Combine(dir, "s.bin");
            Assert.Equal(0, ConsoleCapture.Run("convert", Contract("minimal.edges.csv"), bin).Exit);
            string cut = Path.Combine(dir, "cut.bin");
            File.WriteAllBytes(cut, File.ReadAllBytes(bin).AsSpan(0, keep).ToArray());
            var (exit, _, stderr) = ConsoleCapture.RunMain("count", cut);
            Assert.Equal(CommandOutput.BadInput, exit);
            AssertOneErrorLine(stderr, $"cut.bin:0: the file ends after {keep} of the 8 bytes of the binary capture magic");
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    [Fact]
    public void A_capture_shorter_than_one_gate_says_why_no_gate_closed()
    {
        // Contract README: minimal.edges.csv is 101 edges of 50 kHz, 2 ms: no 0.1 s gate closes.
        // Nothing counted is an error (exit 1), not a success with an empty answer.
        var (exit, stdout, stderr) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), "--json");
        Assert.Equal(ExitCodes.DataError, exit);
        Assert.Equal(string.Empty, stdout);
        AssertOneErrorLine(stderr, "minimal.edges.csv: no gate closed: the capture is shorter than one gate");

        (exit, stdout, stderr) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"));
        Assert.Equal(ExitCodes.DataError, exit);
        Assert.Contains("0 gates (0 with a frequency) from 101 rows", stdout);
        AssertOneErrorLine(stderr, "minimal.edges.csv: no gate closed: the capture is shorter than one gate");
    }

    [Fact]
    public void A_gate_too_long_for_the_captures_clock_names_the_option_before_any_output()
    {
        // 2^40 ticks, the counters' longest gate, last 1099.5 s at 1 GHz: within --gate-seconds' own range, too long here.
        string path = Path.Combine(Path.GetTempPath(), $"freqreadout-ghz-{Guid.NewGuid():N}.csv");
        File.WriteAllText(path, "# freqreadout capture 1\n# clock_hz = 1000000000\ntick\n0\n1000\n2000\n");
        try
        {
            var (exit, stdout, stderr) = ConsoleCapture.RunMain("count", path, "--gate-seconds", "86400");
            Assert.Equal(CommandOutput.BadOption, exit);
            AssertOneErrorLine(stderr, "--gate-seconds must be at most 1099.51 s for this capture (2^40 ticks of clock_hz = 1000000000), got 86400");
            Assert.Equal(string.Empty, stdout);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Trimming_to_a_range_without_rows_warns()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-trim").FullName;
        try
        {
            var (exit, _, stderr) = ConsoleCapture.Run("convert", Contract("minimal.edges.csv"), Path.Combine(dir, "t.bin"), "--from-s", "5");
            Assert.Equal(0, exit);
            Assert.Contains("warning: no row lies in the range from 5 s to the end", stderr);
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }
}
