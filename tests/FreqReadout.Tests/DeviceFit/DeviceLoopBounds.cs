namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// The declared bound of every loop on the device's per-read and per-gate paths, keyed by method and
/// loop index (loops numbered from 0 in IL order, as <see cref="LoopFinder"/> finds them). Each
/// expression names the setting or constant in the code that bounds the loop; the two numbers are
/// its value with every setting at its default and at the largest value the setting's TryValidate
/// accepts (null: nothing limits it). A loop on a counted path that is missing here fails
/// DeviceBudgetTests; so does an entry whose loop no longer exists.
/// </summary>
internal static class DeviceLoopBounds
{
    // ReadoutSettings: baseline_max_gates [8, 8192] default 512; noise_window_gates [16, 4096] default 512;
    // tracker_delay_gates [0, 1000] default 5. DeviceSettings.MaxEdgesPerStep >= 1 default 256, no upper limit.
    private const long BaselineMaxGatesDefault = 512;
    private const long BaselineMaxGatesLimit = 8192;
    private const long NoiseWindowGatesDefault = 512;
    private const long NoiseWindowGatesLimit = 4096;

    public static IReadOnlyList<LoopBound> Table { get; } =
    [
        new("DeviceLoop.StepEdges", 0, "MaxEdgesPerStep (DeviceSettings; default 256, no upper limit)", 256, null),

        new("ReadoutPipeline.InvalidateDelayLine", 0, "TrackerDelayGates + 1 (ReadoutSettings tracker_delay_gates, default 5, at most 1000)", 6, 1001),

        new("MedianWindow.RemoveSorted", 0, "count <= Capacity = NoiseWindowGates (ReadoutSettings noise_window_gates, default 512, at most 4096)", NoiseWindowGatesDefault, NoiseWindowGatesLimit),
        new("MedianWindow.RemoveSorted", 1, "count - 1 < Capacity = NoiseWindowGates", NoiseWindowGatesDefault, NoiseWindowGatesLimit),
        new("MedianWindow.InsertSorted", 0, "count - 1 < Capacity = NoiseWindowGates", NoiseWindowGatesDefault, NoiseWindowGatesLimit),

        new("BaselineCapture.TryEstimate", 0, "count <= BaselineMaxGates (ReadoutSettings baseline_max_gates, default 512, at most 8192)", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("BaselineCapture.TryEstimate", 1, "count <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("BaselineCapture.CopyAbsoluteResiduals", 0, "keptCount <= count <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("BaselineCapture.Fit", 0, "third = keptCount / 3 <= BaselineMaxGates / 3", BaselineMaxGatesDefault / 3, BaselineMaxGatesLimit / 3),
        new("BaselineCapture.Fit", 1, "third = keptCount / 3 <= BaselineMaxGates / 3", BaselineMaxGatesDefault / 3, BaselineMaxGatesLimit / 3),
        new("BaselineCapture.Fit", 2, "keptCount <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("BaselineCapture.Fit", 3, "keptCount <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),

        // RobustStatistics is called only by BaselineCapture.Fit, with counts <= keptCount <= BaselineMaxGates.
        new("RobustStatistics.SortAscending", 0, "count - 1 < BaselineMaxGates (insertion sort, outer loop)", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("RobustStatistics.SortAscending", 1, "i < count <= BaselineMaxGates (insertion sort, inner shift per outer pass)", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("RobustStatistics.Median", 0, "count <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("RobustStatistics.MadSigma", 0, "count <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),

        // ScalarMath: bounds from the range of double (largest 2^1024, smallest subnormal 2^-1074) and the code's own constants.
        new("ScalarMath.Sqrt", 0, "m < 2^1024 scaled by 2^-64 per pass while m >= 2^64: 1024 / 64 = 16", 16, 16),
        new("ScalarMath.Sqrt", 1, "m >= 2^-1074 scaled by 2^64 per pass while m < 2^-64: ceil(1074 / 64) = 17", 17, 17),
        new("ScalarMath.Sqrt", 2, "m < 2^64 after loop 0, divided by 4 per pass while m >= 4: 32", 32, 32),
        new("ScalarMath.Sqrt", 3, "m >= 2^-64 after loop 1, multiplied by 4 per pass while m < 1: 32", 32, 32),
        new("ScalarMath.Sqrt", 4, "Newton steps k < 8", 8, 8),
        new("ScalarMath.Exp", 0, "series terms n = 1..16", 16, 16),
        new("ScalarMath.Exp", 1, "k = round(x / ln 2) <= 1024 (x > 709.78 returns first)", 1024, 1024),
        new("ScalarMath.Exp", 2, "-k <= 1075 (x < -745 returns first)", 1075, 1075),
    ];
}
