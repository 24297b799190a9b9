namespace FreqReadout.Tests.DeviceFit;

/// <summary>The cases the device budget counts, and the method names of the device assembly they start from.</summary>
internal static class DeviceBudget
{
    // A refresh reads the display's width once for each of the three lines (DeviceLoop.Publish passes display.LineWidth to each).
    private static readonly string[] Display =
        ["DisplayText.FrequencyLine", "DisplayText.ShiftLine", "DisplayText.StatusLine", "IDisplayPort.get_LineWidth", "IDisplayPort.get_LineWidth", "IDisplayPort.get_LineWidth", "IDisplayPort.Show"];

    /// <summary>
    /// Work not counted at all: new settings from the PC allocate and restart the readout, once per settings frame, never
    /// during a read or a gate's work (the loop is not reading while it applies them).
    /// </summary>
    public static IReadOnlyList<string> NeverCounted { get; } = ["DeviceLoop.ApplySettingsText"];

    /// <summary>Work a Step does now and then (once per 64 reads, once a second, every 5 s...), each counted in a row of its own.</summary>
    public static IReadOnlyList<string> Rare { get; } =
        ["DeviceLoop.ApplySettingsText", "DeviceLoop.SendStatus", "DeviceLinkStreamer.SendHeader", "DeviceLinkStreamer.SendSettings", "DeviceLinkStreamer.FlushSnapshots", "DeviceLinkStreamer.FlushEdges"];

    public static IReadOnlyList<BudgetRow> Rows { get; } =
    [
        new("Edge read inside a Step (one pass of the StepEdges loop: source, unwrap, EdgeCounter.AddEdge with its gate close); no reading published", "reads", ["DeviceLoop.StepEdges"])
        {
            OnePassOf = "DeviceLoop.StepEdges#0",
            Excluded = ["DeviceLoop.Publish", .. Rare],
        },
        new("Step with edge input that finds no edge (buttons, hold switch, clock poll, EdgeCounter.Poll)", "reads", ["DeviceLoop.Step"])
        {
            Excluded = ["DeviceLoop.StepSnapshot", "DeviceLoop.Publish", .. Rare],
            Overrides = new Dictionary<string, long> { ["DeviceLoop.StepEdges#0"] = 0 },
        },
        new("Step with snapshot input (buttons, hold switch, one pulse-counter snapshot, SnapshotCounter.AddSnapshot with its gate close); no reading published", "reads", ["DeviceLoop.Step"])
        {
            Excluded = ["DeviceLoop.StepEdges", "DeviceLoop.Publish", .. Rare],
        },
        new("Gate published: DeviceLoop.Publish, ReadoutPipeline.Process on a gate that completes no baseline capture; display not refreshed", "gates", ["DeviceLoop.Publish"])
        {
            Excluded = ["ReadoutPipeline.CompleteCapture", .. Display, .. Rare],
        },
        new("Gate that completes a baseline capture: DeviceLoop.Publish with ReadoutPipeline.CompleteCapture; display not refreshed", "gates", ["DeviceLoop.Publish"])
        {
            Excluded = [.. Display, .. Rare],
        },
        new("Display refresh: the three DisplayText lines, IDisplayPort.LineWidth read for each, and IDisplayPort.Show", "refreshes", Display),
        new("Link: a full batch of 64 reads encoded and queued (once per 64 reads with link = capture)", "batches", ["DeviceLinkStreamer.FlushSnapshots"]),
        new("Link: a status frame filled, encoded and queued (once a second)", "status frames", ["DeviceLoop.SendStatus"])
        {
            Excluded = ["DeviceLinkStreamer.FlushSnapshots", "DeviceLinkStreamer.FlushEdges"],
        },
        new("Link: the capture header encoded and queued (every 5 s)", "headers", ["DeviceLinkStreamer.SendHeader"]),
        new("Ordinary paced snapshot step: buttons, hold switch, clock and pacer, one pulse-counter snapshot, wrap check, unwraps, its row added to the link's batch; no gate closes", "reads", ["DeviceLoop.Step"])
        {
            Excluded = ["DeviceLoop.StepEdges", "DeviceLoop.Publish", "SnapshotCounter.TryCloseGate", "SnapshotCounter.NoSignal", .. Rare],
        },
        new("Board's per-step additions (Program, GpioButtons): the button port's work behind the loop's two port calls (DebouncedButtons: clock, both pin levels, two ButtonDebouncer updates), AlertPattern.Drive with its port call, TemperaturePoller.TryPoll (worst case: the once-a-second sensor read, a port call)", "steps", ["DebouncedButtons.TryTakeRebaselinePress", "DebouncedButtons.TryReadHold", "AlertPattern.Drive", "TemperaturePoller.TryPoll"]),
        new("Board's per-gate addition (Program): DeviceLoop.TryGetLastReading into the preallocated reading and AlertPattern.Update", "gates", ["DeviceLoop.TryGetLastReading", "AlertPattern.Update"]),
    ];

    /// <summary>The device loop's entries and the board's per-step and per-gate additions: every per-read and per-gate method is reached from them (for the per-method table and the loop checks).</summary>
    public static IReadOnlyList<string> Entries { get; } =
        ["DeviceLoop.Step", "DeviceLinkStreamer.FlushSnapshots", "DeviceLoop.SendStatus", "DeviceLinkStreamer.SendHeader",
         "DebouncedButtons.TryTakeRebaselinePress", "DebouncedButtons.TryReadHold", "AlertPattern.Drive", "TemperaturePoller.TryPoll", "DeviceLoop.TryGetLastReading", "AlertPattern.Update"];

    /// <summary>Default gate rate (CounterSettings.GateSeconds default 0.1 s) used in the sustained-rate lines.</summary>
    public const double DefaultGatesPerSecond = 10;

    /// <summary>Display refreshes a second at DeviceSettings.DisplayIntervalSeconds default 0.5 s.</summary>
    public const double DefaultRefreshesPerSecond = 2;
}
