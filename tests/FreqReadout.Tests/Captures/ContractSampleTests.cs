using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Captures;

/// <summary>
/// Every contract sample of docs/contracts (copied by the csproj to Data/contracts in the test output)
/// read as its README says.
/// The expected values below are the README's own statements about each (invented) sample, or
/// counted from the file itself where the README gives the count.
/// </summary>
public sealed class ContractSampleTests
{
    [Fact]
    public void Minimal_reads_101_edges_200_ticks_apart_on_a_10_MHz_clock()
    {
        // README: "50 kHz exactly: 10 MHz clock, 200 ticks per edge, 101 edges".
        using var reader = CaptureFile.Open(Contract("minimal.edges.csv"));
        Assert.Equal(10_000_000.0, reader.Metadata.ClockHz);
        Assert.Equal(CaptureKind.Edges, reader.Metadata.Kind);
        Assert.Equal(1, reader.Metadata.Prescale);
        Assert.Equal(64, reader.Metadata.TimerBits);
        Assert.Equal(SignalKind.Search, reader.Metadata.Signal);
        Assert.Empty(reader.Metadata.ExtraColumns);
        var rows = reader.ReadRows().ToList();
        Assert.Equal(101, rows.Count);
        Assert.Equal(1000UL, rows[0].Tick);
        Assert.Equal(4L, rows[0].LineNumber);
        for (int i = 1; i < rows.Count; i++)
        {
            Assert.Equal(200UL, rows[i].Tick - rows[i - 1].Tick);
        }

        Assert.Empty(reader.Warnings);
        Assert.Empty(reader.Trailer);
    }

    [Fact]
    public void Beat_with_temp_reads_all_three_columns_signal_beat_side_below()
    {
        using var reader = CaptureFile.Open(Contract("beat-with-temp.edges.csv"));
        var md = reader.Metadata;
        Assert.Equal(1_000_000.0, md.ClockHz);
        Assert.Equal(32, md.TimerBits);
        Assert.Equal(SignalKind.Beat, md.Signal);
        Assert.Equal(BeatSide.Below, md.BeatSide);
        Assert.Equal(118000.0, md.SearchHz);
        Assert.Equal(new DateTimeOffset(2026, 11, 30, 8, 15, 0, TimeSpan.Zero), md.StartedUtc);
        Assert.Equal("invented sample: bench test of a 400 Hz beat", md.Note);
        Assert.Equal(new[] { "temp_c", "mark" }, md.ExtraColumns);

        var rows = reader.ReadRows().ToList();
        Assert.Equal(81, rows.Count);

        // README: temp_c every 20th data row (data rows 1, 21, 41, 61, 81).
        var withTemp = rows.Select((r, i) => (r, i)).Where(x => x.r.TemperatureC.HasValue).Select(x => x.i + 1).ToArray();
        Assert.Equal(new[] { 1, 21, 41, 61, 81 }, withTemp);
        Assert.Equal(21.5, rows[0].TemperatureC);

        // README: the mark `rebaseline` on data row 41 (file line 51); no other mark.
        var marked = rows.Where(r => r.Mark != null).ToList();
        Assert.Single(marked);
        Assert.Equal("rebaseline", marked[0].Mark);
        Assert.Equal(51L, marked[0].LineNumber);
        Assert.Same(marked[0].Mark, rows[40].Mark);

        // 400 Hz beat on a 1 MHz clock: 2500 ticks per edge.
        for (int i = 1; i < rows.Count; i++)
        {
            Assert.Equal(2500UL, rows[i].Tick - rows[i - 1].Tick);
        }

        Assert.Empty(reader.Warnings);
    }

    [Fact]
    public void Snapshots_reads_2001_tick_count_pairs()
    {
        using var reader = CaptureFile.Open(Contract("snapshots.edges.csv"));
        var md = reader.Metadata;
        Assert.Equal(CaptureKind.Snapshots, md.Kind);
        Assert.Equal(1_000_000.0, md.ClockHz);
        Assert.Equal(64, md.CountBits);
        var rows = reader.ReadRows().ToList();
        Assert.Equal(2001, rows.Count);
        Assert.Equal((0UL, 0UL), (rows[0].Tick, rows[0].Count));
        Assert.Equal((1999847UL, 259980UL), (rows[^1].Tick, rows[^1].Count));

        // README: "a pulse counter read about every 1 ms (+-20 us)".
        for (int i = 1; i < rows.Count; i++)
        {
            ulong step = rows[i].Tick - rows[i - 1].Tick;
            Assert.InRange(step, 960UL, 1040UL);
        }
    }

    [Fact]
    public void Wrap16_reads_raw_ticks_below_2_pow_16_with_prescale_4()
    {
        using var reader = CaptureFile.Open(Contract("wrap16.edges.csv"));
        var md = reader.Metadata;
        Assert.Equal(8_000_000.0, md.ClockHz);
        Assert.Equal(4, md.Prescale);
        Assert.Equal(16, md.TimerBits);
        var rows = reader.ReadRows().ToList();
        Assert.Equal(200, rows.Count);
        Assert.All(rows, r => Assert.True(r.Tick < 65536));

        // Raw values wrap: some step goes down (README: "wraps often").
        int wraps = 0;
        for (int i = 1; i < rows.Count; i++)
        {
            if (rows[i].Tick < rows[i - 1].Tick)
            {
                wraps++;
            }
        }

        Assert.True(wraps >= 2, $"expected several wraps, found {wraps}");
    }

    [Fact]
    public void Bad_no_magic_is_not_a_capture_at_line_1()
    {
        var e = ErrorOfFile(Contract("bad-no-magic.edges.csv"));
        Assert.Equal(1L, e.LineNumber);
        Assert.Contains("not a capture", e.Problem);
        Assert.Contains("# freqreadout capture 1", e.Problem);
        Assert.StartsWith(Contract("bad-no-magic.edges.csv") + ":1: not a capture", e.Message);
    }

