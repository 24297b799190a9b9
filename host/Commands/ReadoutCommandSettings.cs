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
/// (<see cref="CounterOptionSettings"/>, as <c>count</c>) and the readout settings both use (<see cref="ReadoutSettings"/>,
/// defaults shown by --help). Settings only <c>replay</c> uses (polarity, unclear band, tempco) are declared by
/// replay's own settings and applied through <see cref="ApplyCommandOptions"/>, so calibrate does not offer them.
/// Signal, beat side and search_hz come from the capture's metadata.
/// </summary>
public class ReadoutCommandSettings : CounterOptionSettings
{
    [CommandArgument(0, "<capture>")]
    [Description("Capture file, text or binary (picked by content); - reads it from standard input.")]
    [FilePath(StandardInput = true)]
    public string Capture { get; set; } = string.Empty;

    [CommandOption("--json")]
    [Description("Exactly one JSON object on stdout; diagnostics on stderr.")]
    public bool Json { get; set; }

    [CommandOption("--search-hz <HZ>")]
    [Description("Nominal search-oscillator frequency, Hz, [[0, 1e12]] (0 = unknown): ppm in beat mode, and the check that the measured frequency is not an alias of a timer too narrow for the signal. Default: the capture's search_hz.")]
    public string? SearchHz { get; set; }

    [CommandOption("--threshold-sigma <SIGMA>")]
    [Description("Detection threshold in noise sigmas, [[1, 1000]]. Default 5 (white Gaussian noise crosses it with probability 5.7e-7 per reading).")]
    public string? ThresholdSigma { get; set; }

    [CommandOption("--hysteresis-sigma <SIGMA>")]
    [Description("An event ends below threshold - hysteresis, [[0, threshold). Default 2.")]
    public string? HysteresisSigma { get; set; }

    [CommandOption("--min-duration-s <SECONDS>")]
    [Description("Gate time above the release level that confirms an event, [[0, 60]]. Default 0.1.")]
    public string? MinDurationSeconds { get; set; }

    [CommandOption("--release-s <SECONDS>")]
    [Description("Gate time below the release level that ends an event, [[0, 60]]. Default 0.2.")]
    public string? ReleaseSeconds { get; set; }

    [CommandOption("--persistent-shift-s <SECONDS>")]
    [Description("An event lasting this long outside hold mode becomes the new baseline (auto re-baseline), [[1, 86400]]. Default 30.")]
    public string? PersistentShiftSeconds { get; set; }

    [CommandOption("--settling-s <SECONDS>")]
    [Description("Wait before a baseline capture, [[0, 3600]]. Default 1.")]
    public string? SettlingSeconds { get; set; }

    [CommandOption("--baseline-s <SECONDS>")]
    [Description("Baseline capture length, (0, 600]]. Default 5.")]
    public string? BaselineSeconds { get; set; }

    [CommandOption("--baseline-max-gates <N>")]
    [Description("Baseline capture buffer, [[8, 8192]]. Default 512.")]
    public string? BaselineMaxGates { get; set; }

    [CommandOption("--outlier-sigma <SIGMA>")]
    [Description("Baseline points beyond this many robust sigmas are rejected, [[2, 20]]. Default 3.")]
    public string? OutlierSigma { get; set; }

    [CommandOption("--noise-window-gates <N>")]
    [Description("Running robust noise window, target-free gates, [[16, 4096]]. Default 512.")]
    public string? NoiseWindowGates { get; set; }

    [CommandOption("--noise-floor-hz <HZ>")]
    [Description("Least noise sigma used, (0, 1e6]]. Default 0.001.")]
    public string? NoiseFloorHz { get; set; }

    [CommandOption("--tracker-memory-s <SECONDS>")]
    [Description("Memory the drift tracker starts from after a baseline (it then adapts to the drift), [[0.4, 120]]. Default 5.")]
    public string? TrackerMemorySeconds { get; set; }

    [CommandOption("--tracker-delay-gates <N>")]
    [Description("Readings reach the tracker this many gates late, [[0, 1000]]. Default 5.")]
    public string? TrackerDelayGates { get; set; }

    [CommandOption("--guard-sigma <SIGMA>")]
    [Description("Residuals fed to the tracker are clipped to +-guard sigmas, (0, 100]]. Default 3.")]
    public string? GuardSigma { get; set; }

    [CommandOption("--lock-check-s <SECONDS>")]
    [Description("A target candidate that has lasted this long and that one smooth local quadratic (drift) explains together with the --fit-window-s before it is taken as drift the tracker failed to follow: no event, the tracker re-anchors on the fit, [[0.5, 600]]. Default 2.5.")]
    public string? LockCheckSeconds { get; set; }

    [CommandOption("--fit-window-s <SECONDS>")]
    [Description("Target-free readings before a candidate that its local quadratic baseline is fitted to, [[1, 600]]. Default 8.")]
    public string? FitWindowSeconds { get; set; }

    [CommandOption("--history-gates <N>")]
    [Description("Recent readings kept to decide a candidate from both sides of it, an integer in [[64, 16384]]; they should span --fit-window-s + 3 x --lock-check-s + 2 s, so raise it for short gates. Default 256.")]
    public string? HistoryGates { get; set; }

