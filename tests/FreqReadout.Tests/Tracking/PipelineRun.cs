using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Readout;
using FreqReadout.Tracking;

namespace FreqReadout.Tests.Tracking;

/// <summary>Runs gates through a <see cref="ReadoutPipeline"/> and collects readings, events and notices.</summary>
internal sealed class PipelineRun
{
    public List<Reading> Readings { get; } = new();
    public List<DetectionEvent> Events { get; } = new();
    public List<RebaselineNotice> Notices { get; } = new();

    /// <summary>Re-baselines after the first one.</summary>
    public IEnumerable<RebaselineNotice> Rebaselines => Notices.Where(n => n.Reason != RebaselineReason.Initial);

    public ReadoutPipeline Pipeline { get; }

    public PipelineRun(ReadoutSettings settings)
    {
        Pipeline = new ReadoutPipeline(settings);
    }

    /// <summary>Feeds every gate; <paramref name="beforeGate"/> runs before each gate with its start time (marks, temperature).</summary>
    public PipelineRun Feed(IEnumerable<GateResult> gates, Action<ReadoutPipeline, GateResult>? beforeGate = null)
    {
        foreach (GateResult g in gates)
        {
            beforeGate?.Invoke(Pipeline, g);
            Pipeline.Process(g, out Reading r);
            Readings.Add(r);
            Drain();
        }

        if (Pipeline.TryCloseOpenEvent(out DetectionEvent open))
        {
            Events.Add(open);
        }

        Drain();
        return this;
    }

    private void Drain()
    {
        while (Pipeline.TryTakeEvent(out DetectionEvent e))
        {
            Events.Add(e);
        }

        while (Pipeline.TryTakeRebaseline(out RebaselineNotice n))
        {
            Notices.Add(n);
        }
    }

    public static PipelineRun Of(SyntheticGateStream stream, ReadoutSettings? settings = null, Action<ReadoutPipeline, GateResult>? beforeGate = null)
    {
        settings ??= new ReadoutSettings();
        if (stream.Signal == SignalKind.Beat && settings.Signal != SignalKind.Beat)
        {
            throw new ArgumentException("beat stream needs beat settings");
        }

        return new PipelineRun(settings).Feed(stream.Gates(), beforeGate);
    }
}
