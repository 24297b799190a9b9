using System.Globalization;
using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Readout;
using FreqReadout.Settings;

namespace FreqReadout.Tests.Settings;

/// <summary>
/// DeviceSettingsParser on hand-made texts: what is read, what is reported (line, key, what is allowed) and that a
/// bad setting keeps its default while the others are applied.
/// </summary>
public sealed class DeviceSettingsParserTests
{
    private const string Full =
        "# freqreadout settings 1\n" +
        "gate_s = 0.05\n" +
        "estimator = reciprocal\n" +
        "threshold_sigma = 6.5\n" +
        "polarity = inverted\n" +
        "signal = beat\n" +
        "beat_side = below\n" +
        "search_hz = 101234.56\n" +
        "tempco_ppm_per_k = -12.25\n" +
        "link = capture\n" +
        "read_rate_hz = 1500\n" +
        "stall_ms = 120\n";

    private static (bool Applied, DeviceSettingsValues Values, SettingsProblemList Problems) Parse(string? text)
    {
        var values = new DeviceSettingsValues();
        var problems = new SettingsProblemList();
        bool applied = DeviceSettingsParser.TryParse(text!, values, problems);
        Assert.True(values.TryValidate(out string? error), "parsed values are not valid: " + error);
        return (applied, values, problems);
    }

    private static string ProblemsText(SettingsProblemList problems)
    {
        var lines = new List<string>();
        for (int i = 0; i < problems.Count; i++)
        {
            SettingsProblem p = problems.Get(i);
            lines.Add($"{p.LineNumber}:{p.Key}: {p.Message}");
        }

        return string.Join("\n", lines);
    }

    private static void AssertExpectedFull(DeviceSettingsValues v)
    {
        Assert.Equal(0.05, v.GateSeconds);
        Assert.Equal(EstimatorKind.Reciprocal, v.Estimator);
        Assert.Equal(6.5, v.ThresholdSigma);
        Assert.Equal(Polarity.Inverted, v.Polarity);
        Assert.Equal(SignalKind.Beat, v.Signal);
        Assert.Equal(BeatSide.Below, v.BeatSide);
        Assert.Equal(101234.56, v.SearchHz);
        Assert.Equal(-12.25, v.TempcoPpmPerK);
        Assert.Equal(LinkMode.Capture, v.LinkMode);
        Assert.Equal(1500, v.ReadRateHz);
        Assert.Equal(120, v.StallLimitMilliseconds);
    }

    [Fact]
    public void Every_key_is_read()
    {
        var r = Parse(Full);
        Assert.True(r.Applied);
        Assert.Equal(0, r.Problems.TotalCount);
        AssertExpectedFull(r.Values);
    }

    [Fact]
    public void CRLF_blank_lines_comments_tabs_and_leading_blank_lines_read_the_same()
    {
        string text = "\r\n  \n" + Full.Replace("\n", "\r\n").Replace(" = ", "\t=  ").Replace("link", "# a comment\r\n\r\n   # another\r\nlink");
        var r = Parse(text);
        Assert.True(r.Applied, ProblemsText(r.Problems));
        Assert.Equal(0, r.Problems.TotalCount);
        AssertExpectedFull(r.Values);
    }

    [Fact]
    public void A_last_line_without_LF_is_read()
    {
        var r = Parse("# freqreadout settings 1\ngate_s=2");
        Assert.True(r.Applied);
        Assert.Equal(0, r.Problems.TotalCount);
        Assert.Equal(2.0, r.Values.GateSeconds);
    }

    [Fact]
    public void Keys_left_out_keep_the_defaults_of_the_counter_and_readout_settings()
    {
        var r = Parse("# freqreadout settings 1\n");
        Assert.True(r.Applied);
        Assert.Equal(0, r.Problems.TotalCount);
        Assert.True(SettingsTestValues.Same(new DeviceSettingsValues(), r.Values));
        Assert.Equal(new CounterSettings().GateSeconds, r.Values.GateSeconds);
        Assert.Equal(new ReadoutSettings().ThresholdSigma, r.Values.ThresholdSigma);
        Assert.Equal(new CounterSettings().Estimator, r.Values.Estimator);
    }

