namespace FreqReadout.Host.Planning;

/// <summary>
/// What servicing the input costs the device, from the Release table of hardware-notes/device-budget.md (IL operations
/// counted from the compiled device assembly; PlanDeviceCostTests keeps these equal to that table):
/// <list type="bullet">
/// <item>an edge: case 1 (an edge read inside a Step, counted with a gate close) less the per-method row
/// EdgeCounter.CloseGate;</item>
/// <item>an edge gate closing: EdgeCounter.CloseGate;</item>
/// <item>a snapshot read: case 10 (an ordinary paced snapshot step, link row included);</item>
/// <item>a snapshot gate closing: case 3 less case 10 (as the budget page itself takes it).</item>
/// </list>
/// The readout's own per-gate work (case 4, the pipeline's worst gate) and display refreshes come on top and are not in
/// the share <c>plan</c> prints; nor is the runtime's cost of raising a managed pin event. The operation rate is the
/// project's working estimate for nanoCLR on an ESP32, 1 to 5 million simple IL operations a second (no source; not yet
/// measured on a board).
/// </summary>
public static class DeviceCosts
{
    /// <summary>Case 1 of the Release table: an edge read with its gate close, IL operations.</summary>
    public const double EdgeReadWithCloseOps = 70_500;

    /// <summary>EdgeCounter.CloseGate, Release, IL operations.</summary>
    public const double EdgeGateCloseOps = 69_396;

    /// <summary>Case 10 of the Release table: one paced snapshot read, IL operations.</summary>
    public const double SnapshotReadOps = 2_555;

    /// <summary>Case 3 of the Release table: a snapshot step with its gate close, IL operations.</summary>
    public const double SnapshotStepWithCloseOps = 226_812;

    /// <summary>Low operation rate, IL operations a second.</summary>
    public const double LowOpsPerSecond = 1e6;

    /// <summary>High operation rate, IL operations a second.</summary>
    public const double HighOpsPerSecond = 5e6;

    /// <summary>One edge without its gate close: case 1 - CloseGate.</summary>
    public static double EdgeReadOps => EdgeReadWithCloseOps - EdgeGateCloseOps;

    /// <summary>A snapshot gate close: case 3 - case 10.</summary>
    public static double SnapshotGateCloseOps => SnapshotStepWithCloseOps - SnapshotReadOps;
}
