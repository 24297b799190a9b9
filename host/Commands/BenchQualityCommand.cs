using System.ComponentModel;
using System.Globalization;
using System.Text.Json;
using FreqReadout.Host.Bench;
using Spectre.Console;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout bench quality</c>: the tracking-quality bench (host/Bench/README.md). Simulates seeded scenes of every
/// drift kind and counting mode, replays each through the device pipeline as <c>replay</c> does and through two plain ways,
/// and prints one table per kind and way: targets found, classified right, false events, peak-shift error.
/// </summary>
public sealed class BenchQualityCommand : Command<BenchQualityCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
        [CommandOption("--seeds <SET>")]
        [Description("tune (the set to tune on), report (the set to report on once the design is frozen; default) or a master seed (a whole number).")]
        public string? Seeds { get; set; }

        [CommandOption("--quick")]
        [Description("The quick subset (16 targets per kind, 4 min drift-only per kind; for CI) instead of the full bench (400 targets and 5 h drift-only per kind).")]
        public bool Quick { get; set; }

        [CommandOption("--kinds <LIST>")]
        [Description("Comma-separated kinds to run: settling, ramp, onset, mains. Default all.")]
        public string? Kinds { get; set; }

        [CommandOption("--jobs <N>")]
        [Description("Scenes simulated at once, 1..64. Default: the number of processors.")]
        public int? Jobs { get; set; }

        [CommandOption("--json")]
        [Description("One JSON object on stdout: the table, the table by mode, and every scene with its draws and pass-by-pass results.")]
        public bool Json { get; set; }

        [CommandOption("--markdown")]
        [Description("Print the table as Markdown (as kept in the README).")]
        public bool Markdown { get; set; }

        [CommandOption("--save-json <FILE>")]
        [Description("Also write the --json object to FILE (whatever is printed). Default: none.")]
        public string? SaveJson { get; set; }

        [CommandOption("--quiet")]
        [Description("No progress on stderr.")]
        public bool Quiet { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        string seedSet;
        long master;
        string seeds = (settings.Seeds ?? "report").Trim().ToLowerInvariant();
        if (seeds == "report")
        {
            seedSet = "report";
            master = QualityBenchDefinition.ReportMasterSeed;
        }
        else if (seeds == "tune")
        {
            seedSet = "tune";
            master = QualityBenchDefinition.TuneMasterSeed;
        }
        else if (long.TryParse(seeds, NumberStyles.None, CultureInfo.InvariantCulture, out master))
        {
            seedSet = master.ToString(CultureInfo.InvariantCulture);
        }
        else
        {
            return CommandOutput.Fail($"--seeds must be tune, report or a master seed (a whole number >= 0), got '{settings.Seeds}'", CommandOutput.BadOption);
        }

        var kinds = new List<BenchKind>();
        if (settings.Kinds == null)
        {
            kinds.AddRange(Enum.GetValues<BenchKind>());
        }
        else
        {
            foreach (string part in settings.Kinds.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
            {
                if (!BenchNames.TryParseKind(part, out BenchKind kind))
                {
                    return CommandOutput.Fail($"--kinds takes settling, ramp, onset and mains separated by commas, got '{part}'", CommandOutput.BadOption);
                }

                if (!kinds.Contains(kind))
                {
                    kinds.Add(kind);
                }
            }

            if (kinds.Count == 0)
            {
                return CommandOutput.Fail("--kinds names no kind (settling, ramp, onset, mains)", CommandOutput.BadOption);
            }
        }

        int jobs = settings.Jobs ?? Environment.ProcessorCount;
        if (jobs < 1 || jobs > 64)
        {
            return CommandOutput.Fail($"--jobs must be a whole number from 1 to 64, got {jobs}", CommandOutput.BadOption);
        }

        if (settings.Json && settings.Markdown)
        {
            return CommandOutput.Fail("give --json or --markdown, not both", CommandOutput.BadOption);
        }

        QualityBenchSize size = settings.Quick ? QualityBenchSize.Quick : QualityBenchSize.Full;
        QualityBenchReport report;
        try
        {
            report = settings.Quiet
                ? QualityBench.Run(seedSet, master, size, kinds, jobs, null, cancellationToken)
                : RunWithProgress(seedSet, master, size, kinds, jobs, cancellationToken);
        }
        catch (InvalidOperationException e)
        {
            return CommandOutput.Fail(e.Message, 1);
        }

        if (settings.SaveJson != null)
        {
            try
            {
                File.WriteAllText(settings.SaveJson, ToJson(report) + "\n");
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                return CommandOutput.Fail($"{settings.SaveJson}: cannot write the JSON: {FileErrorText.Reason(settings.SaveJson, e)}", CommandOutput.BadOption);
            }
        }

        if (settings.Json)
        {
            Console.Out.WriteLine(ToJson(report));
        }
        else if (settings.Markdown)
        {
            Console.Out.Write(ToMarkdown(report));
        }
        else
        {
            Print(report);
        }

        return 0;
    }

    private static QualityBenchReport RunWithProgress(string seedSet, long master, QualityBenchSize size, List<BenchKind> kinds, int jobs, CancellationToken ct)
    {
        if (Console.IsErrorRedirected)
        {
            // One line per tenth done, so a long run in CI or a pipe is not silent.
            var clock = System.Diagnostics.Stopwatch.StartNew();
            int total = 0;
            int lastTenth = 0;
            var gate = new object();
            var reporter = new SyncProgress(n =>
            {
                lock (gate)
                {
                    if (n < 0)
                    {
                        total = -n;
                        Console.Error.WriteLine($"bench quality: {total} scenes on {jobs} cores");
                        return;
                    }

                    int tenth = total > 0 ? n * 10 / total : 10;
                    if (tenth > lastTenth)
                    {
                        lastTenth = tenth;
                        Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture, $"bench quality: {n}/{total} scenes, {clock.Elapsed.TotalSeconds:F0} s"));
                    }
                }
            });
            return QualityBench.Run(seedSet, master, size, kinds, jobs, reporter, ct);
        }

        QualityBenchReport? report = null;
        CommandOutput.Stderr().Progress()
            .AutoClear(true)
            .Columns(new TaskDescriptionColumn(), new ProgressBarColumn(), new PercentageColumn(), new ElapsedTimeColumn())
            .Start(ctx =>
            {
                ProgressTask task = ctx.AddTask("bench scenes", maxValue: 1.0);
                var reporter = new SyncProgress(n =>
                {
                    if (n < 0)
                    {
                        task.MaxValue = -n;
                    }
                    else
                    {
                        task.Value = n;
                    }
                });
                report = QualityBench.Run(seedSet, master, size, kinds, jobs, reporter, ct);
                task.Value = task.MaxValue;
            });
        return report!;
    }

    private static string F(double v, string format) => double.IsNaN(v) ? "-" : v.ToString(format, CultureInfo.InvariantCulture);

    private static string Percent(double? v) => v is double d ? (100 * d).ToString("0.0", CultureInfo.InvariantCulture) + " %" : "-";

    private static string[] Cells(QualityRow r, QualityBenchReport report)
    {
        string better = r.Way == BenchWay.Readout ? (report.ReadoutBetter(r.Kind) ? "yes" : "no") : string.Empty;
        return new[]
        {
            BenchNames.Of(r.Kind),
            BenchNames.Of(r.Way),
            r.Targets.ToString(CultureInfo.InvariantCulture),
            r.Found.ToString(CultureInfo.InvariantCulture),
            r.Right.ToString(CultureInfo.InvariantCulture),
            r.FalseInTargetScenes.ToString(CultureInfo.InvariantCulture),
            F(r.FalsePerHour, "0.0"),
            Percent(r.PeakErrorMedian),
            r.Score.ToString(CultureInfo.InvariantCulture),
            better,
        };
    }

    private static readonly string[] Headers =
    {
        "kind", "way", "targets", "found", "right", "false", "false/h", "peak err", "score", "better",
    };

    private const string Legend =
        "found / right: passes matched by an event / with the sign rule's class; false: events matching no pass in the scenes with targets; " +
        "false/h: events per hour of drift-only capture; peak err: median |found - truth| / truth peak shift; " +
        "score: right - all false events; better: the readout's score strictly above both plain ways' on that kind.";

    private static string Setup(QualityBenchReport r)
    {
        var ci = CultureInfo.InvariantCulture;
        QualityRow any = r.Rows[0];
        double low = r.Scenes.Min(s => s.Scene.GateNoisePpm);
        double high = r.Scenes.Max(s => s.Scene.GateNoisePpm);
        return string.Create(ci,
            $"seeds: {r.SeedSet} (master seed {r.MasterSeed}){(r.Quick ? ", quick subset" : string.Empty)}; {any.Targets} targets per kind (half of each class), " +
            $"{any.DriftOnlyHours:0.##} h drift-only per kind; gate noise {low:0.###}-{high:0.#} ppm; {r.Scenes.Count} scenes, " +
            $"{r.SimulatedSeconds / 3600:0.00} h simulated, {r.CaptureRows / 1e6:0.0} M rows, in {r.ElapsedSeconds:0} s with {r.Jobs} at once");
    }

    private static void Print(QualityBenchReport r)
    {
        Console.Out.WriteLine("Tracking-quality bench: invented scenes drawn from the simulator (not field data); definition in host/Bench/README.md.");
        Console.Out.WriteLine();

        // Plain fixed-width text (a Spectre table would wrap its cells on an 80-column or redirected console).
        var rows = new List<string[]> { Headers };
        rows.AddRange(r.Rows.Select(row => Cells(row, r)));
        int[] widths = Enumerable.Range(0, Headers.Length).Select(i => rows.Max(x => x[i].Length)).ToArray();
        foreach (string[] cells in rows)
        {
            string line = string.Join("  ", cells.Select((c, i) => i >= 2 && i <= 8 ? c.PadLeft(widths[i]) : c.PadRight(widths[i])));
            Console.Out.WriteLine(line.TrimEnd());
            if (ReferenceEquals(cells, Headers))
            {
                Console.Out.WriteLine(string.Join("  ", widths.Select(w => new string('-', w))));
            }
        }

        Console.Out.WriteLine();
        Console.Out.WriteLine(Setup(r) + ".");
        Console.Out.WriteLine(Legend);
        if (r.SeedSet == "tune")
        {
            Console.Out.WriteLine("These are the tuning seeds: report on --seeds report once the design is frozen.");
        }
    }

    /// <summary>The table as Markdown, with the setup line under it.</summary>
    public static string ToMarkdown(QualityBenchReport r)
    {
        var sb = new System.Text.StringBuilder();
        sb.Append("| ").Append(string.Join(" | ", Headers)).Append(" |\n");
        sb.Append('|').Append(string.Concat(Headers.Select((_, i) => i >= 2 && i <= 8 ? "---:|" : "---|"))).Append('\n');
        foreach (QualityRow row in r.Rows)
        {
            sb.Append("| ").Append(string.Join(" | ", Cells(row, r))).Append(" |\n");
        }

        sb.Append('\n').Append(Setup(r)).Append(". ").Append(Legend).Append('\n');
        return sb.ToString();
    }

    /// <summary>The whole run as one JSON object (snake_case keys with units).</summary>
    public static string ToJson(QualityBenchReport r)
    {
        var buffer = new System.Buffers.ArrayBufferWriter<byte>(1 << 16);
        using (var json = new Utf8JsonWriter(buffer, ReplayCommand.JsonOptions))
        {
            json.WriteStartObject();
            json.WriteString("bench", "quality");
            json.WriteString("seed_set", r.SeedSet);
            json.WriteNumber("master_seed", r.MasterSeed);
            json.WriteBoolean("quick", r.Quick);
            json.WriteNumber("jobs", r.Jobs);
            json.WriteNumber("elapsed_s", Math.Round(r.ElapsedSeconds, 3));
            json.WriteNumber("simulated_s", Math.Round(r.SimulatedSeconds, 3));
            json.WriteNumber("capture_rows", r.CaptureRows);
            json.WriteStartArray("kinds");
            foreach (BenchKind kind in r.Rows.Select(x => x.Kind).Distinct())
            {
                json.WriteStartObject();
                json.WriteString("kind", BenchNames.Of(kind));
                json.WriteBoolean("readout_better", r.ReadoutBetter(kind));
                json.WriteStartArray("ways");
                foreach (QualityRow row in r.Rows.Where(x => x.Kind == kind))
                {
                    WriteRow(json, row);
                }

                json.WriteEndArray();
                json.WriteStartArray("modes");
                foreach (BenchMode mode in Enum.GetValues<BenchMode>())
                {
                    json.WriteStartObject();
                    json.WriteString("mode", BenchNames.Of(mode));
                    json.WriteStartArray("ways");
                    foreach (QualityRow row in r.ModeRows.Where(x => x.Kind == kind && x.Mode == mode))
                    {
                        WriteRow(json, row);
                    }

                    json.WriteEndArray();
                    json.WriteEndObject();
                }

                json.WriteEndArray();
                json.WriteEndObject();
            }

            json.WriteEndArray();
            json.WriteStartArray("scenes");
            foreach (BenchSceneOutcome s in r.Scenes)
            {
                WriteScene(json, s);
            }

            json.WriteEndArray();
            json.WriteEndObject();
        }

        return System.Text.Encoding.UTF8.GetString(buffer.WrittenSpan);
    }

    private static void WriteRow(Utf8JsonWriter json, QualityRow row)
    {
        json.WriteStartObject();
        json.WriteString("way", BenchNames.Of(row.Way));
        json.WriteNumber("targets", row.Targets);
        json.WriteNumber("found", row.Found);
        json.WriteNumber("right", row.Right);
        json.WriteNumber("false_in_target_scenes", row.FalseInTargetScenes);
        json.WriteNumber("false_in_drift_only", row.FalseInDriftOnly);
        JsonValues.NumberOrNull(json, "drift_only_h", row.DriftOnlyHours);
        JsonValues.NumberOrNull(json, "false_per_h", row.FalsePerHour);
        JsonValues.NumberOrNull(json, "peak_error_median", row.PeakErrorMedian ?? double.NaN);
        json.WriteNumber("score", row.Score);
        JsonValues.NumberOrNull(json, "gate_noise_ppm_low", row.GateNoisePpmLow);
        JsonValues.NumberOrNull(json, "gate_noise_ppm_high", row.GateNoisePpmHigh);
        json.WriteEndObject();
    }

    private static void WriteScene(Utf8JsonWriter json, BenchSceneOutcome s)
    {
        BenchScene b = s.Scene;
        json.WriteStartObject();
        json.WriteString("name", b.Key.Name);
        json.WriteNumber("seed", b.Key.Seed);
        json.WriteString("kind", BenchNames.Of(b.Key.Kind));
        json.WriteString("mode", BenchNames.Of(b.Key.Mode));
        json.WriteBoolean("drift_only", b.Key.DriftOnly);
        json.WriteNumber("duration_s", s.DurationSeconds);
        json.WriteNumber("rows", s.Rows);
        json.WriteNumber("search_hz", b.Scene.Oscillator.FrequencyHz ?? double.NaN);
        json.WriteNumber("clock_hz", b.Scene.Hardware.ClockHz);
        json.WriteNumber("coil_diameter_m", b.Scene.Coil.MeanDiameterM);
        json.WriteNumber("gate_noise_hz", b.GateNoiseHz);
        json.WriteNumber("gate_noise_ppm", b.GateNoisePpm);
        json.WriteString("drift", BenchNames.Of(b.Drift));
        json.WriteNumber("rate_ppm_per_s", b.RatePpmPerS);
        JsonValues.NumberOrNull(json, "tau_s", b.TauSeconds);
        JsonValues.NumberOrNull(json, "onset_s", b.OnsetSeconds);
        JsonValues.NumberOrNull(json, "mains_ppm", b.Scene.Mains?.DeviationPpm ?? double.NaN);
        JsonValues.NumberOrNull(json, "mains_hz", b.Scene.Mains?.FrequencyHz ?? double.NaN);
        json.WriteNumber("elapsed_s", Math.Round(s.ElapsedSeconds, 3));
        json.WriteStartArray("ways");
        foreach (BenchWayOutcome w in s.Ways)
        {
            json.WriteStartObject();
            json.WriteString("way", BenchNames.Of(w.Way));
            json.WriteNumber("found", w.Found);
            json.WriteNumber("right", w.Right);
            json.WriteNumber("false_events", w.FalseEvents);
            json.WriteNumber("rebaselines", w.Rebaselines);
            json.WriteStartArray("false_event_peaks_s");
            foreach (var e in w.Match.Unmatched)
            {
                json.WriteNumberValue(e.Event.PeakSeconds);
            }

            json.WriteEndArray();
            json.WriteEndObject();
        }

        json.WriteEndArray();
        json.WriteStartArray("passes");
        for (int i = 0; i < s.Passes.Count; i++)
        {
            BenchPass p = s.Passes[i];
            BenchTargetPlan plan = b.Targets[p.Index];
            json.WriteStartObject();
            json.WriteString("target", p.Target);
            json.WriteString("material", plan.Material);
            json.WriteString("material_class", p.MaterialClass);
            json.WriteString("sign_rule_class", p.SignRuleClass);
            json.WriteNumber("radius_m", plan.Placement.RadiusM);
            json.WriteNumber("depth_m", plan.Placement.DepthM);
            json.WriteNumber("pass_s", plan.PassSeconds);
            json.WriteNumber("start_s", p.StartSeconds);
            json.WriteNumber("end_s", p.EndSeconds);
            json.WriteNumber("peak_s", p.PeakSeconds);
            json.WriteNumber("peak_shift_hz", p.PeakShiftHz);
            json.WriteNumber("peak_noise", p.PeakNoise);
            json.WriteNumber("drawn_peak_noise", plan.PeakNoise);
            foreach (BenchWayOutcome w in s.Ways)
            {
                var m = w.Match.Matches.Single(x => x.Pass == p.Index);
                json.WriteStartObject(BenchNames.Of(w.Way).Replace('-', '_'));
                json.WriteBoolean("found", m.Event != null);
                if (m.Event != null)
                {
                    json.WriteString("class", m.Event.ClassName);
                    json.WriteNumber("peak_s", m.Event.Event.PeakSeconds);
                    json.WriteNumber("peak_shift_hz", m.Event.Event.PeakShiftHz);
                }

                json.WriteEndObject();
            }

            json.WriteEndObject();
        }

        json.WriteEndArray();
        json.WriteStartArray("readout_warnings");
        foreach (string w in s.Readout.Warnings)
        {
            json.WriteStringValue(w);
        }

        json.WriteEndArray();
        json.WriteEndObject();
    }

    /// <summary>An <see cref="IProgress{T}"/> that reports on the calling thread (Progress&lt;T&gt; would post to a context).</summary>
    private sealed class SyncProgress : IProgress<int>
    {
        private readonly Action<int> _report;

        public SyncProgress(Action<int> report) => _report = report;

        public void Report(int value) => _report(value);
    }
}