    [Theory]
    [InlineData("", 0)]
    [InlineData("   \n\t\r\n", 0)]
    [InlineData("gate_s = 1\n", 1)]
    [InlineData("# a comment first\n# freqreadout settings 1\ngate_s = 1\n", 1)]
    [InlineData("\n\n# FreqReadout settings 1\ngate_s = 1\n", 3)]  // case matters
    [InlineData("# freqreadout settings 1 extra\ngate_s = 1\n", 1)]
    [InlineData("# freqreadout capture 1\n", 1)]
    public void Without_the_magic_line_nothing_is_applied(string text, int line)
    {
        var r = Parse(text);
        Assert.False(r.Applied);
        Assert.True(SettingsTestValues.Same(new DeviceSettingsValues(), r.Values));
        Assert.Equal(1, r.Problems.TotalCount);
        Assert.Equal(line, r.Problems.Get(0).LineNumber);
        Assert.Contains("# freqreadout settings 1", r.Problems.Get(0).Message);
        Assert.Contains("defaults used", r.Problems.Get(0).Message);
    }

    [Theory]
    [InlineData("# freqreadout settings 2\ngate_s = 1\n", "\"2\"")]
    [InlineData("\n# freqreadout settings 0\ngate_s = 1\n", "\"0\"")]
    [InlineData("# freqreadout settings 99999999999999999999999999999\n", "\"999999999999999999999999...\"")]
    public void An_unknown_version_applies_nothing(string text, string quoted)
    {
        var r = Parse(text);
        Assert.False(r.Applied);
        Assert.True(SettingsTestValues.Same(new DeviceSettingsValues(), r.Values));
        SettingsProblem p = Assert.IsType<SettingsProblem>(r.Problems.Get(0));
        Assert.Equal(1, r.Problems.TotalCount);
        Assert.Equal(text.StartsWith('\n') ? 2 : 1, p.LineNumber);
        Assert.Contains("version " + quoted + " is unknown (this reader knows 1)", p.Message);
    }

    [Fact]
    public void No_text_and_no_values_are_reported_not_thrown()
    {
        var r = Parse(null);
        Assert.False(r.Applied);
        Assert.Equal(0, r.Problems.Get(0).LineNumber);

        var problems = new SettingsProblemList();
        Assert.False(DeviceSettingsParser.TryParse(Full, null!, problems));
        Assert.Equal(1, problems.Count);

        var values = new DeviceSettingsValues();
        Assert.True(DeviceSettingsParser.TryParse(Full, values, null!)); // problems not wanted
        AssertExpectedFull(values);
    }

