namespace FreqReadout.Tests.Commands;

/// <summary><c>record</c>'s one-line errors: each names the port, file, line or option, with the exit code of docs/exit-codes.md; nothing is created.</summary>
[Collection(ConsoleCollection.Name)]
public sealed class RecordCommandTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-record-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void A_missing_port_is_one_line_naming_it_and_nothing_is_written()
    {
        string port = Path.Combine(_dir, "ttyNOPE");
        string output = Path.Combine(_dir, "field.csv");
        var (exit, _, error) = ConsoleCapture.RunMain("record", "--port", port, "--out", output);
        Assert.Equal(1, exit);
        Assert.Equal($"error: serial port {port}: no such device; `freqreadout record --list` lists the ports", error.Trim());
        Assert.False(File.Exists(output));
    }

    [Fact]
    public void A_file_that_is_not_a_serial_port_is_refused_with_the_cause()
    {
        string notAPort = Path.Combine(_dir, "plain.txt");
        File.WriteAllText(notAPort, "x");
        var (exit, _, error) = ConsoleCapture.RunMain("record", "--port", notAPort, "--out", Path.Combine(_dir, "field.csv"));
        Assert.Equal(1, exit);
        Assert.StartsWith($"error: serial port {notAPort}: cannot open it (", error.Trim());
        Assert.Single(error.Trim().Split('\n'));
    }

    [Theory]
    [InlineData(new[] { "record", "--out", "x.csv" }, "--port is required")]
    [InlineData(new[] { "record", "--port", "/dev/null" }, "--out is required")]
    [InlineData(new[] { "record", "--port", "/dev/null", "--out", "x.csv", "--baud", "300" }, "--baud must be an integer in [1200, 4000000], got 300")]
    [InlineData(new[] { "record", "--port", "/dev/null", "--out", "x.csv", "--seconds", "0" }, "--seconds must be in (0, 1e7], got 0")]
    public void Usage_problems_exit_2_and_name_the_option(string[] args, string expected)
    {
        var (exit, _, error) = ConsoleCapture.RunMain(args);
        Assert.Equal(2, exit);
        Assert.Contains(expected, error);
    }

    [Fact]
    public void An_existing_output_is_never_overwritten()
    {
        string output = Path.Combine(_dir, "field.csv");
        File.WriteAllText(output, "keep me");
        var (exit, _, error) = ConsoleCapture.RunMain("record", "--port", "/dev/null", "--out", output);
        Assert.Equal(1, exit);
        Assert.Contains("it exists; a recording never overwrites a file", error);
        Assert.Equal("keep me", File.ReadAllText(output));
    }

    [Fact]
    public void A_settings_file_with_problems_is_not_sent_and_each_problem_names_its_line()
    {
        string file = Path.Combine(_dir, "bad.settings");
        File.WriteAllText(file, "# freqreadout settings 1\ngate_s = 0.1\nthreshold_sigma = banana\nsparkle = 3\n");
        var (exit, _, error) = ConsoleCapture.RunMain("record", "--port", "/dev/null", "--send-settings", file);
        Assert.Equal(1, exit);
        Assert.Contains($"error: {file}:3: threshold_sigma: ", error);
        Assert.Contains($"error: {file}:4: sparkle: ", error);
        Assert.Contains("2 problem(s); nothing was sent", error);
    }
}
