using System.ComponentModel;
using System.Globalization;
using System.Text;
using System.Text.Json;
using FreqReadout.Counting;
using FreqReadout.Host.Calibration;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Counting;
using FreqReadout.Host.Output;
using FreqReadout.Host.Replay;
using FreqReadout.Readout;
using FreqReadout.Settings;
using Spectre.Console;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout calibrate &lt;capture&gt; [--json]</c>: replays a capture with a <c>temp_c</c> column
/// through the readout pipeline without temperature compensation, averages the counted frequency of
/// the target-free readings between temperature samples, and fits the search oscillator's tempco
/// (ppm/K with its standard error, least squares, <see cref="TempcoCalibration"/>). The device takes
/// the number as its tempco_ppm_per_k setting; replay takes it as --tempco-ppm-per-k. Unless
/// --persistent-shift-s is given, calibrate uses 3 s, so that a temperature step is soon re-baselined
/// and the stretch after it counts as target-free again. With --settings-out it also writes a device settings file
/// (docs/settings-format.md) carrying the fitted tempco, through the same shared formatter the device reads.
/// </summary>
public sealed class CalibrateCommand : Command<CalibrateCommand.Settings>
{
    /// <summary>Below this temperature span the fit is flagged as weak.</summary>
    public const double MinUsefulSpanK = 1.0;

    /// <summary>persistent_shift_s used by calibrate unless given: longer than a coil pass, short enough that a temperature step soon becomes a new baseline.</summary>
    public const double DefaultPersistentShiftSeconds = 3.0;

