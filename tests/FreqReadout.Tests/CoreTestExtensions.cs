using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Readout;
using FreqReadout.Tracking;

namespace FreqReadout.Tests;

/// <summary>
/// Test conveniences over the core's fill-in-place API: each call gives the test a fresh result object
/// (an empty one when nothing was filled), so assertions read as before. Device code and the allocation
/// tests use the real API with caller-owned objects.
/// </summary>
internal static class CoreTestExtensions
{
    public static bool AddEdge(this EdgeCounter counter, long tick, out GateResult result)
    {
        result = new GateResult();
        return counter.AddEdge(tick, result);
    }

    public static bool Poll(this EdgeCounter counter, long nowTick, out GateResult result)
    {
        result = new GateResult();
        return counter.Poll(nowTick, result);
    }

    public static bool AddSnapshot(this SnapshotCounter counter, long tick, long count, out GateResult result)
    {
        result = new GateResult();
        return counter.AddSnapshot(tick, count, result);
    }

    public static bool Process(this ReadoutPipeline pipeline, GateResult gate, out Reading reading)
    {
        reading = new Reading();
        return pipeline.Process(gate, reading);
    }

    public static bool TryTakeEvent(this ReadoutPipeline pipeline, out DetectionEvent detectionEvent)
    {
        detectionEvent = new DetectionEvent();
        return pipeline.TryTakeEvent(detectionEvent);
    }

    public static bool TryTakeRebaseline(this ReadoutPipeline pipeline, out RebaselineNotice notice)
    {
        notice = new RebaselineNotice();
        return pipeline.TryTakeRebaseline(notice);
    }

    public static bool TryCloseOpenEvent(this ReadoutPipeline pipeline, out DetectionEvent detectionEvent)
    {
        detectionEvent = new DetectionEvent();
        return pipeline.TryCloseOpenEvent(detectionEvent);
    }

    public static bool Step(this TargetDetector detector, double timeSeconds, double spanSeconds, double shiftHz, double sigmaHz, double ppmReferenceHz, bool readingBelowBeatFloor, out DetectionEvent closed)
    {
        closed = new DetectionEvent();
        return detector.Step(timeSeconds, spanSeconds, shiftHz, sigmaHz, ppmReferenceHz, readingBelowBeatFloor, closed);
    }

    public static bool ForceClose(this TargetDetector detector, EventEnd end, out DetectionEvent closed)
    {
        closed = new DetectionEvent();
        return detector.ForceClose(end, closed);
    }

    public static bool TryEstimate(this BaselineCapture capture, double outlierSigma, out BaselineEstimate estimate)
    {
        estimate = new BaselineEstimate();
        return capture.TryEstimate(outlierSigma, estimate);
    }

    /// <summary>A filled gate result (arguments as <see cref="GateResult.Set"/>; InputEdges from edges and prescale).</summary>
    public static GateResult Gate(
        GateState state, EstimatorKind estimator, SignalKind signal, bool hasFrequency, double frequencyHz, double errorHz,
        double reciprocalHz, double regressionHz, int edges, int prescale, long startTick, long endTick,
        double startSeconds, double endSeconds, int glitches, int dropouts)
    {
        var g = new GateResult();
        g.Set(state, estimator, signal, hasFrequency, frequencyHz, errorHz, reciprocalHz, regressionHz, edges, prescale,
            startTick, endTick, startSeconds, endSeconds, glitches, dropouts, hasFrequency ? (long)(edges - 1) * prescale : 0, 0);
        return g;
    }
}
