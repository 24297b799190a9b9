using System.Text.RegularExpressions;
using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Settings;
using FreqReadout.Tests.Docs;

namespace FreqReadout.Tests.Settings;

/// <summary>
/// docs/settings-format.md against the settings code: the key table lists exactly the parser's keys in the
/// formatter's order with the code's defaults, the page's examples read as it says, and its stated longest text is
/// the real one.
/// </summary>
public sealed class SettingsFormatDocumentedTests
{
    private static string[] CodeKeys() => Enumerable.Range(0, SettingsKeys.Count).Select(SettingsKeys.KeyAt).ToArray()!;

    [Fact]
    public void The_key_table_lists_exactly_the_parsers_keys_in_the_formatters_order()
    {
        List<string> documented = DocTables.KeysInOrder("settings-format.md", "keys: settings");
        Assert.Equal(CodeKeys(), documented);

        // And the parser knows exactly these: each is read, a key one character off is not.
        foreach (string key in documented)
        {
            Assert.True(SettingsKeys.IndexOf(key) >= 0, key);
            Assert.Equal(-1, SettingsKeys.IndexOf(key + "x"));
        }

        Assert.Null(SettingsKeys.KeyAt(SettingsKeys.Count));
    }

    [Fact]
    public void Every_default_in_the_table_is_the_codes_default_as_written()
    {
        string[] lines = DocTables.Doc("settings-format.md").Split('\n');
        int at = Array.FindIndex(lines, l => l.Trim() == "<!-- keys: settings -->");
        var defaults = new DeviceSettingsValues();
        int checkedKeys = 0;
        for (int i = at + 3; i < lines.Length && lines[i].StartsWith('|'); i++)
        {
            string[] cells = lines[i].Split('|');
            string key = Regex.Match(cells[1], "`([^`]+)`").Groups[1].Value;
            Match literal = Regex.Match(cells[4], "^\\s*`([^`]+)`\\s*$");
            Assert.True(literal.Success, key + ": no default in the table");
            Assert.Equal(DeviceSettingsFormatter.ValueText(defaults, SettingsKeys.IndexOf(key)), literal.Groups[1].Value);
            checkedKeys++;
        }

        Assert.Equal(SettingsKeys.Count, checkedKeys);
    }

    private static string[] TextBlocks() =>
        Regex.Matches(DocTables.Doc("settings-format.md"), "```text\\n(?<t>.*?)```", RegexOptions.Singleline).Select(m => m.Groups["t"].Value).ToArray();

    [Fact]
    public void The_example_at_a_glance_reads_without_problems()
    {
        string text = TextBlocks()[0];
        var values = new DeviceSettingsValues();
        var problems = new SettingsProblemList();
        Assert.True(DeviceSettingsParser.TryParse(text, values, problems));
        Assert.Equal(0, problems.TotalCount);
        Assert.Equal(SignalKind.Beat, values.Signal);
        Assert.Equal(BeatSide.Above, values.BeatSide);
        Assert.Equal(-12.5, values.TempcoPpmPerK);
        Assert.Equal(LinkMode.Readings, values.LinkMode);
    }

    [Fact]
    public void The_problems_example_gives_the_problems_the_page_shows()
    {
        string[] blocks = TextBlocks();
        string text = blocks[1];
        string[] expected = blocks[2].TrimEnd('\n').Split('\n');
        var values = new DeviceSettingsValues();
        var problems = new SettingsProblemList();
        Assert.True(DeviceSettingsParser.TryParse(text, values, problems));
        var got = Enumerable.Range(0, problems.Count).Select(i => problems.Get(i)).Select(p => $"{p.LineNumber} {p.Key}: {p.Message}").ToArray();
        Assert.Equal(expected, got);
        Assert.Equal(EstimatorKind.Reciprocal, values.Estimator);
        Assert.Equal(LinkMode.Readings, values.LinkMode);
        Assert.Equal(new DeviceSettingsValues().GateSeconds, values.GateSeconds);
    }

    [Fact]
    public void The_stated_limits_are_the_codes()
    {
        string page = DocTables.Doc("settings-format.md");
        Assert.Contains("at most 240 bytes, one frame's payload (the longest possible text is 235 bytes)", page);
        Assert.Equal(240, SettingsKeys.MaxTextBytes);
        var longest = new DeviceSettingsValues
        {
            GateSeconds = 86399.999999, ThresholdSigma = 999.99, Polarity = Polarity.Inverted, BeatSide = BeatSide.Above,
            SearchHz = 999999999999.99, TempcoPpmPerK = -999.99, LinkMode = LinkMode.Readings, ReadRateHz = 2000, StallLimitMilliseconds = 10000,
        };
        Assert.True(DeviceSettingsFormatter.TryFormat(longest, out string? text, out string? error), error);
        Assert.Equal(235, text!.Length); // DeviceSettingsFormatterTests shows no valid values write a longer text
        Assert.Contains("The list keeps the first " + SettingsProblemList.DefaultCapacity + " problems", page);
        Assert.Contains("cut to " + SettingsProblemList.MaxKeyChars + " characters", page);
        Assert.Contains("cut to " + DeviceSettingsParser.MaxQuotedChars + " characters", page);
        Assert.Contains("`" + SettingsKeys.MagicLine + "`", page);
    }
}
