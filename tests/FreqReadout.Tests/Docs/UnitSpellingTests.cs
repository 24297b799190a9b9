using System.Text.RegularExpressions;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Docs;

/// <summary>
/// Temperatures are written one way everywhere: "deg C" (plain ASCII, shown alike by every terminal), in help
/// texts, messages, outputs and the manual. Never a degree sign, "degrees", "Celsius", or a bare "C" after a number.
/// </summary>
public sealed class UnitSpellingTests
{
    /// <summary>Other spellings of a temperature unit: a degree sign, degree(s), Celsius, degC, or "20 C" / "(-100, 200) C".</summary>
    private static readonly Regex OtherSpelling = new(@"°|\bdegrees?\b(?! of freedom)|Celsius|\bdegC\b|(\d|\)|\])\sC\b(?!\+\+)", RegexOptions.Compiled);

    /// <summary>A code span that only names a member (`ITemperaturePort.TryReadCelsius`, `Foo.Bar(int)`): code, not a unit written in prose.</summary>
    private static readonly Regex IdentifierSpan = new(@"`[A-Za-z_][A-Za-z0-9_.]*(\([A-Za-z0-9_., ]*\))?`", RegexOptions.Compiled);

    internal static IEnumerable<string> Offending(string text) =>
        text.Split('\n').Where(l => OtherSpelling.IsMatch(IdentifierSpan.Replace(l.Replace("L C", string.Empty, StringComparison.Ordinal), string.Empty)));

    [Fact]
    public void Member_names_in_code_spans_are_not_units_but_prose_still_is()
    {
        Assert.Empty(Offending("| `ITemperaturePort.TryReadCelsius` | 50 (port) | 11: 1 |"));
        Assert.Single(Offending("reads the temperature in Celsius from `ITemperaturePort.TryReadCelsius`"));
        Assert.Single(Offending("`temp 20 C`"));
    }

    public static TheoryData<string> Commands() => new() { "demo", "count", "replay", "calibrate", "convert", "simulate", "coil", "plan", "stability", "tune", "record" };

    [Theory]
    [MemberData(nameof(Commands))]
    public void Help_texts_write_temperatures_as_deg_C(string command)
    {
        var r = CliProcess.Run(Path.GetTempPath(), new[] { command, "--help" });
        Assert.Equal(0, r.ExitCode);
        Assert.Contains("--", r.Stdout);
        Assert.Empty(Offending(r.Stdout));
    }

    [Fact]
    public void The_manual_writes_temperatures_as_deg_C()
    {
        string root = CliProcess.RepoRoot();
        var files = new List<string> { Path.Combine(root, "README.md"), Path.Combine(root, "DEVELOPERS.md"), Path.Combine(root, "host", "Scenes", "README.md") };
        files.AddRange(Directory.GetFiles(Path.Combine(root, "docs"), "*.md"));
        files.AddRange(Directory.GetFiles(Path.Combine(root, "hardware-notes"), "*.md"));
        var bad = files.SelectMany(f => Offending(File.ReadAllText(f)).Select(l => Path.GetFileName(f) + ": " + l.Trim())).ToList();
        Assert.True(bad.Count == 0, string.Join("\n", bad));
        Assert.Contains("deg C", File.ReadAllText(Path.Combine(root, "docs", "scene-format.md")));
    }

    [Theory]
    [InlineData("{ \"temperature\": { \"start_c\": 500 } }", "temperature.start_c must be in (-100, 200) deg C")]
    [InlineData("{ \"hardware\": { \"temp_resolution_c\": 50 } }", "hardware.temp_resolution_c must be in [0, 10] deg C")]
    public void Scene_messages_write_temperatures_as_deg_C(string json, string expected)
    {
        var ex = Assert.Throws<SceneException>(() => Scene.Parse(json, "s.json"));
        Assert.Contains(expected, ex.Message);
        Assert.Empty(Offending(ex.Message));
    }

    [Fact]
    public void Capture_messages_write_temperatures_as_deg_C()
    {
        var e = Captures.CaptureTestFiles.ErrorOf("# freqreadout capture 1\n# clock_hz = 1000000\ntick,temp_c\n1,warm\n");
        Assert.Contains("deg C", e.Message);
        Assert.Empty(Offending(e.Message));
    }

    [Fact]
    public void The_check_itself_catches_the_other_spellings()
    {
        Assert.NotEmpty(Offending("warming 12.0 -> 24.0 C, tempco"));
        Assert.NotEmpty(Offending("in (-100, 200) C (got 500)"));
        Assert.NotEmpty(Offending("21.5 °C"));
        Assert.NotEmpty(Offending("in degrees Celsius"));
        Assert.Empty(Offending("warming 12.0 -> 24.0 deg C, f = 1 / (2 pi sqrt(L C))"));
    }
}