    [Fact]
    public void Bad_no_clock_names_the_missing_clock_hz()
    {
        var e = ErrorOfFile(Contract("bad-no-clock.edges.csv"));
        Assert.Contains("missing required metadata key 'clock_hz'", e.Problem);
        Assert.Equal(3L, e.LineNumber); // the column header row, where the header ends
    }

    [Fact]
    public void Bad_tick_text_fails_at_line_6_naming_the_value()
    {
        var e = ErrorOfFile(Contract("bad-tick-text.edges.csv"));
        Assert.Equal(6L, e.LineNumber);
        Assert.Contains("'2x0'", e.Problem);
        Assert.Contains("unsigned integer", e.Problem);
    }

    [Fact]
    public void Bad_beat_no_side_names_beat_side()
    {
        var e = ErrorOfFile(Contract("bad-beat-no-side.edges.csv"));
        Assert.Contains("'beat_side'", e.Problem);
        Assert.Equal(3L, e.LineNumber); // the `signal = beat` line
    }

    [Fact]
    public void Bad_tick_too_wide_fails_at_line_6_exceeding_the_timer_width()
    {
        var e = ErrorOfFile(Contract("bad-tick-too-wide.edges.csv"));
        Assert.Equal(6L, e.LineNumber);
        Assert.Contains("70000 exceeds the timer width", e.Problem);
        Assert.Contains("timer_bits = 16 allows 0 to 65535", e.Problem);
    }

    [Fact]
    public void Bad_no_header_row_fails_at_line_3_expecting_the_column_header()
    {
        var e = ErrorOfFile(Contract("bad-no-header-row.edges.csv"));
        Assert.Equal(3L, e.LineNumber);
        Assert.Contains("expected the column header row", e.Problem);
        Assert.Contains("'100'", e.Problem);
    }

    [Fact]
    public void Every_sample_file_is_covered_by_a_test()
    {
        // The README's table lists these ten files; a new sample must get a test here too.
        var expected = new[]
        {
            "bad-beat-no-side.edges.csv", "bad-no-clock.edges.csv", "bad-no-header-row.edges.csv", "bad-no-magic.edges.csv",
            "bad-tick-text.edges.csv", "bad-tick-too-wide.edges.csv", "beat-with-temp.edges.csv", "minimal.edges.csv",
            "snapshots.edges.csv", "wrap16.edges.csv",
        };
        var found = Directory.GetFiles(ContractsDir, "*.csv").Select(Path.GetFileName).OrderBy(n => n, StringComparer.Ordinal).ToArray();
        Assert.Equal(expected, found);
        string readme = File.ReadAllText(Contract("README.md"));
        Assert.All(expected, name => Assert.Contains(name, readme));
    }

    [Fact]
    public void Copies_are_identical_to_shared_contracts_when_that_folder_is_present()
    {
        string? shared = FindSharedContracts();
        if (shared == null)
        {
            // Outside the workspace (a plain clone) only the copies exist; they are checked above.
            return;
        }

        var sharedFiles = Directory.GetFiles(shared).Select(Path.GetFileName).OrderBy(n => n, StringComparer.Ordinal).ToArray();
        var copies = Directory.GetFiles(ContractsDir).Select(Path.GetFileName)
            .Where(n => n != OriginNote) // the project's own note beside the verbatim copies
            .OrderBy(n => n, StringComparer.Ordinal).ToArray();
        Assert.Equal(sharedFiles, copies);
        foreach (string name in sharedFiles!)
        {
            Assert.True(
                File.ReadAllBytes(Path.Combine(shared, name!)).AsSpan().SequenceEqual(File.ReadAllBytes(Contract(name!))),
                $"docs/contracts/{name} differs from {Path.Combine(shared, name!)}: copy it again verbatim");
        }
    }

    [Fact]
    public void The_test_output_holds_the_repository_copy_in_docs_contracts()
    {
        // One copy in the repository (docs/contracts); the test output gets it through the csproj link.
        string docs = Path.Combine(FreqReadout.Tests.Docs.CliProcess.RepoRoot(), "docs", "contracts");
        var inDocs = Directory.GetFiles(docs).Select(Path.GetFileName).OrderBy(n => n, StringComparer.Ordinal).ToArray();
        var inOutput = Directory.GetFiles(ContractsDir).Select(Path.GetFileName).OrderBy(n => n, StringComparer.Ordinal).ToArray();
        Assert.Equal(inDocs, inOutput);
        Assert.Contains(OriginNote, inDocs);
        foreach (string name in inDocs!)
        {
            Assert.True(File.ReadAllBytes(Path.Combine(docs, name!)).AsSpan().SequenceEqual(File.ReadAllBytes(Contract(name!))), name + " in the test output differs from docs/contracts: rebuild");
        }

        Assert.False(Directory.Exists(Path.Combine(FreqReadout.Tests.Docs.CliProcess.RepoRoot(), "tests", "FreqReadout.Tests", "Data", "contracts")), "a second copy of the samples under tests/: keep only docs/contracts");
    }

    /// <summary>The project's note on where the samples come from (not one of the verbatim copies).</summary>
    internal const string OriginNote = "ORIGIN.md";

    /// <summary>Searches upward from the test directory for a folder shared/contracts.</summary>
    internal static string? FindSharedContracts()
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir != null; dir = dir.Parent)
        {
            string candidate = Path.Combine(dir.FullName, "shared", "contracts");
            if (Directory.Exists(candidate))
            {
                return candidate;
            }
        }

        return null;
    }
}
