using System.ComponentModel;
using System.Globalization;
using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Import;
using FreqReadout.Host.Output;
using Spectre.Console.Cli;

namespace FreqReadout.Host.Commands;

/// <summary>
/// <c>freqreadout import wav &lt;file&gt; --beat-side above|below --out CAPTURE [--channel N] [--search-hz HZ]</c>: an audio
/// recording of the beat note (a phone held to the headphones is enough) becomes an edge capture with
/// <c>signal = beat</c>: the tone's rising zero crossings (<see cref="ToneEdges"/>) stamped on a 1 GHz tick clock.
/// Stretches where the tone is lost are reported with their times. The recorder's own clock (tens of ppm) limits the
/// absolute frequency; shifts are not affected.
/// </summary>
public sealed class ImportWavCommand : Command<ImportWavCommand.Settings>
{
    /// <summary>Tick rate of the capture written: nanoseconds.</summary>
    public const double ClockHz = 1e9;

    public sealed class Settings : CommandSettings
    {
        [CommandArgument(0, "<file>")]
        [Description("The WAVE recording (PCM of 8, 16, 24 or 32 bits, or float; mono or any channel).")]
        [FilePath]
        public string Input { get; set; } = string.Empty;

        [CommandOption("--beat-side <SIDE>")]
        [Description("above or below: where the search oscillator is tuned against the reference (the sign of a shift depends on it). Required.")]
        public string? BeatSide { get; set; }

        [CommandOption("--channel <N>")]
        [Description("Channel to read, from 0. Default 0.")]
        public int? Channel { get; set; }

        [CommandOption("--search-hz <HZ>")]
        [Description("Nominal search-oscillator frequency, Hz, (0, 1e9]], written as the capture's search_hz for shifts in ppm. Default: none (the capture has no search_hz).")]
        public double? SearchHz { get; set; }

        [CommandOption("--out <CAPTURE>")]
        [Description("The capture to write (text; an existing file is replaced only when the import succeeds). Required.")]
        [FilePath]
        public string? Out { get; set; }

