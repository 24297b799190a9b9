using System.ComponentModel;
using System.Globalization;
using System.Text;
using System.Text.Json;
using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Counting;
using FreqReadout.Host.Output;
using FreqReadout.Host.Replay;
using FreqReadout.Host.Tuning;
using FreqReadout.Readout;
using FreqReadout.Settings;
using Spectre.Console;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout tune &lt;capture&gt; --vary KEY=FROM:TO:STEP [--settings-out FILE --pick VALUE] [--json]</c>: replays
/// a capture once per value of one setting, on as many cores as the machine has, each replay as <c>replay</c> would run
/// it with the other options given, and tabulates what each found (events by class, re-baselines), so a user picks a
/// setting from a field capture. <c>--settings-out</c> writes the device settings file (docs/settings-format.md) with
/// the picked value.
/// </summary>
public sealed class TuneCommand : Command<TuneCommand.Settings>
{
    public sealed class Settings : ReadoutCommandSettings
    {
        [CommandOption("--vary <KEY=FROM:TO:STEP>")]
        [Description("The setting to vary and its range, e.g. threshold_sigma=4:10:0.5; KEY is threshold_sigma, hysteresis_sigma, min_duration_s, release_s, persistent_shift_s, unclear_band_sigma, lock_check_s or gate_s; at most 200 values. Required.")]
        public string? Vary { get; set; }

        [CommandOption("--truth <FILE>")]
        [Description("A simulation's truth file (simulate --truth): each value is also scored: passes found, classed right, false events (matched as demo matches them). Default: none, no scores.")]
        [FilePath]
        public string? Truth { get; set; }

        [CommandOption("--pick <VALUE>")]
        [Description("With --settings-out: the value to write (one of the varied values). Required with --settings-out.")]
        public double? Pick { get; set; }

        [CommandOption("--settings-out <FILE>")]
        [Description("Write a device settings file (docs/settings-format.md) with the picked value and the other options as given; for record --send-settings. Default: none.")]
        [FilePath]
        public string? SettingsOut { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        if (settings.Vary == null)
        {
            return CommandOutput.Fail("--vary KEY=FROM:TO:STEP is required (e.g. --vary threshold_sigma=4:10:0.5)", CommandOutput.BadOption);
        }

        if (!TuneVariation.TryParse(settings.Vary, out TuneVariation? parsed, out string? varyError))
        {
            return CommandOutput.Fail(varyError!, CommandOutput.BadOption);
        }

        TuneVariation variation = parsed!;
        if ((settings.SettingsOut == null) != (settings.Pick == null))
        {
            return CommandOutput.Fail("--settings-out and --pick go together: the file is written for the picked value", CommandOutput.BadOption);
        }

        if (settings.Pick is double pick && !variation.Values.Any(v => Math.Abs(v - pick) <= 1e-9))
        {
            return CommandOutput.Fail($"--pick {pick.ToString("R", CultureInfo.InvariantCulture)} is not one of the varied values of {variation.Key}", CommandOutput.BadOption);
        }

        if (settings.BuildOptions(out string? optionError) == null)
        {
            return CommandOutput.Fail(optionError!, CommandOutput.BadOption);
        }

        using var outputs = new OutputFileSet { StandardOutputInUse = settings.Json };
        outputs.AddInput("the capture", settings.Capture);
        outputs.AddInput("the truth file", settings.Truth);
        OutputFile? settingsFile = settings.SettingsOut != null ? outputs.AddOutput("--settings-out", settings.SettingsOut, "the device settings") : null;
        if (!outputs.TryPrepare(out OutputFileException? problem))
        {
            return CommandOutput.Fail(problem!.Message, problem.ExitCode);
        }

        if (settings.Capture == "-")
        {
            return CommandOutput.Fail("tune reads the capture once per value: give a file, not standard input", CommandOutput.BadOption);
        }

        int openError = CommandOutput.TryOpenCapture(settings.Capture, out ICaptureReader? first);
        if (first == null)
        {
            return openError;
        }

        ReadoutSettings? baseReadout;
        CaptureMetadata metadata;
        using (first)
        {
            metadata = first.Metadata;
            baseReadout = settings.BuildReadoutSettings(metadata, out string? readoutError);
            if (baseReadout == null)
            {
                return CommandOutput.Fail(readoutError!, CommandOutput.BadOption);
            }
        }

        TruthPasses? truth = null;
        if (settings.Truth != null && !TruthPasses.TryLoad(settings.Truth, out truth, out string? truthError))
        {
            return CommandOutput.Fail(truthError!, CommandOutput.BadInput);
        }

        var rows = new TuneRow[variation.Values.Count];
        Parallel.For(0, rows.Length, new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount, CancellationToken = cancellationToken }, i =>
        {
            rows[i] = RunOne(settings, variation, variation.Values[i], baseReadout, metadata, truth, cancellationToken);
        });

        if (settingsFile != null)
        {
            CounterSettings counter = settings.BuildOptions(out _)!;
            ReadoutSettings readout = baseReadout.Clone();
            variation.Apply(settings.Pick!.Value, counter, readout);
            int written = SettingsFileOutput.Write(outputs, settingsFile, settings.SettingsOut!, counter, readout, out _);
            if (written != ExitCodes.Ok)
            {
                return written;
            }

            bool inFile = variation.Key is "threshold_sigma" or "gate_s";
            CommandOutput.Diagnostic($"tune: wrote {settings.SettingsOut} with {variation.Key} = {settings.Pick.Value.ToString("R", CultureInfo.InvariantCulture)}" + (inFile ? string.Empty : $" ({variation.Key} is not a device setting: the file carries the other options)"));
        }