    [CommandOption("--beat-floor-hz <HZ>")]
    [Description("Beat mode: a beat note below this is flagged and its sign unclear, [[0, 1e9]]. Default 50.")]
    public string? BeatFloorHz { get; set; }

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
            SearchHz = metadata.SearchHz ?? 0,
        };
        if (SearchHz != null)
        {
            if (!OptionValues.TryNumber(SearchHz, out double searchHz))
            {
                error = $"--search-hz must be a number (Hz){RangeOf(r => r.SearchHz = double.NaN)}, got {OptionValues.Quote(SearchHz)}";
                return null;
            }

            s.SearchHz = searchHz;
        }

        var numbers = new (string? Text, string Option, Action<ReadoutSettings, double> Set)[]
        {
            (ThresholdSigma, "--threshold-sigma", (r, v) => r.ThresholdSigma = v),
            (HysteresisSigma, "--hysteresis-sigma", (r, v) => r.HysteresisSigma = v),
            (MinDurationSeconds, "--min-duration-s", (r, v) => r.MinDurationSeconds = v),
            (ReleaseSeconds, "--release-s", (r, v) => r.ReleaseSeconds = v),
            (PersistentShiftSeconds, "--persistent-shift-s", (r, v) => r.PersistentShiftSeconds = v),
            (SettlingSeconds, "--settling-s", (r, v) => r.SettlingSeconds = v),
            (BaselineSeconds, "--baseline-s", (r, v) => r.BaselineSeconds = v),
            (OutlierSigma, "--outlier-sigma", (r, v) => r.OutlierSigma = v),
            (NoiseFloorHz, "--noise-floor-hz", (r, v) => r.NoiseFloorHz = v),
            (TrackerMemorySeconds, "--tracker-memory-s", (r, v) => r.TrackerMemorySeconds = v),
            (GuardSigma, "--guard-sigma", (r, v) => r.GuardSigma = v),
            (LockCheckSeconds, "--lock-check-s", (r, v) => r.LockCheckSeconds = v),
            (FitWindowSeconds, "--fit-window-s", (r, v) => r.FitWindowSeconds = v),
            (BeatFloorHz, "--beat-floor-hz", (r, v) => r.BeatFloorHz = v),
        };
        foreach (var (text, option, set) in numbers)
        {
            if (!TrySetNumber(s, text, option, set, out error))
            {
                return null;
            }
        }

        var integers = new (string? Text, string Option, Action<ReadoutSettings, int> Set)[]
        {
            (BaselineMaxGates, "--baseline-max-gates", (r, v) => r.BaselineMaxGates = v),
            (NoiseWindowGates, "--noise-window-gates", (r, v) => r.NoiseWindowGates = v),
            (TrackerDelayGates, "--tracker-delay-gates", (r, v) => r.TrackerDelayGates = v),
            (HistoryGates, "--history-gates", (r, v) => r.HistoryGates = v),
        };
        foreach (var (text, option, set) in integers)
        {
            if (text == null)
            {
                continue;
            }

            if (!int.TryParse(text, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out int value))
            {
                error = $"{option} must be an integer{RangeOf(v => set(v, int.MinValue))}, got {OptionValues.Quote(text)}";
                return null;
            }

            set(s, value);
        }

        if (!ApplyCommandOptions(s, out error))
        {
            return null;
        }

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

    /// <summary>Applies the options only one command declares (replay: polarity, unclear band, tempco); false with an error naming the option.</summary>
    protected virtual bool ApplyCommandOptions(ReadoutSettings settings, out string? error)
    {
        error = null;
        return true;
    }

    /// <summary>Parses one number option into a readout setting; false with an error naming the option and its allowed range.</summary>
    protected static bool TrySetNumber(ReadoutSettings settings, string? text, string option, Action<ReadoutSettings, double> set, out string? error)
    {
        error = null;
        if (text == null)
        {
            return true;
        }

        if (!OptionValues.TryNumber(text, out double value))
        {
            error = $"{option} must be a number{RangeOf(v => set(v, double.NaN))}, got {OptionValues.Quote(text)}";
            return false;
        }

        set(settings, value);
        return true;
    }

    /// <summary>
    /// " in [lo, hi]": the allowed range of one setting, taken from <see cref="ReadoutSettings.TryValidate"/>
    /// itself (the setting is made invalid on a default copy), so the text never differs from the range check.
    /// </summary>
    private static string RangeOf(Action<ReadoutSettings> makeInvalid)
    {
        var probe = new ReadoutSettings();
        makeInvalid(probe);
        if (probe.TryValidate(out string message))
        {
            return string.Empty;
        }

        int must = message.IndexOf(" must be ", StringComparison.Ordinal);
        int at = must < 0 ? -1 : message.IndexOf(" in ", must, StringComparison.Ordinal);
        int got = message.LastIndexOf(", got ", StringComparison.Ordinal);
        return at > 0 && got > at ? message[at..got] : string.Empty;
    }

    /// <summary>The report with <see cref="IgnoredOptionWarnings"/> added to its warnings.</summary>
    public FreqReadout.Host.Replay.ReplayReport WithIgnoredOptionWarnings(FreqReadout.Host.Replay.ReplayReport report, CaptureMetadata metadata)
    {
        IReadOnlyList<string> ignored = IgnoredOptionWarnings(metadata);
        return ignored.Count == 0 ? report : report with { Warnings = report.Warnings.Concat(ignored).ToList() };
    }

    /// <summary>
    /// Missed-edge inference stops near the beat floor: sets <see cref="CounterSettings.InferMinBeatHz"/>
    /// to <see cref="CounterSettings.InferBeatFloorFactor"/> x the readout's beat floor.
    /// </summary>
    public static void ApplyBeatFloor(CounterSettings options, ReadoutSettings readout)
    {
        options.InferMinBeatHz = CounterSettings.InferBeatFloorFactor * readout.BeatFloorHz;
    }

    /// <summary>Invariant number text.</summary>
    protected static string Num(double value, string format = "0.######") => value.ToString(format, CultureInfo.InvariantCulture);
}