    // Each bad line: its number, its key and what is allowed; the key keeps its default; the other keys are applied.
    [Theory]
    [InlineData("gate_s = 0", "gate_s", "[1e-6, 86400]")]
    [InlineData("gate_s = 100000", "gate_s", "[1e-6, 86400]")]
    [InlineData("gate_s = 0.0000001", "gate_s", "more than 6 decimal places")]
    [InlineData("gate_s = 1e-3", "gate_s", "\"1e-3\" is not a number")]
    [InlineData("gate_s = 0,1", "gate_s", "\"0,1\" is not a number")]
    [InlineData("gate_s =", "gate_s", "\"\" is not a number")]
    [InlineData("estimator = snapshot_regression", "estimator", "is not one of reciprocal or regression")]
    [InlineData("estimator = Regression", "estimator", "is not one of reciprocal or regression")]
    [InlineData("threshold_sigma = 0.5", "threshold_sigma", "[1, 1000]")]
    [InlineData("threshold_sigma = 1.5", "threshold_sigma", "hysteresis_sigma must be in [0, threshold_sigma)")]
    [InlineData("threshold_sigma = 5.001", "threshold_sigma", "more than 2 decimal places")]
    [InlineData("polarity = reversed", "polarity", "normal or inverted")]
    [InlineData("signal = both", "signal", "search or beat")]
    [InlineData("beat_side = left", "beat_side", "none, above or below")]
    [InlineData("search_hz = -1", "search_hz", "[0, 1e12]")]
    [InlineData("search_hz = 100000000000000", "search_hz", "more digits than the settings text holds")]
    [InlineData("search_hz = 10000000000000", "search_hz", "[0, 1e12]")]
    [InlineData("tempco_ppm_per_k = 1000.01", "tempco_ppm_per_k", "[-1000, 1000]")]
    [InlineData("link = all", "link", "off, readings or capture")]
    [InlineData("read_rate_hz = 99", "read_rate_hz", "[100, 2000]")]
    [InlineData("read_rate_hz = 2001", "read_rate_hz", "[100, 2000]")]
    [InlineData("read_rate_hz = 1000.5", "read_rate_hz", "is not an integer (a fraction must be zeros)")]
    [InlineData("read_rate_hz = fast", "read_rate_hz", "is not an integer (digits")]
    [InlineData("read_rate_hz = 99999999999", "read_rate_hz", "[100, 2000]")] // beyond int
    [InlineData("stall_ms = 9", "stall_ms", "[10, 10000]")]
    [InlineData("stall_ms = 10001", "stall_ms", "[10, 10000]")]
    public void A_bad_value_is_reported_with_what_is_allowed_and_keeps_its_default(string line, string key, string allowed)
    {
        // The bad line goes third, among good lines of other keys.
        string text = "# freqreadout settings 1\n" + (key == "link" ? "stall_ms = 77\n" : "link = readings\n") + line + "\n" + (key == "polarity" ? "signal = beat\nbeat_side = above\n" : "polarity = inverted\n");
        var r = Parse(text);
        Assert.True(r.Applied);
        Assert.Equal(1, r.Problems.TotalCount);
        SettingsProblem p = r.Problems.Get(0);
        Assert.Equal(3, p.LineNumber);
        Assert.Equal(key, p.Key);
        Assert.Contains(allowed, p.Message);
        Assert.EndsWith("the default stays", p.Message);

        var defaults = new DeviceSettingsValues();
        int index = SettingsKeys.IndexOf(key);
        Assert.Equal(DeviceSettingsFormatter.ValueText(defaults, index), DeviceSettingsFormatter.ValueText(r.Values, index));
        if (key == "link")
        {
            Assert.Equal(77, r.Values.StallLimitMilliseconds);
        }
        else
        {
            Assert.Equal(LinkMode.Readings, r.Values.LinkMode);
        }

        if (key == "polarity")
        {
            Assert.Equal(SignalKind.Beat, r.Values.Signal);
        }
        else
        {
            Assert.Equal(Polarity.Inverted, r.Values.Polarity);
        }
    }

    [Fact]
    public void Unknown_keys_and_lines_without_equals_are_reported_and_ignored()
    {
        var r = Parse("# freqreadout settings 1\ngate = 1\ngate_s = 2\nGATE_S = 3\njust words\n=5\nlink = readings\n");
        Assert.True(r.Applied);
        Assert.Equal("2:gate: unknown key (ignored)\n4:GATE_S: unknown key (ignored)\n"
            + "5:: expected 'key = value', a comment starting with '#' or a blank line, got \"just words\" (ignored)\n"
            + "6:: unknown key (ignored)", ProblemsText(r.Problems));
        Assert.Equal(2.0, r.Values.GateSeconds);
        Assert.Equal(LinkMode.Readings, r.Values.LinkMode);
    }

    [Fact]
    public void Of_a_key_given_twice_the_first_line_counts_even_when_its_value_was_bad()
    {
        var r = Parse("# freqreadout settings 1\ngate_s = 0.2\nlink = capture\ngate_s = 0.3\nstall_ms = 0\nstall_ms = 80\n");
        Assert.Equal(0.2, r.Values.GateSeconds);
        Assert.Equal(new DeviceSettingsValues().StallLimitMilliseconds, r.Values.StallLimitMilliseconds);
        Assert.Equal(3, r.Problems.TotalCount);
        Assert.Equal("4:gate_s: given again (line 2 counts; this line is ignored)", $"{r.Problems.Get(0).LineNumber}:{r.Problems.Get(0).Key}: {r.Problems.Get(0).Message}");
        Assert.Equal(5, r.Problems.Get(1).LineNumber);
        Assert.Equal("6:stall_ms: given again (line 5 counts; this line is ignored)", $"{r.Problems.Get(2).LineNumber}:{r.Problems.Get(2).Key}: {r.Problems.Get(2).Message}");
    }

