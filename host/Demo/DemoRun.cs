using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Commands;
using FreqReadout.Host.Counting;
using FreqReadout.Host.Output;
using FreqReadout.Host.Replay;
using FreqReadout.Host.Reports;
using FreqReadout.Host.Simulation;
using FreqReadout.Readout;

namespace FreqReadout.Host.Demo;

/// <summary>
/// The built-in demo: simulates the invented floor-scan scene (<see cref="DemoScenes.FloorScan"/>) from
/// physics into a capture file, replays that file through the same counting and readout pipeline the
/// device runs (default settings of <c>replay</c>), and matches each simulated pass to the event the
/// readout reported. Nothing here is tuned to the scene: the replay knows only the capture.
/// </summary>
public static class DemoRun
{
    /// <summary>An event matches a pass when its peak lies within this many seconds of the simulated peak.</summary>
    public const double MatchWindowSeconds = 1.0;

    /// <summary>Why the demo capture must be a regular file (for <see cref="OutputFile.RegularFileNeededBecause"/>).</summary>
    public const string ReadBackReason = "the demo reads its capture back to replay it";

    /// <summary>Runs the demo, writing the capture (text format) to <paramref name="capturePath"/>.</summary>
    public static DemoResult Run(string capturePath, IProgress<double>? progress, CancellationToken cancellationToken)
        => Run(DemoScenes.FloorScan(), "built-in demo scene", capturePath, progress, cancellationToken);

    /// <summary>Simulates any scene, replays it with replay's defaults and matches passes to events, as the demo does.</summary>
    /// <exception cref="OutputFileException">The capture cannot be written (its folder is missing, the disk is full, ...); an existing file is left as it was.</exception>
    public static DemoResult Run(Scene scene, string sceneName, string capturePath, IProgress<double>? progress, CancellationToken cancellationToken)
    {
        using var outputs = new OutputFileSet();
        OutputFile capture = outputs.AddOutput("the demo capture", capturePath, "the demo capture");
        capture.RegularFileNeededBecause = ReadBackReason;
        if (!outputs.TryPrepare(out OutputFileException? problem))
        {
            throw problem!;
        }

        DemoResult result = Run(scene, sceneName, capture, progress, cancellationToken);
        outputs.Commit();
        return result;
    }

    /// <summary>
    /// The demo on a prepared output: the capture is simulated into <paramref name="capture"/>'s stream and
    /// read back from what was written (<see cref="OutputFile.ContentPath"/>) before the caller commits, or
    /// drops, the file.
    /// </summary>
    public static DemoResult Run(Scene scene, string sceneName, OutputFile capture, IProgress<double>? progress, CancellationToken cancellationToken)
        => Run(scene, sceneName, capture, progress, null, cancellationToken);

    /// <summary>The demo on a prepared output, as above, keeping every reading in <paramref name="trace"/> when given (for <c>demo --report</c>).</summary>
    public static DemoResult Run(Scene scene, string sceneName, OutputFile capture, IProgress<double>? progress, ReadingTrace? trace, CancellationToken cancellationToken)
    {
        string readBack = capture.ContentPath ?? throw new ArgumentException($"{capture.Path}: the demo capture must be a regular file ({ReadBackReason}); set RegularFileNeededBecause before preparing", nameof(capture));
        var model = new SceneModel(scene, sceneName);
        var simulator = new CaptureSimulator(model);
        SimulationTruth truth;
        using (ICaptureWriter writer = CaptureFile.Create(capture.Stream, simulator.Metadata, CaptureFileFormat.Text))
        {
            truth = simulator.Run(writer, progress, cancellationToken);
        }

        string capturePath = capture.Path;
        ReplayReport report;
        ReadoutSettings readout;
        CounterSettings counterUsed;
        var defaults = new ReadoutCommandSettings();
        CounterSettings options = defaults.BuildOptions(out string? optionError)
            ?? throw new InvalidOperationException("default counter options invalid: " + optionError);
        var bytes = new FileStream(readBack, FileMode.Open, FileAccess.Read, FileShare.ReadWrite, 65536, FileOptions.SequentialScan);
        using (ICaptureReader reader = CaptureFile.Open(bytes, capturePath))
        {
            readout = defaults.BuildReadoutSettings(reader.Metadata, out string? readoutError)
                ?? throw new InvalidOperationException("default readout settings invalid: " + readoutError);
            ReadoutCommandSettings.ApplyBeatFloor(options, readout);
            var source = new CaptureGateSource(reader, options);
            counterUsed = source.Settings;
            var session = new ReplaySession(readout, reader.Metadata.StartedUtc);
            if (trace != null)
            {
                session.ReadingSink = (r, g) => trace.Add(r);
            }

            report = session.Run(source, cancellationToken);
        }

        var passes = truth.Targets.SelectMany(t => t.Passes.Select(p => (Target: t, Pass: p))).ToList();
        ReplayEvent?[] matched = PassMatching.Match(passes.Select(x => x.Pass.PeakTimeS).ToList(), report.Events, MatchWindowSeconds);
        var matches = new List<DemoPassMatch>();
        for (int i = 0; i < passes.Count; i++)
        {
            (TargetTruth target, PassTruth pass) = passes[i];
            matches.Add(new DemoPassMatch(target.Name, pass.Pass, pass.PeakTimeS, pass.PeakSearchShiftHz, target.MaterialClass, target.SignRuleClass, matched[i]));
        }

        var used = new HashSet<ReplayEvent>(matched.OfType<ReplayEvent>());
        matches.Sort((a, b) => a.TruthPeakSeconds.CompareTo(b.TruthPeakSeconds));
        List<ReplayEvent> unmatched = report.Events.Where(e => !used.Contains(e)).ToList();
        return new DemoResult(truth, report, matches, unmatched, capturePath) { Counter = counterUsed, Readout = readout };
    }
}
