using System.ComponentModel;
using System.Globalization;
using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Host.Captures;
using FreqReadout.Readout;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// Options shared by <c>replay</c> and <c>calibrate</c>: the capture, the counter's gate and estimator
/// (same names and checks as <c>count</c>) and every readout setting (<see cref="ReadoutSettings"/>,
/// defaults shown by --help). Signal, beat side and search_hz come from the capture's metadata.
/// </summary>
public class ReadoutCommandSettings : CommandSettings
{
    [CommandArgument(0, "<capture>")]
    [Description("Capture file, text or binary (picked by content).")]
    public string Capture { get; set; } = string.Empty;

    [CommandOption("--json")]
    [Description("Exactly one JSON object on stdout; diagnostics on stderr.")]
    public bool Json { get; set; }

    [CommandOption("--gate-seconds <SECONDS>")]
    [Description("Time gate, s (> 0). Default 0.1.")]
    public double? GateSeconds { get; set; }

    [CommandOption("--gate-edges <N>")]
    [Description("Edge gate: N recorded intervals (integer >= 1), instead of --gate-seconds.")]
    public int? GateEdges { get; set; }

    [CommandOption("--estimator <NAME>")]
    [Description("reciprocal or regression. Default regression (snapshot captures: snapshot-regression).")]
    public string? Estimator { get; set; }

    [CommandOption("--jitter-ticks <TICKS>")]
    [Description("Timestamp jitter in the error model, rms ticks (>= 0). Default 0.")]
    public double? JitterTicks { get; set; }

    [CommandOption("--no-signal-seconds <SECONDS>")]
    [Description("No edge for this long is no signal (> 0). Default 0.5.")]
    public double? NoSignalSeconds { get; set; }

    [CommandOption("--search-hz <HZ>")]
    [Description("Nominal search-oscillator frequency for ppm in beat mode, [[0, 1e12]]. Default: the capture's search_hz.")]
    public double? SearchHz { get; set; }

    [CommandOption("--threshold-sigma <SIGMA>")]
    [Description("Detection threshold in noise sigmas, [[1, 1000]]. Default 5 (white Gaussian noise crosses it with probability 5.7e-7 per reading).")]
    public double? ThresholdSigma { get; set; }

    [CommandOption("--hysteresis-sigma <SIGMA>")]
    [Description("An event ends below threshold - hysteresis, [[0, threshold). Default 2.")]
    public double? HysteresisSigma { get; set; }

    [CommandOption("--min-duration-s <SECONDS>")]
    [Description("Gate time above the release level that confirms an event, [[0, 60]]. Default 0.1.")]
    public double? MinDurationSeconds { get; set; }

    [CommandOption("--release-s <SECONDS>")]
    [Description("Gate time below the release level that ends an event, [[0, 60]]. Default 0.2.")]
    public double? ReleaseSeconds { get; set; }

    [CommandOption("--unclear-band-sigma <SIGMA>")]
    [Description("Peaks below threshold + band are classed unclear, [[0, 1000]]. Default 1.")]
    public double? UnclearBandSigma { get; set; }

    [CommandOption("--polarity <NAME>")]
    [Description("normal (search frequency up = non-ferrous) or inverted. Default normal.")]
    public string? Polarity { get; set; }

    [CommandOption("--persistent-shift-s <SECONDS>")]
    [Description("An event lasting this long outside hold mode becomes the new baseline (auto re-baseline), [[1, 86400]]. Default 30.")]
    public double? PersistentShiftSeconds { get; set; }

    [CommandOption("--settling-s <SECONDS>")]
    [Description("Wait before a baseline capture, [[0, 3600]]. Default 1.")]
    public double? SettlingSeconds { get; set; }

    [CommandOption("--baseline-s <SECONDS>")]
    [Description("Baseline capture length, (0, 600]]. Default 5.")]
    public double? BaselineSeconds { get; set; }

    [CommandOption("--baseline-max-gates <N>")]
    [Description("Baseline capture buffer, [[8, 8192]]. Default 512.")]
    public int? BaselineMaxGates { get; set; }

    [CommandOption("--outlier-sigma <SIGMA>")]
    [Description("Baseline points beyond this many robust sigmas are rejected, [[2, 20]]. Default 3.")]
    public double? OutlierSigma { get; set; }

    [CommandOption("--noise-window-gates <N>")]
    [Description("Running robust noise window, target-free gates, [[16, 4096]]. Default 512.")]
    public int? NoiseWindowGates { get; set; }

    [CommandOption("--noise-floor-hz <HZ>")]
    [Description("Least noise sigma used, (0, 1e6]]. Default 0.001.")]
    public double? NoiseFloorHz { get; set; }

    [CommandOption("--tracker-level-s <SECONDS>")]
    [Description("Drift tracker (Holt) level time constant, (0, 3600]]. Default 2.")]
    public double? TrackerLevelSeconds { get; set; }