    [Theory]
    [InlineData("signal = beat\n", 2)]                    // beat_side left out: reported on the signal line
    [InlineData("signal = beat\nbeat_side = none\n", 3)]  // reported on the beat_side line
    [InlineData("beat_side = none\nsignal = beat\n", 2)]
    [InlineData("signal = beat\nbeat_side = up\n", 3)]    // a bad beat_side is reported twice: its value, then the rule
    public void Beat_without_a_beat_side_is_reported_and_falls_back_to_search(string lines, int line)
    {
        var r = Parse("# freqreadout settings 1\n" + lines + "gate_s = 1\n");
        Assert.True(r.Applied);
        Assert.Equal(SignalKind.Search, r.Values.Signal);
        Assert.Equal(1.0, r.Values.GateSeconds);
        SettingsProblem p = r.Problems.Get(r.Problems.Count - 1);
        Assert.Equal("beat_side", p.Key);
        Assert.Equal(line, p.LineNumber);
        Assert.Contains("above or below when signal = beat", p.Message);
    }

    [Fact]
    public void A_tempco_beat_mode_cannot_use_is_reported_and_falls_back_to_off()
    {
        var r = Parse("# freqreadout settings 1\nsignal = beat\nbeat_side = above\ntempco_ppm_per_k = 3\n");
        Assert.Equal(0.0, r.Values.TempcoPpmPerK);
        Assert.Equal(SignalKind.Beat, r.Values.Signal);
        SettingsProblem p = Assert.IsType<SettingsProblem>(r.Problems.Get(0));
        Assert.Equal(1, r.Problems.TotalCount);
        Assert.Equal(4, p.LineNumber);
        Assert.Equal("tempco_ppm_per_k", p.Key);
        Assert.Contains("needs search_hz > 0", p.Message);

        var withSearch = Parse("# freqreadout settings 1\nsignal = beat\nbeat_side = above\ntempco_ppm_per_k = 3\nsearch_hz = 90000\n");
        Assert.Equal(3.0, withSearch.Values.TempcoPpmPerK);
        Assert.Equal(0, withSearch.Problems.TotalCount);
    }

    [Fact]
    public void Problems_beyond_the_capacity_are_counted_not_kept_and_keys_are_cut_and_cleaned()
    {
        string text = "# freqreadout settings 1\n" + string.Concat(Enumerable.Range(0, 40).Select(i => "bad_key_\u00e9\u0001_" + new string('x', 40) + i + " = 1\n"));
        var problems = new SettingsProblemList(5);
        var values = new DeviceSettingsValues();
        Assert.True(DeviceSettingsParser.TryParse(text, values, problems));
        Assert.Equal(5, problems.Count);
        Assert.Equal(40, problems.TotalCount);
        Assert.Null(problems.Get(5));
        Assert.Null(problems.Get(-1));
        Assert.Equal(6, problems.Get(4).LineNumber);
        Assert.Equal(SettingsProblemList.MaxKeyChars, problems.Get(0).Key.Length);
        Assert.StartsWith("bad_key_??_xxx", problems.Get(0).Key);

        // A second read starts afresh.
        Assert.True(DeviceSettingsParser.TryParse(Full, values, problems));
        Assert.Equal(0, problems.TotalCount);
        AssertExpectedFull(values);
    }

    [Fact]
    public void A_second_read_starts_from_the_defaults()
    {
        var values = new DeviceSettingsValues();
        Assert.True(DeviceSettingsParser.TryParse(Full, values, new SettingsProblemList()));
        Assert.True(DeviceSettingsParser.TryParse("# freqreadout settings 1\nlink = readings\n", values, new SettingsProblemList()));
        var expected = new DeviceSettingsValues { LinkMode = LinkMode.Readings };
        Assert.True(SettingsTestValues.Same(expected, values), SettingsTestValues.Describe(values));
    }

    [Fact]
    public void A_comma_culture_reads_the_same()
    {
        CommaCulture.Run(() =>
        {
            var r = Parse(Full);
            Assert.Equal(0, r.Problems.TotalCount);
            AssertExpectedFull(r.Values);
            var comma = Parse("# freqreadout settings 1\ngate_s = 0,05\ntempco_ppm_per_k = \u22121\n");
            Assert.Equal(2, comma.Problems.TotalCount);
            Assert.Equal(new DeviceSettingsValues().GateSeconds, comma.Values.GateSeconds);
            return 0;
        });
    }
}
