using FreqReadout.Host.Commands;
using System.Globalization;
using System.Text.Json;
using FreqReadout.Tests.Tracking;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// <c>freqreadout calibrate</c> end to end: a capture whose search frequency follows temperature with a
/// known tempco (invented data) gives that tempco back, and replaying with it removes the temperature
/// steps that otherwise read as shifts.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class CalibrateCommandTests : IDisposable
{
    private const double F0 = 100_000;
    private const double Tempco = -12; // ppm/K, synthetic truth
    private readonly string _dir = Path.Combine(Path.GetTempPath(), "freqreadout-cal-" + Guid.NewGuid().ToString("N"));

    public CalibrateCommandTests()
    {
        Directory.CreateDirectory(_dir);
    }

    public void Dispose()
    {
        Directory.Delete(_dir, true);
    }

    // A slow ramp of 0.01 K/s plus fast steps of +3 K at 60 s and -2 K at 120 s (3 s each).
    private static double TemperatureC(double t) =>
        20 + (0.01 * t) + (3 * Math.Clamp((t - 60) / 3, 0, 1)) - (2 * Math.Clamp((t - 120) / 3, 0, 1));

    private string WriteCapture()
    {
        var capture = new SyntheticEdgeCapture
        {
            DurationSeconds = 200,
            TemperatureC = TemperatureC,
            TemperatureEverySeconds = 0.2,
            SearchHzAt = t => (F0 * (1 + (Tempco * 1e-6 * (TemperatureC(t) - 20)))) + new TargetPass(90, 1.0, 2.0).ShiftAt(t),
        };
        string path = Path.Combine(_dir, "temp.edges.csv");
        capture.Write(path);
        return path;
    }

    [Fact]
    public void Calibrate_recovers_the_tempco_and_replay_with_it_removes_the_steps()
    {
        string path = WriteCapture();
        var (exit, stdout, stderr) = ConsoleCapture.Run("calibrate", path, "--json");
        Assert.True(exit == 0, stderr);
        using var doc = JsonDocument.Parse(stdout);
        JsonElement o = doc.RootElement;
        double tempco = o.GetProperty("tempco_ppm_per_k").GetDouble();
        double se = o.GetProperty("standard_error_ppm_per_k").GetDouble();

        // Truth -12 ppm/K; the temperature sample leads the 0.1 s gates by up to a gate, so allow 2 % plus 4 SE.
        Assert.InRange(tempco, Tempco - (0.24 + (4 * se)), Tempco + 0.24 + (4 * se));
        Assert.InRange(se, 1e-5, 0.2);
        Assert.Equal("search", o.GetProperty("signal").GetString());
        Assert.InRange(o.GetProperty("min_temp_c").GetDouble(), 19.9, 20.2);
        Assert.InRange(o.GetProperty("max_temp_c").GetDouble(), 24.0, 24.3); // 20 + 0.01 x 119 + 3

        // Without compensation the tracker (issue 8) follows both temperature steps (-36 ppm = -3.6 Hz, then
        // +24 ppm, over a few seconds each) as changes of drift rate: no event is made of them and the pass at
        // 90 s is still found; with the fitted tempco only the real pass remains as well.
        var (_, plain, _) = ConsoleCapture.Run("replay", path, "--json");
        using var plainDoc = JsonDocument.Parse(plain);
        JsonElement plainEvent = Assert.Single(plainDoc.RootElement.GetProperty("events").EnumerateArray().ToArray());
        Assert.InRange(plainEvent.GetProperty("peak_s").GetDouble(), 89.5, 90.5);

        var (exit2, compensated, stderr2) = ConsoleCapture.Run("replay", path, "--json", "--tempco-ppm-per-k", tempco.ToString("R", CultureInfo.InvariantCulture));
        Assert.True(exit2 == 0, stderr2);
        using var compDoc = JsonDocument.Parse(compensated);
        Assert.Equal(0, compDoc.RootElement.GetProperty("rebaselines").GetArrayLength());
        JsonElement pass = Assert.Single(compDoc.RootElement.GetProperty("events").EnumerateArray().ToArray());
        Assert.InRange(pass.GetProperty("start_s").GetDouble(), 89, 90.1);
        Assert.Equal("non-ferrous", pass.GetProperty("class").GetString());
    }

    [Fact]
    public void Text_output_names_the_tempco_and_how_to_use_it()
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run("calibrate", WriteCapture());
        Assert.True(exit == 0, stderr);
        Assert.Contains("ppm/K", stdout);
        Assert.Contains("--tempco-ppm-per-k", stdout);
        Assert.Contains("standard error", stdout);
    }

    [Theory]
    [InlineData("--tempco-ppm-per-k", "-12")]
    [InlineData("--polarity", "inverted")]
    [InlineData("--unclear-band-sigma", "3")]
    public void Replay_options_that_calibrate_would_ignore_are_not_offered(string option, string value)
    {
        // The fit always uses the uncompensated frequencies of target-free readings: a tempco, the polarity and the
        // unclear band (which only class events) would change nothing, so calibrate does not take them.
        string path = WriteCapture();
        var (exit, stdout, stderr) = ConsoleCapture.RunMain("calibrate", path, "--json", option, value);
        Assert.Equal(ExitCodes.Usage, exit);
        Assert.Equal(string.Empty, stdout);
        Assert.Contains(option.TrimStart('-'), stderr);
        Assert.DoesNotContain(option, OptionNames(typeof(CalibrateCommand.Settings)));   // so --help does not list it
        Assert.Contains(option, OptionNames(typeof(ReplayCommand.Settings)));
    }

    [Fact]
    public void A_capture_without_temperature_is_a_clear_error()
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run("calibrate", Contract("minimal.edges.csv"), "--json");
        Assert.Equal(1, exit);
        Assert.Equal(string.Empty, stdout);
        Assert.Contains("no temp_c column", stderr);
    }

    [Fact]
    public void Malformed_capture_and_bad_option_give_their_errors()
    {
        string bad = Path.Combine(_dir, "bad-temp.edges.csv");
        File.WriteAllText(bad, "# freqreadout capture 1\n# clock_hz = 1000000\ntick,temp_c\n100,20.5\n200,warm\n300,\n");
        var (exit, _, stderr) = ConsoleCapture.Run("calibrate", bad);
        Assert.Equal(1, exit);
        Assert.Contains("bad-temp.edges.csv:5:", stderr);

        var (exit2, _, stderr2) = ConsoleCapture.Run("calibrate", Contract("beat-with-temp.edges.csv"), "--threshold-sigma", "2000");
        Assert.Equal(2, exit2);
        Assert.Contains("threshold_sigma must be in [1, 1000]", stderr2);
    }

    [Fact]
    public void Too_short_a_capture_says_why_there_is_no_fit()
    {
        // The contract beat sample has temp_c but lasts 0.2 s: no baseline, so no target-free readings.
        var (exit, stdout, stderr) = ConsoleCapture.Run("calibrate", Contract("beat-with-temp.edges.csv"), "--json");
        Assert.Equal(1, exit);
        Assert.Equal(string.Empty, stdout);
        Assert.Contains("no temperature point with target-free readings", stderr);
    }

    private static List<string> OptionNames(Type settings) => settings.GetProperties()
        .Select(p => p.GetCustomAttributes(typeof(Spectre.Console.Cli.CommandOptionAttribute), true).FirstOrDefault())
        .OfType<Spectre.Console.Cli.CommandOptionAttribute>()
        .SelectMany(o => o.LongNames.Select(n => "--" + n))
        .ToList();
}