        if (settings.Json)
        {
            Console.Out.WriteLine(ToJson(variation, rows));
            return ExitCodes.Ok;
        }

        var console = CommandOutput.Stdout();
        var table = new Table().AddColumns(variation.Key, "events", "ferrous", "non-ferrous", "unclear", "re-baselines", "gates", "warnings");
        if (truth != null)
        {
            table.AddColumns($"found of {truth.PeakSeconds.Count}", "class right", "false events");
        }

        foreach (TuneRow r in rows)
        {
            string value = r.Value.ToString("R", CultureInfo.InvariantCulture);
            var cells = new List<string>();
            if (r.Error != null)
            {
                cells.Add(Markup.Escape("not run: " + r.Error));
                cells.AddRange(Enumerable.Repeat(string.Empty, 6 + (truth != null ? 3 : 0)));
            }
            else
            {
                cells.AddRange(new[] { N(r.Events), N(r.Ferrous), N(r.NonFerrous), N(r.Unclear), N(r.Rebaselines), N(r.Gates), N(r.Warnings) });
                if (truth != null)
                {
                    cells.AddRange(new[] { N(r.PassesFound ?? 0), N(r.ClassRight ?? 0), N(r.FalseEvents ?? 0) });
                }
            }

            table.AddRow(new[] { value }.Concat(cells).ToArray());
        }

        console.Write(table);
        console.WriteLine($"Each row is `freqreadout replay {settings.Capture}` with {variation.Key} set to its value and the other options as given.");
        return ExitCodes.Ok;
    }

    private static TuneRow RunOne(Settings settings, TuneVariation variation, double value, ReadoutSettings baseReadout, CaptureMetadata metadata, TruthPasses? truth, CancellationToken cancellationToken)
    {
        CounterSettings counter = settings.BuildOptions(out _)!;
        ReadoutSettings readout = baseReadout.Clone();
        variation.Apply(value, counter, readout);
        // The counter settings are checked with the capture's clock by CaptureGateSource below.
        if (!readout.TryValidate(out string? readoutError))
        {
            return new TuneRow(value, readoutError, 0, 0, 0, 0, 0, 0, 0);
        }

        ReadoutCommandSettings.ApplyBeatFloor(counter, readout);
        using ICaptureReader reader = CaptureFile.Open(settings.Capture);
        CaptureGateSource source;
        try
        {
            source = new CaptureGateSource(reader, counter, readout.SearchHz > 0 ? readout.SearchHz : null, settings.NoSignalSeconds != null);
        }
        catch (Exception e) when (e is ArgumentException or CaptureFormatException)
        {
            return new TuneRow(value, e.Message, 0, 0, 0, 0, 0, 0, 0);
        }

        var session = new ReplaySession(readout, metadata.StartedUtc);
        ReplayReport report;
        try
        {
            report = session.Run(source, cancellationToken);
        }
        catch (CaptureFormatException e)
        {
            return new TuneRow(value, e.Message, session.Gates, 0, 0, 0, 0, 0, 0);
        }

        int Count(TargetClass c) => report.Events.Count(e => e.Event.Class == c);
        var row = new TuneRow(value, null, report.Gates, report.Events.Count, Count(TargetClass.Ferrous), Count(TargetClass.NonFerrous), Count(TargetClass.Unclear), report.Rebaselines.Count, report.Warnings.Count);
        if (truth == null)
        {
            return row;
        }

        ReplayEvent?[] matched = PassMatching.Match(truth.PeakSeconds, report.Events, FreqReadout.Host.Demo.DemoRun.MatchWindowSeconds);
        int found = matched.Count(e => e != null);
        int right = matched.Where((e, i) => e != null && e.ClassName == truth.SignRuleClasses[i]).Count();
        return row with { PassesFound = found, ClassRight = right, FalseEvents = report.Events.Count - found };
    }

    private static string ToJson(TuneVariation variation, IReadOnlyList<TuneRow> rows)
    {
        using var stream = new MemoryStream();
        using (var w = new Utf8JsonWriter(stream))
        {
            w.WriteStartObject();
            w.WriteString("key", variation.Key);
            w.WriteStartArray("rows");
            foreach (TuneRow r in rows)
            {
                w.WriteStartObject();
                w.WriteNumber("value", r.Value);
                if (r.Error != null)
                {
                    w.WriteString("error", r.Error);
                }
                else
                {
                    w.WriteNull("error");
                }

                w.WriteNumber("gates", r.Gates);
                w.WriteNumber("events", r.Events);
                w.WriteNumber("ferrous", r.Ferrous);
                w.WriteNumber("non_ferrous", r.NonFerrous);
                w.WriteNumber("unclear", r.Unclear);
                w.WriteNumber("rebaselines", r.Rebaselines);
                w.WriteNumber("warnings", r.Warnings);
                JsonValues.NumberOrNull(w, "passes_found", r.PassesFound);
                JsonValues.NumberOrNull(w, "class_right", r.ClassRight);
                JsonValues.NumberOrNull(w, "false_events", r.FalseEvents);
                w.WriteEndObject();
            }

            w.WriteEndArray();
            w.WriteEndObject();
        }

        return Encoding.UTF8.GetString(stream.ToArray());
    }

    private static string N(long v) => v.ToString(CultureInfo.InvariantCulture);
}