    [CommandOption("--tracker-slope-s <SECONDS>")]
    [Description("Drift tracker (Holt) slope time constant, (0, 36000]]. Default 10.")]
    public double? TrackerSlopeSeconds { get; set; }

    [CommandOption("--tracker-delay-gates <N>")]
    [Description("Readings reach the tracker this many gates late, [[0, 1000]]. Default 5.")]
    public int? TrackerDelayGates { get; set; }

    [CommandOption("--guard-sigma <SIGMA>")]
    [Description("Residuals fed to the tracker are clipped to +-guard sigmas, (0, 100]]. Default 3.")]
    public double? GuardSigma { get; set; }

    [CommandOption("--beat-floor-hz <HZ>")]
    [Description("Beat mode: a beat note below this is flagged and its sign unclear, [[0, 1e9]]. Default 50.")]
    public double? BeatFloorHz { get; set; }

    [CommandOption("--tempco-ppm-per-k <PPM>")]
    [Description("Search-oscillator tempco removed before tracking (from calibrate), [[-1000, 1000]]; 0 = off. Default 0.")]
    public double? TempcoPpmPerK { get; set; }

    /// <summary>The counter options (same rules and messages as <c>count</c>); null with the error.</summary>
    public CounterSettings? BuildCounterOptions(out string? error)
    {
        return CountCommand.BuildOptions(
            new CountCommand.Settings
            {
                GateSeconds = GateSeconds,
                GateEdges = GateEdges,
                Estimator = Estimator,
                JitterTicks = JitterTicks,
                NoSignalSeconds = NoSignalSeconds,
            },
            out error);
    }

    /// <summary>
    /// The readout settings for a capture: the options over the defaults, with signal, beat side and
    /// search_hz from the metadata. Null with an error naming the option, the setting and its range.
    /// </summary>
    public ReadoutSettings? BuildReadoutSettings(CaptureMetadata metadata, out string? error)
    {
        error = null;
        var s = new ReadoutSettings
        {
            Signal = metadata.Signal,
            BeatSide = metadata.Signal == SignalKind.Beat ? metadata.BeatSide : BeatSide.None,
            SearchHz = SearchHz ?? metadata.SearchHz ?? 0,
        };
        if (Polarity != null)
        {
            switch (Polarity.Trim().ToLowerInvariant())
            {
                case "normal":
                    s.Polarity = FreqReadout.Detection.Polarity.Normal;
                    break;
                case "inverted":
                    s.Polarity = FreqReadout.Detection.Polarity.Inverted;
                    break;
                default:
                    error = $"--polarity must be normal or inverted, got '{Polarity}'";
                    return null;
            }
        }

        if (ThresholdSigma is double threshold) { s.ThresholdSigma = threshold; }
        if (HysteresisSigma is double hysteresis) { s.HysteresisSigma = hysteresis; }
        if (MinDurationSeconds is double minDuration) { s.MinDurationSeconds = minDuration; }
        if (ReleaseSeconds is double release) { s.ReleaseSeconds = release; }
        if (UnclearBandSigma is double band) { s.UnclearBandSigma = band; }
        if (PersistentShiftSeconds is double persistent) { s.PersistentShiftSeconds = persistent; }
        if (SettlingSeconds is double settling) { s.SettlingSeconds = settling; }
        if (BaselineSeconds is double baseline) { s.BaselineSeconds = baseline; }
        if (BaselineMaxGates is int maxGates) { s.BaselineMaxGates = maxGates; }
        if (OutlierSigma is double outlier) { s.OutlierSigma = outlier; }
        if (NoiseWindowGates is int window) { s.NoiseWindowGates = window; }
        if (NoiseFloorHz is double floor) { s.NoiseFloorHz = floor; }
        if (TrackerLevelSeconds is double level) { s.TrackerLevelSeconds = level; }
        if (TrackerSlopeSeconds is double slope) { s.TrackerSlopeSeconds = slope; }
        if (TrackerDelayGates is int delay) { s.TrackerDelayGates = delay; }
        if (GuardSigma is double guard) { s.GuardSigma = guard; }
        if (BeatFloorHz is double beatFloor) { s.BeatFloorHz = beatFloor; }
        if (TempcoPpmPerK is double tempco) { s.TempcoPpmPerK = tempco; }

        if (!s.TryValidate(out string settingError))
        {
            // The setting's snake_case name leads the message; the option is the same name in kebab case.
            int space = settingError.IndexOf(' ');
            string name = space > 0 ? settingError[..space] : settingError;
            error = $"--{name.Replace('_', '-')}: {settingError}";
            return null;
        }

        return s;
    }

    /// <summary>Invariant number text.</summary>
    protected static string Num(double value, string format = "0.######") => value.ToString(format, CultureInfo.InvariantCulture);
}
