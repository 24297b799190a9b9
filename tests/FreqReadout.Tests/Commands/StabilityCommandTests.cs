namespace FreqReadout.Tests.Commands;

/// <summary><c>stability</c>: a pulse-counter capture is refused with the reason; a bad option names its range; the table names the recommended gate.</summary>
[Collection(ConsoleCollection.Name)]
public sealed class StabilityCommandTests : IClassFixture<SimulatedDemoCapture>
{
    private readonly SimulatedDemoCapture _sim;

    public StabilityCommandTests(SimulatedDemoCapture sim)
    {
        _sim = sim;
    }

    [Fact]
    public void The_table_ends_with_the_recommended_gate_capped_at_half_the_shortest_pass()
    {
        var (exit, output, error) = ConsoleCapture.Run("stability", _sim.CapturePath, "--shortest-pass-s", "0.02");
        Assert.True(exit == 0, error);
        // The demo capture's smallest ADEV is at 0.01024 s; capped at 0.01 s the best shorter one is 0.00512 s
        // (output of this command on the built-in demo scene; the table may wrap, so lines are joined first).
        string text = string.Join(' ', output.Split('\n', StringSplitOptions.TrimEntries));
        Assert.Contains("smallest ADEV", text);
        Assert.Contains("recommended gate: 0.00512 s (the smallest ADEV at or below half the shortest pass, 0.01 s)", text);
    }

    [Fact]
    public void A_pulse_counter_capture_is_refused_with_the_reason()
    {
        string path = Path.Combine(_sim.Dir, "snapshots.csv");
        File.WriteAllText(path, "# freqreadout capture 1\n# clock_hz = 1000000\n# kind = snapshots\ntick,count\n0,0\n1000,100\n2000,200\n3000,300\n");
        var (exit, _, error) = ConsoleCapture.Run("stability", path);
        Assert.Equal(1, exit);
        Assert.Contains("stability needs edge timestamps", error);
    }

    [Fact]
    public void A_shortest_pass_out_of_range_exits_2_naming_it()
    {
        var (exit, _, error) = ConsoleCapture.Run("stability", _sim.CapturePath, "--shortest-pass-s", "0");
        Assert.Equal(2, exit);
        Assert.Contains("--shortest-pass-s must be in (0, 3600] seconds, got 0", error);
    }

    [Fact]
    public void The_report_plot_decodes_at_its_size_and_carries_its_labels()
    {
        string dir = Path.Combine(_sim.Dir, "stability-report");
        var (exit, _, error) = ConsoleCapture.Run("stability", _sim.CapturePath, "--report", dir, "--json");
        Assert.True(exit == 0, error);
        using (var png = SkiaSharp.SKBitmap.Decode(Path.Combine(dir, "deviation.png")))
        {
            Assert.Equal((FreqReadout.Host.Reports.ReplayPlots.Width, FreqReadout.Host.Reports.ReplayPlots.Height), (png.Width, png.Height));
        }

        var svg = System.Xml.Linq.XDocument.Load(Path.Combine(dir, "deviation.svg"));
        string text = string.Join("\n", svg.Descendants().Where(e => e.Name.LocalName == "text").Select(e => e.Value));
        foreach (string expected in new[] { "Frequency stability of the counted signal", "averaging time tau (s)", "deviation (fractional)", "modified Allan deviation" })
        {
            Assert.Contains(expected, text);
        }
    }
}
