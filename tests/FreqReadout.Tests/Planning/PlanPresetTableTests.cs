using System.Globalization;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Planning;
using FreqReadout.Tests.Docs;

namespace FreqReadout.Tests.Planning;

/// <summary>
/// The presets table of hardware-notes/timestamp-methods.md and the device costs of hardware-notes/device-budget.md are
/// what <c>plan</c> computes with: each figure in the code equals the one on the page (the page is the documented source;
/// its own sources are named there).
/// </summary>
public class PlanPresetTableTests
{
    private static string Page(string name) => File.ReadAllText(Path.Combine(CliProcess.RepoRoot(), "hardware-notes", name));

    private static double Number(string cell) => double.Parse(cell.Replace(",", "", StringComparison.Ordinal), NumberStyles.Float, CultureInfo.InvariantCulture);

    [Fact]
    public void The_presets_table_equals_the_code()
    {
        string page = Page("timestamp-methods.md");
        int begin = page.IndexOf("<!-- plan-presets:begin -->", StringComparison.Ordinal);
        int end = page.IndexOf("<!-- plan-presets:end -->", StringComparison.Ordinal);
        Assert.True(begin >= 0 && end > begin, "timestamp-methods.md has no plan-presets block");
        var rows = page[begin..end].Split('\n')
            .Where(l => l.StartsWith("| ", StringComparison.Ordinal) && !l.StartsWith("| preset", StringComparison.Ordinal))
            .Select(l => l.Trim().Trim('|').Split('|').Select(c => c.Trim()).ToArray())
            .ToList();
        var presets = TimestampPresets.All();
        Assert.Equal(presets.Select(p => p.Name), rows.Select(r => r[0]));
        foreach (TimestampPreset p in presets)
        {
            string[] r = rows.Single(x => x[0] == p.Name);
            Assert.Equal(p.Input == CaptureKind.Snapshots ? "snapshots" : "edges", r[1]);
            Assert.Equal(p.JitterS, Number(r[2]));
            Assert.Equal(p.ClockHz, Number(r[3]));
            Assert.Equal(p.ReadRateHz, Number(r[4]));
            Assert.Equal(p.MaxEdgeRateHz, Number(r[5]));
        }
    }

    [Fact]
    public void The_device_costs_are_the_Release_budget_table()
    {
        string page = Page("device-budget.md");
        int begin = page.IndexOf("<!-- budget:Release:begin", StringComparison.Ordinal);
        int end = page.IndexOf("<!-- budget:Release:end", StringComparison.Ordinal);
        Assert.True(begin >= 0 && end > begin, "device-budget.md has no Release block");
        string[] lines = page[begin..end].Split('\n');

        double Case(int n) => Number(lines.Single(l => l.StartsWith($"| {n} |", StringComparison.Ordinal)).Split('|')[3]);
        double Method(string name) => Number(lines.Single(l => l.StartsWith($"| {name} |", StringComparison.Ordinal)).Split('|')[4]);

        Assert.Equal(DeviceCosts.EdgeReadWithCloseOps, Case(1));
        Assert.Equal(DeviceCosts.SnapshotStepWithCloseOps, Case(3));
        Assert.Equal(DeviceCosts.SnapshotReadOps, Case(10));
        Assert.Equal(DeviceCosts.EdgeGateCloseOps, Method("EdgeCounter.CloseGate"));
    }
}
