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
    // history_gates [64, 16384] default 256; tracker_delay_gates [0, 1000] default 5.
    // DeviceSettings.MaxEdgesPerStep >= 1 default 256, no upper limit.
    private const long BaselineMaxGatesDefault = 512;
    private const long BaselineMaxGatesLimit = 8192;
    private const long NoiseWindowGatesDefault = 512;
    private const long NoiseWindowGatesLimit = 4096;
    private const long HistoryGatesDefault = 256;
    private const long HistoryGatesLimit = 16384;

    // floor(log2 n) + 1 for the heap depths and selection rounds below.
    private const long Log2BaselineDefault = 9;
    private const long Log2BaselineLimit = 13;
    private const long Log2NoiseDefault = 9;
    private const long Log2NoiseLimit = 12;

    public static IReadOnlyList<LoopBound> Table { get; } =
    [
        new("DeviceLoop.StepEdges", 0, "MaxEdgesPerStep (DeviceSettings; default 256, no upper limit)", 256, null),

        new("ReadoutPipeline.InvalidateDelayLine", 0, "TrackerDelayGates + 1 (ReadoutSettings tracker_delay_gates, default 5, at most 1000)", 6, 1001),
        new("ReadoutPipeline.Rewind", 0, "snapshotCount - 1 < SnapshotCount (32 tracker snapshots)", 32, 32),
        new("ReadoutPipeline.CompleteCapture", 0, "capture.Count <= BaselineMaxGates (the capture's gates copied into the reading history)", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("ReadoutPipeline.EndProbe", 0, "count <= HistoryGates (the readings held since the probe began)", HistoryGatesDefault, HistoryGatesLimit),
        new("ReadoutPipeline.StartTrackerOnCapture", 0, "capture.Count <= BaselineMaxGates (the tracker runs once over the capture's gates)", BaselineMaxGatesDefault, BaselineMaxGatesLimit),

        // Running noise median: two indexed heaps of at most NoiseWindowGates slots; a sift moves one level per pass.
        new("ForecastRunMonitor.Add", 0, "Readings = 5 (the re-sum once a lap)", 5, 5),
        new("MedianWindow.LowSiftUp", 0, "heap depth floor(log2 NoiseWindowGates) + 1", Log2NoiseDefault + 1, Log2NoiseLimit + 1),
        new("MedianWindow.LowSiftDown", 0, "heap depth floor(log2 NoiseWindowGates) + 1", Log2NoiseDefault + 1, Log2NoiseLimit + 1),
        new("MedianWindow.HighSiftUp", 0, "heap depth floor(log2 NoiseWindowGates) + 1", Log2NoiseDefault + 1, Log2NoiseLimit + 1),
        new("MedianWindow.HighSiftDown", 0, "heap depth floor(log2 NoiseWindowGates) + 1", Log2NoiseDefault + 1, Log2NoiseLimit + 1),

        new("BaselineCapture.TryEstimate", 0, "count <= BaselineMaxGates (ReadoutSettings baseline_max_gates, default 512, at most 8192)", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("BaselineCapture.TryEstimate", 1, "count <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("BaselineCapture.CopyAbsoluteThirdDifferences", 0, "count - 3 < BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("BaselineCapture.DifferenceNoiseHz", 0, "count - 1 < BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("BaselineCapture.FitQuadratic", 0, "count <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("BaselineCapture.FitQuadratic", 1, "count <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("BaselineCapture.QuadraticResidualSigma", 0, "count <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("BaselineCapture.StepHz", 0, "third = count / 3 <= BaselineMaxGates / 3", BaselineMaxGatesDefault / 3, BaselineMaxGatesLimit / 3),
        new("BaselineCapture.Fit", 0, "third = keptCount / 3 <= BaselineMaxGates / 3", BaselineMaxGatesDefault / 3, BaselineMaxGatesLimit / 3),
        new("BaselineCapture.Fit", 1, "keptCount <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("BaselineCapture.Fit", 2, "keptCount <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),

        // RobustStatistics is called only by BaselineCapture, with counts <= BaselineMaxGates: selection in place
        // (at most 2 floor(log2 n) + 2 partition rounds of at most n + 2 steps, then one heapsort), never a sort by insertion.
        new("RobustStatistics.Median", 0, "count <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("RobustStatistics.MadSigma", 0, "count <= BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("RobustStatistics.MedianInPlace", 0, "count / 2 <= BaselineMaxGates / 2", BaselineMaxGatesDefault / 2, BaselineMaxGatesLimit / 2),
        new("RobustStatistics.FloorLog2", 0, "floor(log2 count) <= floor(log2 BaselineMaxGates)", Log2BaselineDefault, Log2BaselineLimit),
        new("RobustStatistics.SelectInPlace(double[], int, int, int)", 0, "partition rounds <= 2 floor(log2 count) + 2 (then the heapsort)", (2 * Log2BaselineDefault) + 2, (2 * Log2BaselineLimit) + 2),
        new("RobustStatistics.SelectInPlace(double[], int, int, int)", 1, "partition steps <= hi - lo + 2 <= count + 2", BaselineMaxGatesDefault + 2, BaselineMaxGatesLimit + 2),
        new("RobustStatistics.HeapSort", 0, "heapify: n / 2 <= BaselineMaxGates / 2", BaselineMaxGatesDefault / 2, BaselineMaxGatesLimit / 2),
        new("RobustStatistics.HeapSort", 1, "extraction: n - 1 < BaselineMaxGates", BaselineMaxGatesDefault, BaselineMaxGatesLimit),
        new("RobustStatistics.SiftDown", 0, "heap depth floor(log2 n) + 1", Log2BaselineDefault + 1, Log2BaselineLimit + 1),

        // Deciding an open candidate from both sides: one pass over the readings held (at most HistoryGates).
        new("ReadingHistory.Exclude", 0, "count <= HistoryGates (ReadoutSettings history_gates, default 256, at most 16384)", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.FirstAtOrAfter", 0, "i <= count <= HistoryGates", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.FitRecent", 0, "count <= HistoryGates", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.Resolve", 0, "count <= HistoryGates", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.SidesAgree", 0, "count <= HistoryGates", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.Smooth", 0, "count <= HistoryGates", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.FillPass", 0, "count <= HistoryGates", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.FillSides", 0, "count <= HistoryGates", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.FillKink", 0, "count <= HistoryGates", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.FillChain", 0, "quarters k < 4", 4, 4),
        new("ExcursionResolver.FillChain", 1, "count <= HistoryGates (the quarters' sums)", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.FillChain", 2, "seed fits c < ChainSeeds = 8", 8, 8),
        new("ExcursionResolver.FillChain", 3, "quarters k < 4 merged into one seed", 4, 4),
        new("ExcursionResolver.FillChain", 4, "count <= HistoryGates (the seeds scored)", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.FillChain", 5, "seed fits c < ChainSeeds = 8 (per reading)", 8, 8),
        new("ExcursionResolver.FillChain", 6, "seed fits c < ChainSeeds = 8 (the best)", 8, 8),
        new("ExcursionResolver.FillChain", 7, "trim rounds < ChainTrimRounds = 2", 2, 2),
        new("ExcursionResolver.FillChain", 8, "count <= HistoryGates (one refit)", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.FillChain", 9, "count <= HistoryGates (the final check)", HistoryGatesDefault, HistoryGatesLimit),
        new("ExcursionResolver.WindowNoise", 0, "WindowNoiseReadings = 67 newest readings", 67, 67),
        new("ExcursionResolver.DropPassesNear", 0, "PassCount <= ExcursionVerdict.MaxPasses", 4, 4),
        new("ExcursionResolver.PassesClear", 0, "PassCount <= ExcursionVerdict.MaxPasses", 4, 4),
        new("ReadoutPipeline.Decide", 0, "verdict.PassCount <= ExcursionVerdict.MaxPasses (one event per pass)", 4, 4),
        new("KinkFit.TrySolve", 0, "steps + 1 <= KinkFit.MaxSteps + 1 (kink times tried)", 401, 401),

        // ScalarMath: bounds from the range of double (largest 2^1024, smallest subnormal 2^-1074) and the code's own constants.
        new("ScalarMath.Sqrt", 0, "m < 2^1024 scaled by 2^-64 per pass while m >= 2^64: 1024 / 64 = 16", 16, 16),
        new("ScalarMath.Sqrt", 1, "m >= 2^-1074 scaled by 2^64 per pass while m < 2^-64: ceil(1074 / 64) = 17", 17, 17),
        new("ScalarMath.Sqrt", 2, "m < 2^64 after loop 0, scaled by 2^-16 per pass while m >= 2^16: 3", 3, 3),
        new("ScalarMath.Sqrt", 3, "m >= 2^-64 after loop 1, scaled by 2^16 per pass while m < 2^-16: 3", 3, 3),
        new("ScalarMath.Sqrt", 4, "m < 2^16, divided by 16 per pass while m >= 16: 3", 3, 3),
        new("ScalarMath.Sqrt", 5, "m >= 2^-16, multiplied by 16 per pass while m < 1/16: 3", 3, 3),
        new("ScalarMath.Sqrt", 6, "m < 16, divided by 4 per pass while m >= 4: 1", 1, 1),
        new("ScalarMath.Sqrt", 7, "m >= 1/16, multiplied by 4 per pass while m < 1: 2", 2, 2),
        new("ScalarMath.Sqrt", 8, "Newton steps k < 8", 8, 8),
        new("ScalarMath.Exp", 0, "series terms n = 1..16", 16, 16),
        new("ScalarMath.SinPi", 0, "series terms n = 1..9", 9, 9),

        // Counting error model (QuantisationErrorModel): fixed sums and a bisection, plus the harmonic sum up to
        // sqrt(N) + 5 harmonics; N <= EdgeCounter.MaxGateIntervals = 2^20, so at most 1029 (the default 0.1 s gate
        // at 100 kHz / prescale 1 has N = 10^4: 105).
        new("QuantisationErrorModel.Configure", 0, "harmonics m = 1..64", 64, 64),
        new("QuantisationErrorModel.HarmonicSum", 0, "harmonics m = 1..64", 64, 64),
        new("QuantisationErrorModel.PeakGainFrequency", 0, "bisection steps k < 40", 40, 40),
        new("QuantisationErrorModel.RegressionDeterministicVariance", 0, "harmonics m <= sqrt(N) + 5, N <= 2^20", 105, 1029),
        new("ScalarMath.Exp", 1, "binary digits of |k| <= 1075 < 2^11: 11", 11, 11),

        // Link frames (docs/link-protocol.md): at most 248 bytes before stuffing (4 header + 240 payload + 4 CRC).
        new("ByteStuffing.Encode", 0, "frame bytes <= 4 + MaxPayloadBytes (240) + 4 = 248", 248, 248),
        new("FrameCrc.Continue", 0, "frame bytes <= 244 (the CRC covers header and payload)", 244, 244),
        new("FrameCrc.Continue", 1, "bits of a byte: 8", 8, 8),
        new("LinkFrameEncoder.TryEncode", 0, "payload bytes <= MaxPayloadBytes (240)", 240, 240),
        new("LinkPayloadWriter.VarUIntBytes", 0, "7-bit groups of a 64-bit value - 1 <= 9", 9, 9),
        new("LinkPayloadWriter.WriteVarUInt", 0, "7-bit groups of a 64-bit value - 1 <= 9", 9, 9),
        new("LinkPayloadWriter.WriteFixed", 0, "bytes <= 8 (a 64-bit field)", 8, 8),
        new("LinkPayloadWriter.WriteAscii", 0, "text length <= MaxPayloadBytes (240), longer is refused first", 240, 240),
        new("SnapshotBatchPayload.Write", 0, "rows - 1 < SnapshotBatchPayload.MaxRows (64)", 64, 64),
        new("EdgeBatchPayload.Write", 0, "rows - 1 < EdgeBatchPayload.MaxRows (128)", 128, 128),
    ];
}
