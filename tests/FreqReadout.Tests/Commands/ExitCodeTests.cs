using System.Text;
using System.Text.RegularExpressions;
using FreqReadout.Host;
using FreqReadout.Host.Commands;
using FreqReadout.Tests.Docs;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// The exit-code table of docs/exit-codes.md, held by every command: 0 done, 1 data problem, 2 usage problem
/// (bare <c>freqreadout</c> too), each error one line on stderr; plus <c>--version</c>, empty paths and standard input.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ExitCodeTests : IDisposable
{
    private static readonly string Dir = Directory.CreateTempSubdirectory("freqreadout-exit").FullName;

    static ExitCodeTests()
    {
        File.WriteAllText(Path.Combine(Dir, "empty.csv"), "# freqreadout capture 1\n# clock_hz = 1000000\ntick\n");
        var alias = new StringBuilder("# freqreadout capture 1\n# clock_hz = 80000000\n# timer_bits = 16\n# search_hz = 1000\ntick\n");
        for (int i = 0; i < 2000; i++)
        {
            alias.Append((12345 + (i * 80000L)) % 65536).Append('\n');
        }

        File.WriteAllText(Path.Combine(Dir, "alias.csv"), alias.ToString());
        File.WriteAllText(Path.Combine(Dir, "bad-scene.json"), "{ \"coil\": { \"turns\": \"many\" } }");
        File.WriteAllText(Path.Combine(Dir, "alias-scene.json"), "{ \"hardware\": { \"timer_bits\": 16 }, \"oscillator\": { \"frequency_hz\": 1000 } }");
        File.WriteAllBytes(Path.Combine(Dir, "image.png"), new byte[] { 0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52 });
    }

    public void Dispose()
    {
    }

    private static string D(string name) => Path.Combine(Dir, name);

    private static string Missing => Path.Combine(Dir, "no-such-folder", "x.csv");

    /// <summary>Every command, each case it can reach, and the code the table gives it.</summary>
    public static TheoryData<int, string[]> Cases()
    {
        var data = new TheoryData<int, string[]>();
        void Add(int code, params string[] args) => data.Add(code, args);

        Add(ExitCodes.Usage, "no-such-command");

        Add(ExitCodes.Ok, "count", Contract("snapshots.edges.csv"), "--json");
        Add(ExitCodes.DataError, "count", D("no-such-file.csv"));
        Add(ExitCodes.DataError, "count", D("image.png"));
        Add(ExitCodes.DataError, "count", Contract("bad-tick-text.edges.csv"));
        Add(ExitCodes.DataError, "count", D("empty.csv"));
        Add(ExitCodes.DataError, "count", Contract("minimal.edges.csv"));   // shorter than one 0.1 s gate
        Add(ExitCodes.DataError, "count", D("alias.csv"));
        Add(ExitCodes.Usage, "count");
        Add(ExitCodes.Usage, "count", "");
        Add(ExitCodes.Usage, "count", Contract("snapshots.edges.csv"), "--gate-seconds", "-1");
        Add(ExitCodes.Usage, "count", Contract("snapshots.edges.csv"), "--jitter-ticks", "1e308");
        Add(ExitCodes.Usage, "count", Contract("snapshots.edges.csv"), "--no-such-option");

        Add(ExitCodes.Ok, "replay", Contract("snapshots.edges.csv"), "--json");
        Add(ExitCodes.DataError, "replay", D("no-such-file.csv"));
        Add(ExitCodes.DataError, "replay", Contract("snapshots.edges.csv"), "--report", Path.Combine("/dev/null", "sub"));
        Add(ExitCodes.DataError, "stability", Contract("snapshots.edges.csv"), "--report", Path.Combine("/dev/null", "sub"));
        Add(ExitCodes.DataError, "replay", D("empty.csv"));
        Add(ExitCodes.DataError, "replay", Contract("minimal.edges.csv"));
        Add(ExitCodes.DataError, "replay", D("alias.csv"));
        Add(ExitCodes.DataError, "replay", Contract("snapshots.edges.csv"), "--readings", Missing);
        Add(ExitCodes.Usage, "replay", Contract("snapshots.edges.csv"), "--readings", "");
        Add(ExitCodes.Usage, "replay", Contract("snapshots.edges.csv"), "--events", "-");
        Add(ExitCodes.Usage, "replay", Contract("snapshots.edges.csv"), "--threshold-sigma", "0");

        Add(ExitCodes.DataError, "calibrate", Contract("minimal.edges.csv"));  // no temp_c column
        Add(ExitCodes.DataError, "calibrate", D("empty.csv"));
        Add(ExitCodes.Usage, "calibrate", Contract("beat-with-temp.edges.csv"), "--polarity", "inverted"); // replay's only
        Add(ExitCodes.Usage, "calibrate", "");

        Add(ExitCodes.Ok, "convert", Contract("minimal.edges.csv"), D("converted.frb"));
        Add(ExitCodes.DataError, "convert", D("no-such-file.csv"), D("out.frb"));
        Add(ExitCodes.DataError, "convert", Contract("minimal.edges.csv"), Missing);
        Add(ExitCodes.Usage, "convert", Contract("minimal.edges.csv"), D("out.frb"), "--to", "csv");
        Add(ExitCodes.Usage, "convert", Contract("minimal.edges.csv"), "");

        Add(ExitCodes.Ok, "simulate", "--demo", "--duration-s", "1", "--out", D("sim.csv"), "--quiet");
        Add(ExitCodes.DataError, "simulate", "--scene", D("bad-scene.json"), "--out", D("sim2.csv"));
        Add(ExitCodes.DataError, "simulate", "--scene", D("alias-scene.json"), "--out", D("sim3.csv"));
        Add(ExitCodes.DataError, "simulate", "--scene", D("no-such-scene.json"), "--out", D("sim4.csv"));
        Add(ExitCodes.DataError, "simulate", "--demo", "--duration-s", "1", "--out", Missing, "--quiet");
        Add(ExitCodes.Usage, "simulate", "--demo", "--kind", "pulses", "--out", D("sim5.csv"));
        Add(ExitCodes.Usage, "simulate", "--demo", "--out", "");
        Add(ExitCodes.Usage, "simulate", "--demo", "--duration-s", "-1", "--out", D("sim6.csv"));

        Add(ExitCodes.Ok, "coil");
        Add(ExitCodes.DataError, "coil", "--scene", D("bad-scene.json"));
        Add(ExitCodes.Usage, "coil", "--turns", "0");
        Add(ExitCodes.Usage, "coil", "--scene", "");

        Add(ExitCodes.Ok, "plan", "--gates-s", "0.1");
        Add(ExitCodes.Usage, "plan", "--search-prescale", "0");
        Add(ExitCodes.Usage, "plan", "--methods", "sundial");
        Add(ExitCodes.Usage, "plan", "--report", "");
        Add(ExitCodes.DataError, "plan", "--gates-s", "0.1", "--report", Path.Combine("/dev/null", "sub"));

        Add(ExitCodes.DataError, "demo", "--keep", Path.Combine("/dev/null", "sub"), "--quiet");
        Add(ExitCodes.Usage, "demo", "--keep", "");
        Add(ExitCodes.Usage, "demo", "--no-such-option");
        Add(ExitCodes.DataError, "demo", "--report", Path.Combine("/dev/null", "sub"), "--quiet");
        Add(ExitCodes.Usage, "demo", "--report", "");
        return data;
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Every_command_follows_the_exit_code_table(int expected, string[] args)
    {
        var (exit, _, stderr) = ConsoleCapture.RunMain(args);
        Assert.True(exit == expected, $"freqreadout {string.Join(' ', args)} exited {exit}, the table says {expected}:\n{stderr}");
        string[] errors = stderr.Split('\n').Where(l => l.StartsWith("error: ", StringComparison.Ordinal)).ToArray();
        if (expected == ExitCodes.Ok)
        {
            Assert.Empty(errors);
        }
        else
        {
            Assert.Single(errors);
            Assert.DoesNotContain("   at ", stderr);
            Assert.DoesNotContain("a bug in freqreadout", stderr);
        }
    }

    [Fact]
    public void The_documented_table_lists_exactly_the_codes_the_program_uses()
    {
        string doc = File.ReadAllText(Path.Combine(CliProcess.RepoRoot(), "docs", "exit-codes.md"));
        var documented = Regex.Matches(doc, @"^\| (\d+) \|", RegexOptions.Multiline).Select(m => int.Parse(m.Groups[1].Value)).ToArray();
        var used = typeof(ExitCodes).GetFields().Select(f => (int)f.GetValue(null)!).ToArray();
        Assert.Equal(used.OrderBy(c => c), documented.OrderBy(c => c));
    }

    [Fact]
    public void Bare_freqreadout_prints_the_help_and_exits_with_the_usage_code()
    {
        CliProcess.Result r = CliProcess.Run(Dir, Array.Empty<string>(), 60_000);
        Assert.Equal(ExitCodes.Usage, r.ExitCode);
        Assert.Contains("USAGE", r.Stdout);
        Assert.Contains("count", r.Stdout);
    }

    [Fact]
    public void Version_prints_the_version_and_the_capture_formats()
    {
        var (exit, stdout, stderr) = ConsoleCapture.RunMain("--version");
        Assert.Equal(ExitCodes.Ok, exit);
        Assert.Equal(string.Empty, stderr);
        Assert.Matches(@"^freqreadout \d+\.\d+\.\d+ \(text capture format 1, binary capture format \d+\)\n$", stdout);
    }

    [Theory]
    [InlineData("count", "<capture>")]
    [InlineData("replay", "<capture>")]
    [InlineData("calibrate", "<capture>")]
    public void An_empty_capture_path_is_a_usage_error_naming_the_argument(string command, string name)
    {
        var (exit, _, stderr) = ConsoleCapture.RunMain(command, "");
        Assert.Equal(ExitCodes.Usage, exit);
        Assert.Equal($"error: {name} is an empty path: expected a file name (or - for standard input); see freqreadout --help\n", stderr);
    }

    [Theory]
    [InlineData("--readings")]
    [InlineData("--events")]
    public void An_empty_output_path_is_a_usage_error_naming_the_option(string option)
    {
        var (exit, _, stderr) = ConsoleCapture.RunMain("replay", Contract("snapshots.edges.csv"), option, " ");
        Assert.Equal(ExitCodes.Usage, exit);
        Assert.Equal($"error: {option} is an empty path: expected a file name; see freqreadout --help\n", stderr);
    }

    [Theory]
    [InlineData("count")]
    [InlineData("replay")]
    public void A_dash_reads_the_capture_from_standard_input(string command)
    {
        Func<Stream> saved = StandardStreams.OpenInput;
        try
        {
            StandardStreams.OpenInput = () => File.OpenRead(Contract("snapshots.edges.csv"));
            var (exit, stdout, stderr) = ConsoleCapture.RunMain(command, "-", "--json");
            Assert.True(exit == 0, stderr);
            var (_, fromFile, _) = ConsoleCapture.RunMain(command, Contract("snapshots.edges.csv"), "--json");
            Assert.Equal(fromFile.Replace(Contract("snapshots.edges.csv"), "<stdin>"), stdout);
        }
        finally
        {
            StandardStreams.OpenInput = saved;
        }
    }

    [Fact]
    public void A_capture_from_standard_input_is_named_stdin_in_errors_and_convert_reads_it_too()
    {
        Func<Stream> saved = StandardStreams.OpenInput;
        try
        {
            StandardStreams.OpenInput = () => File.OpenRead(Contract("bad-tick-text.edges.csv"));
            var (exit, _, stderr) = ConsoleCapture.RunMain("count", "-");
            Assert.Equal(ExitCodes.DataError, exit);
            Assert.StartsWith("error: <stdin>:6: expected the tick as an unsigned integer", stderr);

            StandardStreams.OpenInput = () => File.OpenRead(Contract("minimal.edges.csv"));
            string output = D("from-stdin.frb");
            (exit, _, stderr) = ConsoleCapture.RunMain("convert", "-", output);
            Assert.True(exit == 0, stderr);
            string back = D("from-stdin.csv");
            Assert.Equal(0, ConsoleCapture.RunMain("convert", output, back).Exit);
            Assert.Equal(File.ReadAllBytes(Contract("minimal.edges.csv")), File.ReadAllBytes(back));
        }
        finally
        {
            StandardStreams.OpenInput = saved;
        }
    }
}
