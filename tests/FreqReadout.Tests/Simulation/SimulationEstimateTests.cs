using System.Globalization;
using System.Text.RegularExpressions;
using FreqReadout.Host.Simulation;
using FreqReadout.Tests.Commands;
using FreqReadout.Tests.Output;

namespace FreqReadout.Tests.Simulation;

/// <summary>
/// <c>simulate</c> states the size and time of a long run before it starts (measured on a trial run),
/// and refuses a run larger than the free space of the output's folder, before anything is written.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class SimulationEstimateTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-estimate").FullName;

    public void Dispose() => Directory.Delete(_dir, true);

    /// <summary>The demo scene with every recorded edge of a 20 MHz oscillator (the scene format's highest rate), for <paramref name="durationS"/>.</summary>
    private string FastScene(double durationS)
    {
        Scene scene = DemoScenes.FloorScan();
        scene.Oscillator.FrequencyHz = 20e6;
        scene.Hardware.Prescale = 1;
        scene.Hardware.TempEveryRows = 0;
        scene.DurationS = durationS;
        string path = Path.Combine(_dir, $"fast-{durationS.ToString(CultureInfo.InvariantCulture)}.json");
        File.WriteAllText(path, scene.ToJson());
        return path;
    }

    [Fact]
    public void A_run_larger_than_the_free_space_is_refused_before_anything_is_written()
    {
        // A week of 20 MHz edges: about 1.2e13 rows, over 100 TB of text, more than any test machine's disk.
        string scene = FastScene(604800);
        string output = Path.Combine(_dir, "week.csv");
        File.WriteAllText(output, "an older capture\n");
        var before = FileSnapshot.Of(_dir);
        var (exit, stdout, stderr) = ConsoleCapture.RunMain("simulate", "--scene", scene, "--out", output);
        Assert.Equal(1, exit);
        string[] lines = stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.True(lines.Length == 1, stderr);
        Assert.Matches(@"^error: --out .*week\.csv: the capture would need about 1\.2e13 rows, \d+ TB \(text\), about \d+ days on this machine \(measured on a trial of \d+ rows\), but .* has only .* free; shorten it \(--duration-s, duration_s\), write --format binary, or write to a larger disk \(nothing written\)$", lines[0]);
        Assert.Equal(string.Empty, stdout);
        FileSnapshot.AssertUnchanged(before, _dir, "refused run");

        // The same through the --duration-s option on a scene that is short by itself.
        (exit, _, stderr) = ConsoleCapture.RunMain("simulate", "--scene", FastScene(1), "--duration-s", "604800", "--out", output, "--format", "binary");
        Assert.Equal(1, exit);
        Assert.Contains("(binary)", stderr);
        Assert.Contains("or write to a larger disk (nothing written)", stderr);
        Assert.DoesNotContain("write --format binary", stderr);
    }

    [Fact]
    public void A_long_run_states_its_size_and_time_first_and_the_size_holds()
    {
        // 0.15 s of 20 MHz edges: 3e6 rows, more than SimulationEstimate.LongRunRows.
        string scene = FastScene(0.15);
        string output = Path.Combine(_dir, "long.frb");
        var (exit, _, stderr) = ConsoleCapture.RunMain("simulate", "--scene", scene, "--out", output, "--format", "binary");
        Assert.True(exit == 0, stderr);
        Match stated = Regex.Match(stderr, @"simulate: about (?<rows>\d+) rows, (?<size>[\d.]+) (?<unit>kB|MB) \(binary\), about \d+ (s|min) on this machine \(measured on a trial of \d+ rows\)");
        Assert.True(stated.Success, stderr);
        long rows = long.Parse(stated.Groups["rows"].Value, CultureInfo.InvariantCulture);
        double bytes = double.Parse(stated.Groups["size"].Value, CultureInfo.InvariantCulture) * (stated.Groups["unit"].Value == "MB" ? 1e6 : 1e3);
        Assert.True(rows > SimulationEstimate.LongRunRows);

        using var reader = FreqReadout.Host.Captures.CaptureFile.Open(output);
        long actualRows = reader.ReadRows().LongCount();
        double actualBytes = new FileInfo(output).Length;
        // The row count follows from rate x duration; bytes per row come from the trial (same scene, same format).
        Assert.InRange(rows / (double)actualRows, 0.99, 1.01);
        Assert.InRange(bytes / actualBytes, 0.95, 1.05);
    }

    [Fact]
    public void A_short_run_states_nothing_and_the_units_read_well()
    {
        var (exit, _, stderr) = ConsoleCapture.RunMain("simulate", "--demo", "--duration-s", "1", "--out", Path.Combine(_dir, "short.csv"));
        Assert.Equal(0, exit);
        Assert.DoesNotContain("simulate: about", stderr);
        Assert.Equal("145 TB", SimulationEstimate.Bytes(1.449e14));
        Assert.Equal("3.20 MB", SimulationEstimate.Bytes(3.2e6));
        Assert.Equal("999 B", SimulationEstimate.Bytes(999));
        Assert.Equal("45 s", SimulationEstimate.Duration(45));
        Assert.Equal("25 min", SimulationEstimate.Duration(1500));
        Assert.Equal("3.0 h", SimulationEstimate.Duration(10800));
        Assert.Equal("508 days", SimulationEstimate.Duration(508 * 86400.0));
    }
}
