using System.Globalization;
using FreqReadout.Host.Bench;
using FreqReadout.Tests.Docs;

namespace FreqReadout.Tests.Bench;

/// <summary>
/// The speed bench's structure (not its speed: no timing is asserted): every case is run and reported with its
/// median, ratio to the raw read and peak memory; the captures it builds are valid and replay; its options are checked.
/// </summary>
public sealed class BenchSpeedCommandTests
{
    [Fact]
    public void Speed_bench_times_every_case_and_prints_ratios_to_the_raw_read()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-speed-test-").FullName;
        try
        {
            var r = CliProcess.Run(dir, new[] { "bench", "speed", "--quick", "--edges", "100000", "--keep", Path.Combine(dir, "captures") });
            Assert.True(r.ExitCode == 0, r.Stderr);
            string[] rows = r.Stdout.Split('\n').Where(l => l.StartsWith("| ", StringComparison.Ordinal)).ToArray();
            Assert.StartsWith("| case | what | median s | min s | max s | x raw read | edges/s | peak MiB |", rows[0], StringComparison.Ordinal);
            var byName = rows.Skip(1).Select(l => l.Split('|', StringSplitOptions.TrimEntries)).ToDictionary(c => c[1], c => c);
            Assert.Equal(new[] { "raw read", "text replay", "binary replay", "start-up", "simulate" }, byName.Keys.ToArray());
            Assert.Equal("1.0", byName["raw read"][6]);
            foreach (var cells in byName.Values)
            {
                double median = double.Parse(cells[3], CultureInfo.InvariantCulture);
                double min = double.Parse(cells[4], CultureInfo.InvariantCulture);
                double max = double.Parse(cells[5], CultureInfo.InvariantCulture);
                Assert.True(min > 0 && min <= median && median <= max, string.Join('|', cells));
                Assert.True(double.Parse(cells[6], CultureInfo.InvariantCulture) > 0, "a ratio for " + cells[1]);
            }

            // Every freqreadout process reported its peak working set; the raw read, a minimal program, does not.
            Assert.Equal("-", byName["raw read"][8]);
            Assert.True(double.Parse(byName["text replay"][8], CultureInfo.InvariantCulture) > 0);
            Assert.Contains("5 interleaved runs per case", r.Stdout, StringComparison.Ordinal);

            // The captures it built (kept by --keep): the text one with its rows, its binary conversion, the start-up one.
            string captures = Path.Combine(dir, "captures");
            Assert.Equal(100_000 + 6, File.ReadAllLines(Path.Combine(captures, "big.csv")).Length); // 5 header lines and the column row
            Assert.True(File.Exists(Path.Combine(captures, "big.frb")));
            Assert.True(File.Exists(Path.Combine(captures, "small.csv")));
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }

    [Theory]
    [InlineData("--runs", "4")]
    [InlineData("--runs", "101")]
    [InlineData("--edges", "99999")]
    public void Speed_bench_refuses_options_out_of_range(string option, string value)
    {
        var r = CliProcess.Run(Path.GetTempPath(), new[] { "bench", "speed", option, value });
        Assert.Equal(2, r.ExitCode);
        Assert.Contains(option + " must be a whole number from", r.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Ratios_are_medians_over_the_raw_read_median()
    {
        var raw = new SpeedCaseResult(new SpeedCase("raw read", "r", new[] { RawRead.Argument, "f" }, 100));
        raw.Seconds.AddRange(new[] { 0.30, 0.10, 0.20, 0.12, 0.50 });
        var text = new SpeedCaseResult(new SpeedCase("text replay", "t", new[] { "replay", "f" }, 100));
        text.Seconds.AddRange(new[] { 0.6, 0.9, 0.8, 0.7, 5.0 });
        text.PeakWorkingSetBytes.AddRange(new[] { 40L << 20, 45L << 20 });
        Assert.Equal(0.20, raw.MedianSeconds, 12);
        Assert.Equal(0.80, text.MedianSeconds, 12);
        Assert.Equal(45, text.PeakMiB, 12);
        string table = SpeedBench.Markdown(new[] { raw, text }, SpeedBenchSize.Quick(), 1 << 20);
        Assert.Contains("| text replay | t | 0.800 | 0.600 | 5.000 | 4.0 |", table, StringComparison.Ordinal);
        Assert.Contains("| raw read | r | 0.200 | 0.100 | 0.500 | 1.0 |", table, StringComparison.Ordinal);
        Assert.True(double.IsNaN(SpeedCaseResult.Median(Array.Empty<double>())));
        Assert.Equal(2.5, SpeedCaseResult.Median(new[] { 3.0, 2.0 }), 12);
    }
}
