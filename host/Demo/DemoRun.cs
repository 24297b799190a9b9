using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Commands;
using FreqReadout.Host.Counting;
using FreqReadout.Host.Replay;
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

    /// <summary>Runs the demo, writing the capture (text format) to <paramref name="capturePath"/>.</summary>
    public static DemoResult Run(string capturePath, IProgress<double>? progress, CancellationToken cancellationToken)
        => Run(DemoScenes.FloorScan(), "built-in demo scene", capturePath, progress, cancellationToken);

    /// <summary>Simulates any scene, replays it with replay's defaults and matches passes to events, as the demo does.</summary>
    public static DemoResult Run(Scene scene, string sceneName, string capturePath, IProgress<double>? progress, CancellationToken cancellationToken)
    {
        var model = new SceneModel(scene, sceneName);
        var simulator = new CaptureSimulator(model);
        SimulationTruth truth;
        using (ICaptureWriter writer = CaptureFile.Create(capturePath, simulator.Metadata, CaptureFileFormat.Text))
        {
            truth = simulator.Run(writer, progress, cancellationToken);
        }

        var defaults = new ReadoutCommandSettings();
        CounterSettings options = defaults.BuildOptions(out string? optionError)
            ?? throw new InvalidOperationException("default counter options invalid: " + optionError);
        ReplayReport report;
        using (ICaptureReader reader = CaptureFile.Open(capturePath))
        {
            ReadoutSettings readout = defaults.BuildReadoutSettings(reader.Metadata, out string? readoutError)
                ?? throw new InvalidOperationException("default readout settings invalid: " + readoutError);
            ReadoutCommandSettings.ApplyBeatFloor(options, readout);
            var source = new CaptureGateSource(reader, options);
            var session = new ReplaySession(readout, reader.Metadata.StartedUtc);
            report = session.Run(source, cancellationToken);
        }

        var matches = new List<DemoPassMatch>();
        var used = new HashSet<ReplayEvent>();
        foreach (TargetTruth target in truth.Targets)
        {
            foreach (PassTruth pass in target.Passes)
            {
                ReplayEvent? best = report.Events
                    .Where(e => !used.Contains(e) && Math.Abs(e.Event.PeakSeconds - pass.PeakTimeS) <= MatchWindowSeconds)
                    .OrderBy(e => Math.Abs(e.Event.PeakSeconds - pass.PeakTimeS))
                    .FirstOrDefault();
                if (best != null)
                {
                    used.Add(best);
                }

                matches.Add(new DemoPassMatch(target.Name, pass.Pass, pass.PeakTimeS, pass.PeakSearchShiftHz, target.MaterialClass, target.SignRuleClass, best));
            }
        }

        matches.Sort((a, b) => a.TruthPeakSeconds.CompareTo(b.TruthPeakSeconds));
        List<ReplayEvent> unmatched = report.Events.Where(e => !used.Contains(e)).ToList();
        return new DemoResult(truth, report, matches, unmatched, capturePath);
    }
}
