using System.Diagnostics;
using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Commands;
using FreqReadout.Host.Counting;
using FreqReadout.Host.Replay;
using FreqReadout.Host.Simulation;
using FreqReadout.Readout;

namespace FreqReadout.Host.Bench;

/// <summary>
/// The tracking-quality bench (<c>freqreadout bench quality</c>; definition in host/Bench/README.md). Every scene is drawn
/// from its seed (<see cref="BenchSceneBuilder"/>), simulated into memory (<see cref="CaptureSimulator"/>), replayed through
/// <see cref="CaptureGateSource"/> and <see cref="ReplaySession"/> with replay's default settings (the pipeline in the build,
/// exactly as <c>replay</c> runs it), and, on the same rows, through the two plain ways (<see cref="PlainDetector"/>); each
/// way's events are matched to the truth passes (<see cref="BenchPassMatcher"/>). Scenes run in parallel; the result does
/// not depend on how many at once.
/// </summary>
public static class QualityBench
{
    /// <summary>Runs the bench.</summary>
    /// <param name="seedSet">Name of the seed set for the report (tune, report, or the number).</param>
    /// <param name="masterSeed">Master seed of the scene seeds.</param>
    /// <param name="size">Full or quick.</param>
    /// <param name="kinds">Kinds to run.</param>
    /// <param name="jobs">Scenes at once (at least 1).</param>
    /// <param name="progress">Receives the number of scenes done so far, and the total first (as a negative number).</param>
    /// <param name="cancellationToken">Stops the run.</param>
    public static QualityBenchReport Run(string seedSet, long masterSeed, QualityBenchSize size, IReadOnlyCollection<BenchKind> kinds, int jobs, IProgress<int>? progress, CancellationToken cancellationToken)
    {
        var clock = Stopwatch.StartNew();
        List<BenchSceneKey> keys = BenchSceneKey.All(masterSeed, size, kinds);
        progress?.Report(-keys.Count);
        var outcomes = new BenchSceneOutcome[keys.Count];

        // Longest first (drift-only, then search-mode scenes, which have the most rows), so the cores finish together.
        int[] order = Enumerable.Range(0, keys.Count)
            .OrderByDescending(i => keys[i].DriftOnly)
            .ThenByDescending(i => keys[i].Mode == BenchMode.Search)
            .ThenBy(i => i)
            .ToArray();
        int done = 0;
        try
        {
            Parallel.ForEach(
                order,
                new ParallelOptions { MaxDegreeOfParallelism = Math.Max(1, jobs), CancellationToken = cancellationToken },
                i =>
                {
                    outcomes[i] = RunScene(keys[i], size, cancellationToken);
                    progress?.Report(Interlocked.Increment(ref done));
                });
        }
        catch (AggregateException e) when (e.InnerExceptions.Count > 0)
        {
            // The first scene that failed, as it was thrown (its message names the scene and its seed).
            System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(e.InnerExceptions[0]).Throw();
            throw;
        }

        var rows = new List<QualityRow>();
        var modeRows = new List<QualityRow>();
        foreach (BenchKind kind in Enum.GetValues<BenchKind>().Where(kinds.Contains))
        {
            foreach (BenchWay way in Enum.GetValues<BenchWay>())
            {
                rows.Add(Row(kind, null, way, outcomes.Where(o => o.Scene.Key.Kind == kind)));
                foreach (BenchMode mode in Enum.GetValues<BenchMode>())
                {
                    modeRows.Add(Row(kind, mode, way, outcomes.Where(o => o.Scene.Key.Kind == kind && o.Scene.Key.Mode == mode)));
                }
            }
        }

        return new QualityBenchReport(seedSet, masterSeed, size == QualityBenchSize.Quick, rows, modeRows, outcomes, clock.Elapsed.TotalSeconds, Math.Max(1, jobs));
    }

    /// <summary>Draws, simulates and scores one scene.</summary>
    /// <exception cref="InvalidOperationException">The scene could not be drawn or run (the message names it and its seed).</exception>
    public static BenchSceneOutcome RunScene(BenchSceneKey key, QualityBenchSize size, CancellationToken cancellationToken)
    {
        var clock = Stopwatch.StartNew();
        try
        {
            BenchScene bench = BenchSceneBuilder.Build(key, size, cancellationToken);
            BenchSceneOutcome outcome = Run(bench, null, cancellationToken);
            return outcome with { ElapsedSeconds = clock.Elapsed.TotalSeconds };
        }
        catch (Exception e) when (e is InvalidOperationException or ArgumentException or SceneException or CaptureFormatException)
        {
            throw new InvalidOperationException($"bench scene {key.Name} (seed {key.Seed}): {e.Message}", e);
        }
    }

