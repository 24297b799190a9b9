using System.Globalization;
using System.Text;
using System.Text.Json;
using FreqReadout.Host.Captures;
using FreqReadout.Tests.Commands;

namespace FreqReadout.Tests.Import;

/// <summary>
/// <c>import vcd</c> on hand-written dumps (invented; the format is IEEE Std 1364-2005 clause 18, from memory): scopes,
/// a short name that is ambiguous, a vector bit, identifiers that begin with '#', x between 0 and 1, the clock from the
/// greatest common divisor of the time stamps, and a square wave whose frequency count then reads exactly.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ImportVcdTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-vcd-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static string Example => Path.Combine(AppContext.BaseDirectory, "Data", "two-clocks.vcd");

    private List<ulong> Import(string vcd, string signal, out CaptureMetadata metadata)
    {
        string output = Path.Combine(_dir, Guid.NewGuid().ToString("N") + ".csv");
        var (exit, _, error) = ConsoleCapture.Run("import", "vcd", vcd, "--signal", signal, "--out", output);
        Assert.True(exit == 0, error);
        using ICaptureReader reader = CaptureFile.Open(output);
        metadata = reader.Metadata;
        return reader.ReadRows().Select(r => r.Tick).ToList();
    }

    [Fact]
    public void Rising_edges_of_the_full_name_on_the_sample_period_clock()
    {
        // Time stamps 0, 40, 80 ... ns: the sample period is 40 ns (25 MHz), not the 1 ns timescale.
        Assert.Equal(new ulong[] { 1, 3, 5 }, Import(Example, "top.probe.clk", out CaptureMetadata meta));
        Assert.Equal(25e6, meta.ClockHz);
        Assert.Equal(CaptureKind.Edges, meta.Kind);
    }

    [Fact]
    public void A_vector_bit_is_read_from_the_right_and_x_breaks_an_edge()
    {
        Assert.Equal(new ulong[] { 1, 5 }, Import(Example, "data[0]", out _));
        // top.clk goes 0 at #0 and x at #160: never a rising edge, so no capture.
        var (exit, _, error) = ConsoleCapture.Run("import", "vcd", Example, "--signal", "top.clk", "--out", Path.Combine(_dir, "none.csv"));
        Assert.Equal(1, exit);
        Assert.Contains("top.clk has 0 rising edge(s)", error);
    }

    [Theory]
    [InlineData("clk", "the short name clk is ambiguous: top.probe.clk, top.clk; give the full name")]
    [InlineData("data", "top.probe.data is 4 bits wide; choose one with a bit select, e.g. data[0]")]
    [InlineData("data[9]", "top.probe.data has bits 3 to 0; [9] is not one of them")]
    [InlineData("nope", "no signal named nope; the dump has: top.probe.clk, top.probe.data, top.clk")]
    public void Signal_problems_are_one_line_naming_the_candidates(string signal, string expected)
    {
        var (exit, _, error) = ConsoleCapture.Run("import", "vcd", Example, "--signal", signal, "--out", Path.Combine(_dir, "x.csv"));
        Assert.Equal(1, exit);
        Assert.Contains(expected, error);
        Assert.False(File.Exists(Path.Combine(_dir, "x.csv")));
    }

    [Fact]
    public void A_broken_header_names_the_line()
    {
        string path = Path.Combine(_dir, "bad.vcd");
        File.WriteAllText(path, "$timescale 3 ns $end\n$var wire 1 ! a $end\n$enddefinitions $end\n#0\n0!\n#1\n1!\n");
        var (exit, _, error) = ConsoleCapture.Run("import", "vcd", path, "--signal", "a", "--out", Path.Combine(_dir, "x.csv"));
        Assert.Equal(1, exit);
        Assert.Contains($"{path}:1: $timescale must be 1, 10 or 100 and a unit", error);
    }

    [Fact]
    public void A_1_kHz_square_wave_sampled_at_1_MHz_counts_as_1000_Hz()
    {
        // 2 s of a 1 kHz square wave, changes every 500 us, time stamps in 1 us units with a 10 ns timescale written as
        // 100 units: the sample period is the gcd, 1 us.
        var vcd = new StringBuilder("$timescale 10 ns $end\n$scope module bench $end\n$var wire 1 # sq $end\n$upscope $end\n$enddefinitions $end\n");
        for (int k = 0; k <= 4000; k++)
        {
            vcd.Append('#').Append((k * 50_000).ToString(CultureInfo.InvariantCulture)).Append('\n').Append(k % 2 == 0 ? '0' : '1').Append("#\n");
        }

        string path = Path.Combine(_dir, "square.vcd");
        File.WriteAllText(path, vcd.ToString());
        List<ulong> ticks = Import(path, "sq", out CaptureMetadata meta);
        Assert.Equal(2000, ticks.Count);
        Assert.Equal(1e6 / 500, meta.ClockHz);    // every change is at a multiple of 500 us: that is the sample period the dump shows
        string capture = Path.Combine(_dir, "square-count.csv");
        var (exit, _, error) = ConsoleCapture.Run("import", "vcd", path, "--signal", "bench.sq", "--out", capture);
        Assert.True(exit == 0, error);
        var (countExit, countOut, countErr) = ConsoleCapture.Run("count", capture, "--gate-seconds", "0.5", "--json");
        Assert.True(countExit == 0, countErr);
        int gates = 0;
        foreach (string line in countOut.Split('\n', StringSplitOptions.RemoveEmptyEntries))
        {
            using var gate = JsonDocument.Parse(line);
            if (gate.RootElement.TryGetProperty("frequency_hz", out JsonElement f) && f.ValueKind == JsonValueKind.Number)
            {
                Assert.Equal(1000, f.GetDouble(), 6);
                gates++;
            }
        }

        Assert.True(gates >= 3, "gates with a frequency: " + gates);
    }
}
