using System.Numerics;
using FreqReadout.Host.Captures;
using FreqReadout.Tests.Commands;
using MathNet.Numerics.IntegralTransforms;

namespace FreqReadout.Tests.Import;

/// <summary>
/// <c>import wav</c> on invented tones written in every sample format: the frequency from the crossings agrees with an
/// FFT peak (MathNet.Numerics) refined by interpolation, and with the tone generated; a lost tone (silence, clipping, a
/// second tone) is reported with its times and leaves a gap instead of edges.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ImportWavTests : IDisposable
{
    private const int Rate = 48000;

    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-wav-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private (List<ulong> Ticks, CaptureMetadata Meta, string Error) Import(byte[] wav, params string[] more)
    {
        string input = Path.Combine(_dir, Guid.NewGuid().ToString("N") + ".wav");
        string output = input + ".csv";
        File.WriteAllBytes(input, wav);
        var (exit, _, error) = ConsoleCapture.Run(new[] { "import", "wav", input, "--beat-side", "above", "--out", output }.Concat(more).ToArray());
        Assert.True(exit == 0, error);
        using ICaptureReader reader = CaptureFile.Open(output);
        return (reader.ReadRows().Select(r => r.Tick).ToList(), reader.Metadata, error);
    }

    private static double CrossingHz(List<ulong> ticks) => (ticks.Count - 1) / ((ticks[^1] - ticks[0]) / 1e9);

    [Theory]
    [InlineData(8, false, false)]
    [InlineData(16, false, false)]
    [InlineData(24, false, true)]
    [InlineData(32, false, false)]
    [InlineData(32, true, false)]
    [InlineData(64, true, true)]
    public void Every_sample_format_gives_the_tone_s_frequency(int bits, bool isFloat, bool extensible)
    {
        const double hz = 723.4;
        double[] tone = WavBuilder.Tone(hz, 3, Rate, 0.02, bits);
        var (ticks, meta, _) = Import(WavBuilder.Build(new[] { tone }, Rate, bits, isFloat, extensible, extraChunks: true));
        Assert.Equal(FreqReadout.Counting.SignalKind.Beat, meta.Signal);
        Assert.Equal(1e9, meta.ClockHz);
        // 8-bit quantisation is coarse: crossings still average out over 2000 cycles.
        Assert.InRange(CrossingHz(ticks), hz - 0.02, hz + 0.02);
    }

    [Theory]
    [InlineData("--channel", "-1", "--channel must be 0 or more, got -1")]
    [InlineData("--channel", "2", "has 2 channel(s); --channel must be 0 to 1")]
    [InlineData("--beat-side", "sideways", "--beat-side must be above or below, got 'sideways'")]
    public void An_option_out_of_its_range_is_a_usage_error_naming_it(string option, string value, string expected)
    {
        string wav = Path.Combine(_dir, "stereo.wav");
        File.WriteAllBytes(wav, WavBuilder.Build(new[] { WavBuilder.Tone(500, 1, Rate, 0.01, 1), WavBuilder.Tone(900, 1, Rate, 0.01, 2) }, Rate, 16, false, false, false));
        var args = new List<string> { "import", "wav", wav, "--out", Path.Combine(_dir, "x.csv") };
        if (option != "--beat-side")
        {
            args.AddRange(new[] { "--beat-side", "above" });
        }

        args.AddRange(new[] { option, value });
        var (exit, _, error) = ConsoleCapture.Run(args.ToArray());
        Assert.Equal(2, exit);
        Assert.Contains(expected, error);
    }

    [Fact]
    public void The_chosen_channel_of_a_stereo_file_is_read()
    {
        double[] left = WavBuilder.Tone(500, 2, Rate, 0.01, 1);
        double[] right = WavBuilder.Tone(900, 2, Rate, 0.01, 2);
        var (ticks, _, _) = Import(WavBuilder.Build(new[] { left, right }, Rate, 16, false, false, false), "--channel", "1");
        Assert.InRange(CrossingHz(ticks), 899.98, 900.02);
    }

    [Fact]
    public void Crossings_agree_with_an_interpolated_fft_peak()
    {
        const double hz = 1234.56;
        double[] tone = WavBuilder.Tone(hz, 4, Rate, 0.05, 7);
        var (ticks, _, _) = Import(WavBuilder.Build(new[] { tone }, Rate, 16, false, false, false));

        // Reference: the FFT of the whole recording (Hann window, 65536-point zero-padded), its peak refined by a
        // parabola through the log magnitudes (common practice, no source): bins of 0.73 Hz, refined to a few mHz.
        int n = 1 << 18;
        var spectrum = new Complex[n];
        for (int i = 0; i < tone.Length; i++)
        {
            double w = 0.5 - (0.5 * Math.Cos(2 * Math.PI * i / (tone.Length - 1)));
            spectrum[i] = new Complex(tone[i] * w, 0);
        }

        Fourier.Forward(spectrum, FourierOptions.Matlab);
        int peak = Enumerable.Range(1, (n / 2) - 2).MaxBy(k => spectrum[k].Magnitude);
        double a = Math.Log(spectrum[peak - 1].Magnitude), b = Math.Log(spectrum[peak].Magnitude), c = Math.Log(spectrum[peak + 1].Magnitude);
        double fftHz = (peak + (0.5 * (a - c) / (a - (2 * b) + c))) * Rate / n;
        Assert.InRange(fftHz, hz - 0.01, hz + 0.01);
        Assert.InRange(CrossingHz(ticks), fftHz - 0.02, fftHz + 0.02);
    }

    [Fact]
    public void A_tone_that_moves_over_its_excursion_is_followed()
    {
        // A pass: the beat rises from 600 Hz to 680 Hz and back over 2 s (invented), integrated phase.
        int samples = 4 * Rate;
        var x = new double[samples];
        double phase = 0;
        for (int i = 0; i < samples; i++)
        {
            double t = (double)i / Rate;
            double f = 600 + (80 * Math.Exp(-Math.Pow((t - 2) / 0.4, 2)));
            phase += 2 * Math.PI * f / Rate;
            x[i] = 0.5 * Math.Sin(phase);
        }

        var (ticks, _, _) = Import(WavBuilder.Build(new[] { x }, Rate, 16, false, false, false));
        // Edge count = cycles of the integrated phase, within one.
        Assert.InRange(ticks.Count, (int)(phase / (2 * Math.PI)) - 2, (int)(phase / (2 * Math.PI)) + 1);
    }

    [Theory]
    [InlineData("silence")]
    [InlineData("clipping")]
    [InlineData("a second tone")]
    public void A_lost_tone_is_reported_with_its_times_and_gives_no_edges_there(string trouble)
    {
        double[] x = WavBuilder.Tone(700, 5, Rate, 0.01, 3, _ => 0.5);
        for (int i = 2 * Rate; i < 3 * Rate; i++)
        {
            double t = (double)i / Rate;
            x[i] = trouble switch
            {
                "silence" => 0.0005 * Math.Sin(2 * Math.PI * 700 * t),
                "clipping" => Math.Clamp(3 * Math.Sin(2 * Math.PI * 700 * t), -1, 1),
                _ => x[i] + (0.4 * Math.Sin(2 * Math.PI * 1130 * t)),
            };
        }

        var (ticks, _, error) = Import(WavBuilder.Build(new[] { x }, Rate, isFloat: true, bits: 32, extensible: false, extraChunks: false));
        // Lost stretches are found a window (4096 samples, 85 ms at 48 kHz) at a time.
        Assert.Contains($": {trouble} (no edges taken there)", error);
        Assert.True(System.Text.RegularExpressions.Regex.IsMatch(error, @"tone lost at (1\.9|2\.0)\d*-(2\.9|3\.0)\d* s"), error);
        Assert.DoesNotContain(ticks, t => t > 2.1e9 && t < 2.9e9);
        Assert.Contains(ticks, t => t > 3.2e9);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(0.0005)]
    public void Digital_silence_and_a_noise_floor_are_reported_as_silence(double noise)
    {
        // A recorder's pause: exact zeros (or a faint noise floor) for a second. Its spectrum is flat, so it must not be
        // reported as "a second tone" (it was, before the level test took precedence).
        double[] x = WavBuilder.Tone(700, 5, Rate, 0.01, 4, _ => 0.5);
        var random = new Random(5);
        for (int i = 2 * Rate; i < 3 * Rate; i++)
        {
            x[i] = noise * ((2 * random.NextDouble()) - 1);
        }

        var (ticks, _, error) = Import(WavBuilder.Build(new[] { x }, Rate, isFloat: true, bits: 32, extensible: false, extraChunks: false));
        Assert.Contains(": silence (no edges taken there)", error);
        Assert.DoesNotContain("a second tone", error);
        Assert.True(System.Text.RegularExpressions.Regex.IsMatch(error, @"tone lost at (1\.9|2\.0)\d*-(2\.9|3\.0|3\.1)\d* s: silence"), error);
        Assert.DoesNotContain(ticks, t => t > 2.1e9 && t < 2.9e9);
    }

    [Fact]
    public void Not_a_wave_file_names_what_was_expected()
    {
        string input = Path.Combine(_dir, "x.wav");
        File.WriteAllText(input, "hello, not audio");
        var (exit, _, error) = ConsoleCapture.Run("import", "wav", input, "--beat-side", "below", "--out", Path.Combine(_dir, "x.csv"));
        Assert.Equal(1, exit);
        Assert.Contains("not a WAVE file: expected 'RIFF' at byte 0 and 'WAVE' at byte 8", error);
    }
}