    /// <summary>
    /// Simulates a drawn (or hand-built) bench scene into memory and scores it: the readout through
    /// <see cref="CaptureGateSource"/> and <see cref="ReplaySession"/>, and the two plain ways on the same rows. The passes
    /// scored are those of <see cref="BenchScene.Targets"/> (target k on leg k).
    /// </summary>
    /// <param name="bench">The scene.</param>
    /// <param name="readout">Readout settings to use instead of replay's defaults (signal, beat side and search_hz are taken
    /// from the capture, as replay does); null for the defaults.</param>
    /// <param name="cancellationToken">Stops the run.</param>
    public static BenchSceneOutcome Run(BenchScene bench, ReadoutSettings? readout, CancellationToken cancellationToken)
    {
        var clock = Stopwatch.StartNew();
        var model = new SceneModel(bench.Scene, bench.Scene.Name);
        var simulator = new CaptureSimulator(model);
        var capture = new MemoryCapture(simulator.Metadata, bench.Key.Name);
        SimulationTruth truth = simulator.Run(capture, null, cancellationToken);
        IReadOnlyList<BenchPass> passes = PassesOf(bench, model, truth);
        var ways = new List<BenchWayOutcome>();

        ReplayReport report = Replay(capture, readout, cancellationToken);
        ways.Add(new BenchWayOutcome(BenchWay.Readout, BenchPassMatcher.Match(passes, report.Events), report.Rebaselines.Count));

        List<PlainGate> gates = PlainReciprocalGates.Compute(capture);
        CaptureMetadata md = capture.Metadata;
        double sign = SignRule.SearchSignPerCounted(md.Signal, md.BeatSide);
        foreach (var (way, baseline) in new[] { (BenchWay.FixedBaseline, PlainBaseline.Fixed), (BenchWay.MovingBaseline, PlainBaseline.Moving) })
        {
            PlainDetectionResult plain = PlainDetector.Detect(gates, baseline, sign, model.SearchNominalHz);
            var events = plain.Events.Select(e => new ReplayEvent(e, null)).ToList();
            ways.Add(new BenchWayOutcome(way, BenchPassMatcher.Match(passes, events), 0));
        }

        return new BenchSceneOutcome(bench, model.DurationS, capture.Rows, passes, ways, report, clock.Elapsed.TotalSeconds);
    }

    /// <summary>The capture through the counting core and the device pipeline exactly as <c>replay</c> runs it (with its defaults unless <paramref name="template"/> is given).</summary>
    private static ReplayReport Replay(MemoryCapture capture, ReadoutSettings? template, CancellationToken cancellationToken)
    {
        var defaults = new ReadoutCommandSettings();
        CounterSettings options = defaults.BuildOptions(out string? optionError)
            ?? throw new InvalidOperationException("replay's default counter options are invalid: " + optionError);
        using ICaptureReader reader = capture.OpenReader();
        ReadoutSettings readout = defaults.BuildReadoutSettings(reader.Metadata, out string? readoutError)
            ?? throw new InvalidOperationException("replay's default readout settings are invalid: " + readoutError);
        if (template != null)
        {
            ReadoutSettings given = template.Clone();
            given.Signal = readout.Signal;
            given.BeatSide = readout.BeatSide;
            given.SearchHz = readout.SearchHz;
            if (!given.TryValidate(out string error))
            {
                throw new ArgumentException(error);
            }

            readout = given;
        }

        var source = new CaptureGateSource(reader, options);
        var session = new ReplaySession(readout, reader.Metadata.StartedUtc);
        return session.Run(source, cancellationToken);
    }

    private static IReadOnlyList<BenchPass> PassesOf(BenchScene bench, SceneModel model, SimulationTruth truth)
    {
        var passes = new List<BenchPass>();
        foreach (BenchTargetPlan plan in bench.Targets)
        {
            TargetTruth target = truth.Targets[plan.Index];
            PassTruth pass = target.Passes[plan.Index];
            SweepPass leg = model.Plan.Passes[plan.Index];
            passes.Add(new BenchPass(
                target.Name,
                plan.Index,
                leg.StartTimeS,
                leg.EndTimeS,
                pass.PeakTimeS,
                pass.PeakSearchShiftHz,
                target.MaterialClass,
                target.SignRuleClass,
                Math.Abs(pass.PeakSearchShiftHz) / bench.GateNoiseHz));
        }

        return passes;
    }

    private static QualityRow Row(BenchKind kind, BenchMode? mode, BenchWay way, IEnumerable<BenchSceneOutcome> scenes)
    {
        int targets = 0, found = 0, right = 0, falseTargets = 0, falseDrift = 0;
        double driftSeconds = 0;
        var errors = new List<double>();
        double low = double.PositiveInfinity, high = double.NegativeInfinity;
        foreach (BenchSceneOutcome s in scenes)
        {
            BenchWayOutcome w = s.Ways.Single(x => x.Way == way);
            low = Math.Min(low, s.Scene.GateNoisePpm);
            high = Math.Max(high, s.Scene.GateNoisePpm);
            if (s.Scene.Key.DriftOnly)
            {
                driftSeconds += s.DurationSeconds;
                falseDrift += w.FalseEvents;
            }
            else
            {
                targets += s.Passes.Count;
                found += w.Found;
                right += w.Right;
                falseTargets += w.FalseEvents;
                errors.AddRange(w.PeakErrors);
            }
        }

        double? median = errors.Count > 0 ? MathNet.Numerics.Statistics.Statistics.Median(errors) : null;
        return new QualityRow(kind, mode, way, targets, found, right, falseTargets, falseDrift, driftSeconds / 3600.0, median,
            double.IsInfinity(low) ? double.NaN : low, double.IsInfinity(high) ? double.NaN : high);
    }
}
