using System.Globalization;
using System.Text;
using System.Text.Json;
using FreqReadout.Host.Commands;
using static FreqReadout.Tests.Captures.CaptureTestFiles;

namespace FreqReadout.Tests.Commands;

/// <summary><c>count</c>'s table keeps one header and one layout however long the capture; <c>count --csv</c> carries the --json values.</summary>
[Collection(ConsoleCollection.Name)]
public sealed class CountTableAndCsvTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-count-layout").FullName;

    public void Dispose() => Directory.Delete(_dir, true);

    /// <summary>
    /// An invented edge capture on a 1 MHz clock: 2500 edges whose spacing runs from 2 ticks (500 kHz) up to 2000 ticks (500 Hz),
    /// so frequencies span three orders of magnitude, with a no-signal gap in the middle and marks on a few rows.
    /// </summary>
    private string LongCapture()
    {
        var b = new StringBuilder("# freqreadout capture 1\n# clock_hz = 1000000\n# timer_bits = 32\ntick,temp_c,mark\n");
        ulong tick = 0;
        for (int i = 0; i < 2500; i++)
        {
            tick += i < 1200 ? 2UL : 2000UL;
            if (i == 1200)
            {
                tick += 900_000; // 0.9 s without edges: no_signal gates
            }

            string temp = i % 500 == 0 ? (20 + i / 500).ToString(CultureInfo.InvariantCulture) : string.Empty;
            string mark = i == 1500 ? "hold" : i == 1700 ? "probe moved" : string.Empty;
            b.Append(tick.ToString(CultureInfo.InvariantCulture)).Append(',').Append(temp).Append(',').Append(mark).Append('\n');
        }

        string path = Path.Combine(_dir, "long.csv");
        File.WriteAllText(path, b.ToString());
        return path;
    }

    [Fact]
    public void The_table_has_one_header_and_every_row_keeps_the_header_column_positions()
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run("count", LongCapture(), "--gate-edges", "1");
        Assert.True(exit == 0, stderr);
        string[] lines = stdout.Split('\n');
        int headerAt = Array.FindIndex(lines, l => l.Contains("frequency Hz", StringComparison.Ordinal));
        Assert.True(headerAt > 0, stdout);
        Assert.Single(lines, l => l.Contains("frequency Hz", StringComparison.Ordinal));
        string header = lines[headerAt];
        int stateAt = header.IndexOf("state", StringComparison.Ordinal);
        int[] ends = { header.IndexOf("time s", StringComparison.Ordinal) + 6, header.IndexOf("frequency Hz", StringComparison.Ordinal) + 12, header.IndexOf("shift Hz", StringComparison.Ordinal) + 8, header.IndexOf("edges", StringComparison.Ordinal) + 5, header.IndexOf("error Hz", StringComparison.Ordinal) + 8 };
        Assert.All(lines[headerAt + 1], c => Assert.True(c is '-' or ' '));
        var rows = lines.Skip(headerAt + 2).TakeWhile(l => l.Length > 0).ToList();
        Assert.True(rows.Count > 2000, "expected more than 2000 gate rows, got " + rows.Count);
        Assert.Contains(rows, r => r.Contains("no_signal", StringComparison.Ordinal));
        Assert.Contains(rows, r => r.Contains("ok (probe moved)", StringComparison.Ordinal));
        foreach (string row in rows)
        {
            // Every number ends where its header ends (right-aligned), and the state starts under "state".
            foreach (int end in ends)
            {
                Assert.True(row[end - 1] != ' ' && row[end] == ' ', $"misaligned row (column ending at {end}):\n{header}\n{row}");
            }

            Assert.True(row[stateAt - 1] == ' ' && row[stateAt] != ' ', $"misaligned state:\n{header}\n{row}");
        }

        // Frequencies from 500 Hz to 500 kHz in the same column.
        Assert.Contains(rows, r => r.Contains("500000.000", StringComparison.Ordinal));
        Assert.Contains(rows, r => r.Contains(" 500.000", StringComparison.Ordinal));
    }

    [Fact]
    public void The_layout_is_chosen_from_the_capture_before_any_gate()
    {
        // Widths follow clock_hz x prescale (most edges a second), not the data: two captures with the same metadata and
        // different frequencies print the same header.
        string a = Path.Combine(_dir, "a.csv");
        string b = Path.Combine(_dir, "b.csv");
        File.WriteAllText(a, "# freqreadout capture 1\n# clock_hz = 80000000\n# prescale = 32\ntick\n" + string.Join("\n", Enumerable.Range(0, 50).Select(i => (i * 25600L).ToString(CultureInfo.InvariantCulture))) + "\n");
        File.WriteAllText(b, "# freqreadout capture 1\n# clock_hz = 80000000\n# prescale = 32\ntick\n" + string.Join("\n", Enumerable.Range(0, 50).Select(i => (i * 2L).ToString(CultureInfo.InvariantCulture))) + "\n");
        string HeaderOf(string path)
        {
            var (exit, stdout, stderr) = ConsoleCapture.Run("count", path, "--gate-edges", "10");
            Assert.True(exit == 0, stderr);
            return stdout.Split('\n').Single(l => l.Contains("frequency Hz", StringComparison.Ordinal));
        }

        Assert.Equal(HeaderOf(a), HeaderOf(b));
    }

    [Fact]
    public void Csv_has_one_header_row_and_the_values_of_the_json_lines()
    {
        string capture = LongCapture();
        var (exitJson, json, _) = ConsoleCapture.Run("count", capture, "--gate-edges", "7", "--json");
        var saved = CultureInfo.CurrentCulture;
        string csv;
        int exitCsv;
        try
        {
            // The machine's culture does not change the output ('.' decimals, ',' separators).
            var comma = (CultureInfo)CultureInfo.InvariantCulture.Clone();
            comma.NumberFormat.NumberDecimalSeparator = ",";
            comma.NumberFormat.NumberGroupSeparator = ".";
            CultureInfo.CurrentCulture = comma;
            (exitCsv, csv, _) = ConsoleCapture.Run("count", capture, "--gate-edges", "7", "--csv");
        }
        finally
        {
            CultureInfo.CurrentCulture = saved;
        }

        Assert.Equal(0, exitJson);
        Assert.Equal(0, exitCsv);
        string[] csvLines = csv.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        string[] jsonLines = json.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(CountCommand.CsvHeader + ",temp_c,marks", csvLines[0]);
        Assert.Single(csvLines, l => l.StartsWith("time_s,", StringComparison.Ordinal));
        Assert.Equal(jsonLines.Length, csvLines.Length - 1);
        string[] columns = csvLines[0].Split(',');
        for (int i = 0; i < jsonLines.Length; i++)
        {
            using var doc = JsonDocument.Parse(jsonLines[i]);
            string[] fields = csvLines[i + 1].Split(',');
            Assert.Equal(columns.Length, fields.Length);
            for (int c = 0; c < columns.Length; c++)
            {
                JsonElement v = doc.RootElement.GetProperty(columns[c]);
                string expected = v.ValueKind switch
                {
                    JsonValueKind.Null => string.Empty,
                    JsonValueKind.Number => v.GetDouble().ToString("R", CultureInfo.InvariantCulture),
                    JsonValueKind.Array => string.Join(" ", v.EnumerateArray().Select(m => m.GetString())),
                    _ => v.GetString()!,
                };
                Assert.True(expected == fields[c], $"gate {i}, column {columns[c]}: csv '{fields[c]}', json '{v.GetRawText()}'");
            }
        }

        Assert.Contains(csvLines, l => l.Contains(",no_signal,", StringComparison.Ordinal));
        Assert.Contains(csvLines, l => l.EndsWith(",probe moved", StringComparison.Ordinal));
    }

    [Fact]
    public void Csv_of_a_capture_without_temp_c_or_mark_has_only_the_fixed_columns_and_quotes_nothing()
    {
        var (exit, csv, stderr) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), "--gate-edges", "25", "--csv");
        Assert.True(exit == 0, stderr);

        // Contract README: 50 kHz exactly, 200 ticks of 10 MHz per edge, 101 edges: four gates of 25 intervals (26 edges).
        // error_hz: the counting merge replaced the white 1/12 tick^2 model by QuantisationErrorModel, which without jitter
        // and at a whole-tick period gives its rigorous cap: the least-squares slope sum c_i e_i, c_i = (i - mean) / Sxx,
        // with |e_i| <= 1/2 tick is at most (1/2) sum |c_i| = (1/2) floor(N^2 / 4) / Sxx ticks (triangle inequality; Sxx =
        // N (N^2 - 1) / 12, Danielson, Vernotte, Rubiola, arXiv:1604.01004, eq. 21), as a frequency f sigma_T / T.
        double sxx = 26.0 * (26.0 * 26.0 - 1.0) / 12.0;
        double error = 50_000.0 * (0.5 * Math.Floor(26.0 * 26.0 / 4.0) / sxx) / 200.0;
        string[] lines = csv.Split('\n');
        Assert.Equal(6, lines.Length); // header, four gates, and the empty text after the last line end
        Assert.Equal(CountCommand.CsvHeader, lines[0]);
        Assert.Equal(string.Empty, lines[5]);
        string[] ends = { "0.0005", "0.001", "0.0015", "0.002" };
        for (int i = 0; i < 4; i++)
        {
            // Columns since the counting merge: ..., shift_hz, search_shift_hz (= shift_hz in search mode), edges, error_hz,
            // estimator, state, glitches, inferred_edges, scatter_hz (empty until two gates, then 0 for equal frequencies).
            string[] f = lines[i + 1].Split(',');
            Assert.Equal(new[] { ends[i], i == 0 ? "0" : ends[i - 1], "50000", "0", "0", "26" }, f[..6]);
            Assert.Equal(error, double.Parse(f[6], CultureInfo.InvariantCulture), 1e-9);
            Assert.Equal(new[] { "regression", "ok", "0", "0", i == 0 ? string.Empty : "0" }, f[7..]);
        }
    }

    [Fact]
    public void Csv_and_json_together_are_a_usage_error()
    {
        var (exit, stdout, stderr) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), "--csv", "--json");
        Assert.Equal(CommandOutput.BadOption, exit);
        Assert.Equal(string.Empty, stdout);
        Assert.Equal("error: give either --json or --csv, not both\n", stderr);
    }

    [Fact]
    public void Csv_with_no_gate_prints_the_header_and_says_why_on_stderr()
    {
        var (exit, csv, stderr) = ConsoleCapture.Run("count", Contract("minimal.edges.csv"), "--csv");
        // A capture too short for one gate is a data problem (docs/exit-codes.md): exit 1 with an error, not a warning.
        Assert.Equal(CommandOutput.BadInput, exit);
        Assert.Equal(CountCommand.CsvHeader + "\n", csv);
        Assert.Contains("error: ", stderr);
        Assert.Contains("no gate closed: the capture is shorter than one gate", stderr);
    }

    [Theory]
    [InlineData("plain", "plain")]
    [InlineData("a,b", "\"a,b\"")]
    [InlineData("say \"x\"", "\"say \"\"x\"\"\"")]
    public void Csv_text_fields_are_quoted_only_when_they_must_be(string text, string expected)
    {
        Assert.Equal(expected, CountCommand.CsvText(text));
    }

    [Fact]
    public void Beat_below_search_shift_of_an_unchanged_gate_is_0_not_minus_0()
    {
        // beat-with-temp.edges.csv (contract sample): beat_side = below, a steady 400 Hz beat; the search shift is
        // the counted shift with its sign flipped, and 0 flipped must print as 0.
        var (exit, csv, stderr) = ConsoleCapture.Run("count", Contract("beat-with-temp.edges.csv"), "--csv");
        Assert.True(exit == 0, stderr);
        string[] header = csv.Split('\n')[0].Split(',');
        int column = Array.IndexOf(header, "search_shift_hz");
        Assert.True(column > 0);
        Assert.All(csv.Split('\n', StringSplitOptions.RemoveEmptyEntries).Skip(1), row => Assert.NotEqual("-0", row.Split(',')[column]));
    }
}