        [CommandOption("--json")]
        [Description("Also print what was imported as one JSON object on standard output (keys in docs/json-output.md).")]
        public bool Json { get; set; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        BeatSide side = settings.BeatSide switch { "above" => BeatSide.Above, "below" => BeatSide.Below, _ => BeatSide.None };
        if (side == BeatSide.None && settings.BeatSide != null)
        {
            return CommandOutput.Fail($"--beat-side must be above or below, got {Captures.TextExcerpt.Quote(settings.BeatSide)}", CommandOutput.BadOption);
        }

        if (side == BeatSide.None || settings.Out == null)
        {
            return CommandOutput.Fail("import wav needs --beat-side above|below and --out CAPTURE", CommandOutput.BadOption);
        }

        if (settings.Channel is int channel && channel < 0)
        {
            return CommandOutput.Fail($"--channel must be 0 or more, got {channel}", CommandOutput.BadOption);
        }

        if (settings.SearchHz is double s && !(s > 0 && s <= CaptureMetadata.MaxSearchHz))
        {
            return CommandOutput.Fail($"--search-hz must be > 0 and at most 1e9, got {s.ToString("R", CultureInfo.InvariantCulture)}", CommandOutput.BadOption);
        }

        using var outputs = new OutputFileSet();
        outputs.AddInput("the recording", settings.Input);
        OutputFile output = outputs.AddOutput("--out", settings.Out, "the capture");
        if (!outputs.TryPrepare(out OutputFileException? problem))
        {
            return CommandOutput.Fail(problem!.Message, problem.ExitCode);
        }

        try
        {
            WavAudio audio = WavAudio.Read(settings.Input, settings.Channel ?? 0);
            cancellationToken.ThrowIfCancellationRequested();
            ToneEdges tone = ToneEdges.Find(audio.Samples, audio.SampleRateHz, settings.Input);
            if (tone.EdgeSeconds.Count < 2)
            {
                return CommandOutput.Fail($"{settings.Input}: {tone.EdgeSeconds.Count} rising edge(s) of the tone; a capture needs at least 2", CommandOutput.BadInput);
            }

            var metadata = new CaptureMetadata
            {
                ClockHz = ClockHz,
                Kind = CaptureKind.Edges,
                TimerBits = 64,
                Signal = SignalKind.Beat,
                BeatSide = side,
                SearchHz = settings.SearchHz,
                Note = $"imported from {Path.GetFileName(settings.Input)} ({audio.SampleRateHz.ToString(CultureInfo.InvariantCulture)} Hz, {audio.BitsPerSample}-bit{(audio.IsFloat ? " float" : string.Empty)}, channel {settings.Channel ?? 0}): absolute frequency only as good as the recorder's clock",
            };
            long written = 0;
            using (ICaptureWriter writer = CaptureFile.Create(output.Stream, metadata, CaptureFileFormat.Text))
            {
                ulong last = 0;
                bool any = false;
                foreach (double t in tone.EdgeSeconds)
                {
                    ulong tick = (ulong)Math.Round(t * ClockHz);
                    if (any && tick <= last)
                    {
                        continue;
                    }

                    writer.WriteRow(new CaptureRow(0, tick, 0, null, null));
                    last = tick;
                    any = true;
                    written++;
                }

                writer.Complete(Array.Empty<KeyValuePair<string, string>>());
            }

            outputs.Commit();
            foreach (LostToneStretch stretch in tone.LostStretches)
            {
                CommandOutput.Diagnostic($"warning: {settings.Input}: tone lost at {stretch} (no edges taken there)");
            }

            if (settings.Json)
            {
                Console.Out.WriteLine(ToJson(settings, audio, tone, written));
            }

            CommandOutput.Diagnostic($"import: wrote {settings.Out}: {written} rising edges of a tone between {tone.LowestToneHz.ToString("0.#", CultureInfo.InvariantCulture)} and {tone.HighestToneHz.ToString("0.#", CultureInfo.InvariantCulture)} Hz; the recorder's clock (often tens of ppm off) limits the absolute frequency, shifts are not affected");
            return ExitCodes.Ok;
        }
        catch (WavFormatException e) when (e.OptionOutOfRange)
        {
            // A channel the recording does not have: the option is out of its range for this file (a usage problem).
            return CommandOutput.Fail(e.Message, CommandOutput.BadOption);
        }
        catch (WavFormatException e)
        {
            return CommandOutput.Fail(e.Message, CommandOutput.BadInput);
        }
        catch (OutputFileException e)
        {
            return CommandOutput.Fail(e.Message, e.ExitCode);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            return CommandOutput.Fail($"{settings.Input}: {FileErrorText.Reason(settings.Input, e)}", CommandOutput.BadInput);
        }
    }

    /// <summary>The summary of <c>--json</c> (docs/json-output.md, keys: import wav).</summary>
    private static string ToJson(Settings settings, WavAudio audio, ToneEdges tone, long written)
    {
        return JsonValues.Document(w =>
        {
            w.WriteStartObject();
            w.WriteString("input", settings.Input);
            w.WriteString("out", settings.Out);
            w.WriteNumber("sample_rate_hz", audio.SampleRateHz);
            w.WriteNumber("bits_per_sample", audio.BitsPerSample);
            w.WriteBoolean("float", audio.IsFloat);
            w.WriteNumber("channel", settings.Channel ?? 0);
            w.WriteNumber("clock_hz", ClockHz);
            w.WriteNumber("edges", written);
            w.WriteNumber("lowest_tone_hz", tone.LowestToneHz);
            w.WriteNumber("highest_tone_hz", tone.HighestToneHz);
            w.WriteStartArray("lost");
            foreach (LostToneStretch stretch in tone.LostStretches)
            {
                w.WriteStartObject();
                w.WriteNumber("start_s", stretch.StartSeconds);
                w.WriteNumber("end_s", stretch.EndSeconds);
                w.WriteString("reason", stretch.Reason);
                w.WriteEndObject();
            }

            w.WriteEndArray();
            w.WriteEndObject();
        });
    }
}