    public sealed class Settings : ReadoutCommandSettings
    {
        [CommandOption("--settings-out <FILE>")]
        [Description("Also write a device settings file (docs/settings-format.md) with the fitted tempco and the capture's signal, beat side and search frequency, the gate and threshold as given here, every other key at its default; send it with `record --send-settings FILE`. Default: none.")]
        [FilePath]
        public string? SettingsOut { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        CounterSettings? options = settings.BuildOptions(out string? optionError);
        if (options == null)
        {
            return CommandOutput.Fail(optionError!, CommandOutput.BadOption);
        }

        using var outputs = new OutputFileSet { StandardOutputInUse = settings.Json };
        outputs.AddInput("the capture", settings.Capture);
        OutputFile? settingsFile = settings.SettingsOut != null ? outputs.AddOutput("--settings-out", settings.SettingsOut, "the device settings") : null;
        if (!outputs.TryPrepare(out OutputFileException? problem))
        {
            return CommandOutput.Fail(problem!.Message, problem.ExitCode);
        }

        int openError = CommandOutput.TryOpenCapture(settings.Capture, out ICaptureReader? opened);
        if (opened == null)
        {
            return openError;
        }

        ICaptureReader reader = opened;
        using (reader)
        {
            if (!reader.Metadata.HasTemperatureColumn)
            {
                return CommandOutput.Fail($"{reader.SourceName}: the capture has no temp_c column: nothing to calibrate against", CommandOutput.BadInput);
            }

            ReadoutSettings? readout = settings.BuildReadoutSettings(reader.Metadata, out string? readoutError);
            if (readout == null)
            {
                return CommandOutput.Fail(readoutError!, CommandOutput.BadOption);
            }

            ReadoutCommandSettings.ApplyBeatFloor(options, readout);

            // The fit needs the uncompensated frequencies; and a temperature step must not hide as a long
            // "target": unless told otherwise, a shift lasting longer than a coil pass is re-baselined soon.
            readout.TempcoPpmPerK = 0;

            if (settings.PersistentShiftSeconds == null)
            {
                readout.PersistentShiftSeconds = DefaultPersistentShiftSeconds;
            }
            int sourceExit = CommandOutput.TryCreateGateSource(reader, options, settings, readout.SearchHz > 0 ? readout.SearchHz : null, out CaptureGateSource? created);
            if (created == null)
            {
                return sourceExit;
            }

            CaptureGateSource source = created;

            ReplayReport report;
            var session = new ReplaySession(readout, reader.Metadata.StartedUtc);
            try
            {
                report = settings.WithIgnoredOptionWarnings(session.Run(source, cancellationToken), reader.Metadata);
            }
            catch (CaptureFormatException e)
            {
                return CommandOutput.Fail(e.Message, CommandOutput.BadInput);
            }

            foreach (string w in report.Warnings)
            {
                CommandOutput.Diagnostic("warning: " + w);
            }

            if (report.Gates == 0)
            {
                return CommandOutput.Fail($"{reader.SourceName}: {CountCommand.NoGateText(source)}", CommandOutput.BadInput);
            }

            if (!TempcoCalibration.TryFit(session.TempcoPoints, readout.Signal, readout.BeatSide, readout.SearchHz, out TempcoFitResult fit, out string? fitError))
            {
                return CommandOutput.Fail($"{reader.SourceName}: {fitError}", CommandOutput.BadInput);
            }

            double span = fit.MaxTemperatureC - fit.MinTemperatureC;
            if (span < MinUsefulSpanK)
            {
                CommandOutput.Diagnostic($"warning: the temperature spans only {Num(span, "0.###")} K: the tempco is poorly determined");
            }

            if (settingsFile != null)
            {
                // The device's settings as calibrated: the readout these gates ran with, its tempco the fitted one.
                readout.TempcoPpmPerK = fit.TempcoPpmPerK;
                int written = SettingsFileOutput.Write(outputs, settingsFile, settings.SettingsOut!, options, readout, out DeviceSettingsValues values);
                if (written != ExitCodes.Ok)
                {
                    return written;
                }

                CommandOutput.Diagnostic($"calibrate: wrote {settings.SettingsOut} (tempco_ppm_per_k = {values.TempcoPpmPerK.ToString("0.##", CultureInfo.InvariantCulture)}); send it with: freqreadout record --port DEV --send-settings {settings.SettingsOut}");
            }

            if (settings.Json)
            {
                Console.Out.WriteLine(ToJson(fit, reader.Metadata.Signal));
                Console.Out.Flush();
            }
            else
            {
                var console = CommandOutput.Stdout();
                var grid = new Grid().AddColumn().AddColumn();
                grid.AddRow("capture", Markup.Escape(reader.SourceName));
                grid.AddRow("tempco", $"{Num(fit.TempcoPpmPerK, "0.000")} ppm/K +- {Num(fit.StandardErrorPpmPerK, "0.000")} (1 standard error)");
                grid.AddRow("reference", $"{Num(fit.ReferenceHz, "0.###")} Hz (search oscillator)");
                grid.AddRow("temperature", $"{Num(fit.MinTemperatureC, "0.00")} to {Num(fit.MaxTemperatureC, "0.00")} deg C");
                grid.AddRow("points", $"{fit.Points} temperature samples, {fit.Readings} target-free readings");
                grid.AddRow("fit", $"R^2 {Num(fit.RSquared, "0.0000")}, residual {Num(fit.ResidualPpm, "0.000")} ppm");
                console.Write(grid);
                console.WriteLine();
                console.WriteLine($"use it: freqreadout replay <capture> --tempco-ppm-per-k {Num(fit.TempcoPpmPerK, "0.###")}  (device setting tempco_ppm_per_k)");
                console.WriteLine("The standard error assumes independent residuals; drift that is not caused by temperature but follows it over the run biases the fit.");
            }

            return 0;
        }
    }

    /// <summary>The fit as one JSON object.</summary>
    public static string ToJson(TempcoFitResult fit, SignalKind signal)
    {
        var buffer = new System.Buffers.ArrayBufferWriter<byte>(512);
        using (var json = new Utf8JsonWriter(buffer, ReplayCommand.JsonOptions))
        {
            json.WriteStartObject();
            json.WriteNumber("tempco_ppm_per_k", fit.TempcoPpmPerK);
            json.WriteNumber("standard_error_ppm_per_k", fit.StandardErrorPpmPerK);
            json.WriteNumber("reference_hz", fit.ReferenceHz);
            json.WriteString("signal", signal == SignalKind.Beat ? "beat" : "search");
            json.WriteNumber("min_temp_c", fit.MinTemperatureC);
            json.WriteNumber("max_temp_c", fit.MaxTemperatureC);
            json.WriteNumber("points", fit.Points);
            json.WriteNumber("readings", fit.Readings);
            if (double.IsFinite(fit.RSquared))
            {
                json.WriteNumber("r_squared", fit.RSquared);
            }
            else
            {
                json.WriteNull("r_squared");
            }

            json.WriteNumber("residual_ppm", fit.ResidualPpm);
            json.WriteEndObject();
        }

        return Encoding.UTF8.GetString(buffer.WrittenSpan);
    }

    private static string Num(double v, string f) => v.ToString(f, CultureInfo.InvariantCulture);
}
