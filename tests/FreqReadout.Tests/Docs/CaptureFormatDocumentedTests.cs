using System.Reflection;
using System.Text.RegularExpressions;
using FreqReadout.Host.Captures;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Docs;

/// <summary>
/// docs/capture-text-format.md against the readers: its key and column tables list exactly what the readers know,
/// every error message it quotes is the one the reader gives for that content, and its complete example reads as
/// the page says.
/// </summary>
public sealed class CaptureFormatDocumentedTests
{
    private static readonly string Page = DocTables.Doc("capture-text-format.md");

    [Fact]
    public void The_metadata_table_lists_exactly_the_keys_the_readers_know()
    {
        var known = (string[])typeof(CaptureMetadataParser).Assembly
            .GetType("FreqReadout.Host.Captures.CaptureMetadataFormatter")!
            .GetField("KnownOrder", BindingFlags.NonPublic | BindingFlags.Static)!.GetValue(null)!;
        var documented = DocTables.KeysInOrder("capture-text-format.md", "keys: capture-metadata");
        Assert.Equal(known, documented);

        // Each is read as a known key: a value it cannot take is an error (note takes any text), never kept as unknown.
        foreach (string key in documented.Where(k => k != "note"))
        {
            string text = key == "clock_hz"
                ? "# freqreadout capture 1\n# clock_hz = ???\ntick\n1\n"
                : $"# freqreadout capture 1\n# clock_hz = 1000000\n# {key} = ???\ntick\n1\n";
            var e = ErrorOf(text);
            Assert.Contains(key, e.Message);
        }

        using var reader = ReadText("# freqreadout capture 1\n# clock_hz = 1\n# note = a, b = c\n# rig = 7\ntick\n1\n");
        Assert.Equal("a, b = c", reader.Metadata.Note);
        Assert.Equal(new KeyValuePair<string, string>("rig", "7"), Assert.Single(reader.Metadata.Extra));
    }

    [Fact]
    public void The_column_table_lists_exactly_the_columns_the_readers_know()
    {
        var documented = DocTables.KeysInOrder("capture-text-format.md", "keys: capture-columns");
        Assert.Equal(new[] { CaptureColumns.Tick, CaptureColumns.Count }.Concat(CaptureColumns.Optional), documented);
    }

    /// <summary>The error table's rows: content (from the contract sample or written here) and the quoted message.</summary>
    public static TheoryData<string, string?, string> ErrorRows() => new()
    {
        { "bad-no-magic.edges.csv", null, "bad-no-magic.edges.csv:1: " },
        { "bad-no-clock.edges.csv", null, "bad-no-clock.edges.csv:3: " },
        { "bad-beat-no-side.edges.csv", null, "bad-beat-no-side.edges.csv:3: " },
        { "bad-tick-text.edges.csv", null, "bad-tick-text.edges.csv:6: " },
        { "bad-tick-too-wide.edges.csv", null, "bad-tick-too-wide.edges.csv:6: " },
        { "bad-no-header-row.edges.csv", null, "bad-no-header-row.edges.csv:3: " },
        { "v2.csv", "# freqreadout capture 2\n# clock_hz = 1\ntick\n1\n", "v2.csv:1: " },
        { "k.csv", "# freqreadout capture 1\n# clock_hz = 1000000\n# Clock_Hz = 5\ntick\n1\n", "k.csv:3: " },
        { "d.csv", "# freqreadout capture 1\n# clock_hz = 1000000\n# clock_hz = 2000000\ntick\n100\n", "d.csv:3: " },
        { "c.csv", "# freqreadout capture 1\n# clock_hz = 1000000\ntick,speed\n1\n", "c.csv:3: " },
        { "r.csv", "# freqreadout capture 1\n# clock_hz = 1000000\ntick\n100\n100\n", "r.csv:5: " },
    };

    [Theory]
    [MemberData(nameof(ErrorRows))]
    public void Every_quoted_error_is_the_readers_message(string name, string? content, string prefix)
    {
        CaptureFormatException e = content == null ? ErrorOfFile(Contract(name)) : ErrorOf(content, name);
        string message = Path.GetFileName(e.SourceName) + ":" + e.LineNumber + ": " + e.Problem;
        Assert.StartsWith(prefix, message);
        Assert.True(Page.Contains("`" + message + "`", StringComparison.Ordinal), "docs/capture-text-format.md does not quote the reader's message:\n" + message);
    }

    [Fact]
    public void The_error_table_quotes_no_message_that_is_not_tested_here()
    {
        string table = Page[Page.IndexOf("| file content | message |", StringComparison.Ordinal)..Page.IndexOf("A capture that is damaged part-way", StringComparison.Ordinal)];
        int rows = Regex.Matches(table, @"^\| .* \| `[^`]+:\d+: ", RegexOptions.Multiline).Count;
        Assert.Equal(ErrorRows().Count(), rows);
    }

    [Fact]
    public void The_complete_example_with_trailer_and_unknown_key_reads_as_described()
    {
        Match m = Regex.Match(Page, @"### 5\. Trailer and unknown keys\s+```\n(?<text>.*?)```", RegexOptions.Singleline);
        Assert.True(m.Success);
        using var reader = ReadText(m.Groups["text"].Value);
        var rows = reader.ReadRows().ToList();
        Assert.Equal(new ulong[] { 100, 2600, 5100 }, rows.Select(r => r.Tick));
        Assert.Equal(new KeyValuePair<string, string>("board", "bench rig 2"), Assert.Single(reader.Metadata.Extra));
        Assert.Equal(new[] { "frames_lost", "crc_errors" }, reader.Trailer.Select(t => t.Key));
    }
}
