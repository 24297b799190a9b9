namespace FreqReadout.Tests.DeviceFit;

/// <summary>The cases the device budget counts, and the method names of the device assembly they start from.</summary>
internal static class DeviceBudget
{
    private static readonly string[] Display = ["DisplayText.FrequencyLine", "DisplayText.ShiftLine", "DisplayText.StatusLine", "IDisplayPort.Show"];

    public static IReadOnlyList<BudgetRow> Rows { get; } =
    [
        new("Edge read inside a Step (one pass of the StepEdges loop: source, unwrap, EdgeCounter.AddEdge with its gate close); no reading published", "reads", ["DeviceLoop.StepEdges"])
        {
            OnePassOf = "DeviceLoop.StepEdges#0",
            Excluded = ["DeviceLoop.Publish"],
        },
        new("Step with edge input that finds no edge (buttons, hold switch, clock poll, EdgeCounter.Poll)", "reads", ["DeviceLoop.Step"])
        {
            Excluded = ["DeviceLoop.StepSnapshot", "DeviceLoop.Publish"],
            Overrides = new Dictionary<string, long> { ["DeviceLoop.StepEdges#0"] = 0 },
        },
        new("Step with snapshot input (buttons, hold switch, one pulse-counter snapshot, SnapshotCounter.AddSnapshot with its gate close); no reading published", "reads", ["DeviceLoop.Step"])
        {
            Excluded = ["DeviceLoop.StepEdges", "DeviceLoop.Publish"],
        },
        new("Gate published: DeviceLoop.Publish, ReadoutPipeline.Process on a gate that completes no baseline capture; display not refreshed", "gates", ["DeviceLoop.Publish"])
        {
            Excluded = ["ReadoutPipeline.CompleteCapture", .. Display],
        },
        new("Gate that completes a baseline capture: DeviceLoop.Publish with ReadoutPipeline.CompleteCapture; display not refreshed", "gates", ["DeviceLoop.Publish"])
        {
            Excluded = Display,
        },
        new("Display refresh: the three DisplayText lines and IDisplayPort.Show", "refreshes", Display),
    ];

    /// <summary>The device loop's one entry: every per-read and per-gate method is reached from it (for the per-method table and the loop checks).</summary>
    public static IReadOnlyList<string> Entries { get; } = ["DeviceLoop.Step"];

    /// <summary>Default gate rate (CounterSettings.GateSeconds default 0.1 s) used in the sustained-rate lines.</summary>
    public const double DefaultGatesPerSecond = 10;

    /// <summary>Display refreshes a second at DeviceSettings.DisplayIntervalSeconds default 0.5 s.</summary>
    public const double DefaultRefreshesPerSecond = 2;
}
