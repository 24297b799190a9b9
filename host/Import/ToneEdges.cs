using System.Numerics;
using MathNet.Numerics.IntegralTransforms;

namespace FreqReadout.Host.Import;

/// <summary>
/// Edge times of a tone in an audio recording (the beat note of an analog detector, recorded with a phone):
/// <list type="number">
/// <item>windows of <see cref="WindowSamples"/> samples: the tone's frequency from the FFT peak of the Hann-windowed
/// samples (MathNet.Numerics), refined by a parabola through the log magnitudes of the peak bin and its neighbours
/// (common practice, no source), its level (RMS), clipping (samples at full scale) and a second tone (another peak, not a
/// harmonic, at least a third of the first);</item>
/// <item>a band-pass that follows the tone over its whole excursion: a biquad (R. Bristow-Johnson, "Cookbook formulae
/// for audio EQ biquad filter coefficients", constant 0 dB peak gain form; from memory) centred on the geometric mean
/// of the lowest and highest tone, its band from half the lowest to twice the highest;</item>
/// <item>rising zero crossings of the filtered signal with hysteresis (armed below -h, h a tenth of the filtered RMS),
/// each placed between its two samples by linear interpolation.</item>
/// </list>
/// Windows where the tone is lost (silence, clipping, a second tone) are listed with their times; crossings inside them
/// are left out, so a lost tone shows as a gap, never as nonsense.
/// </summary>
public sealed class ToneEdges
{
    /// <summary>Samples in one analysis window.</summary>
    public const int WindowSamples = 4096;

    private ToneEdges(IReadOnlyList<double> edgeSeconds, double lowHz, double highHz, IReadOnlyList<LostToneStretch> lost)
    {
        EdgeSeconds = edgeSeconds;
        LowestToneHz = lowHz;
        HighestToneHz = highHz;
        LostStretches = lost;
    }

    /// <summary>Times of the rising edges, s from the first sample.</summary>
    public IReadOnlyList<double> EdgeSeconds { get; }

    /// <summary>The lowest tone frequency seen in a good window, Hz.</summary>
    public double LowestToneHz { get; }

    /// <summary>The highest, Hz.</summary>
    public double HighestToneHz { get; }

    /// <summary>Stretches where the tone was lost, in time order.</summary>
    public IReadOnlyList<LostToneStretch> LostStretches { get; }

    /// <summary>Finds the tone's edges in <paramref name="samples"/> taken at <paramref name="sampleRateHz"/>.</summary>
    /// <exception cref="WavFormatException">No window holds a clear tone.</exception>
    public static ToneEdges Find(double[] samples, double sampleRateHz, string sourceName)
    {
        int windows = samples.Length / WindowSamples;
        if (windows < 1)
        {
            throw new WavFormatException($"{sourceName}: {samples.Length} samples; at least {WindowSamples} ({WindowSamples / sampleRateHz:0.###} s) needed");
        }

        var rms = new double[windows];
        var tone = new double[windows];
        var why = new string?[windows];
        var hann = new double[WindowSamples];
        for (int i = 0; i < WindowSamples; i++)
        {
            hann[i] = 0.5 - (0.5 * Math.Cos(2 * Math.PI * i / (WindowSamples - 1)));
        }

        var spectrum = new Complex[WindowSamples];
        var magnitude = new double[WindowSamples / 2];
        for (int w = 0; w < windows; w++)
        {
            int start = w * WindowSamples;
            double sum = 0;
            int clipped = 0;
            for (int i = 0; i < WindowSamples; i++)
            {
                double s = samples[start + i];
                sum += s * s;
                clipped += Math.Abs(s) >= 0.999 ? 1 : 0;
                spectrum[i] = new Complex(s * hann[i], 0);
            }

            rms[w] = Math.Sqrt(sum / WindowSamples);
            Fourier.Forward(spectrum, FourierOptions.Matlab);
            int peak = 1;
            for (int k = 1; k < magnitude.Length; k++)
            {
                magnitude[k] = spectrum[k].Magnitude;
                if (magnitude[k] > magnitude[peak])
                {
                    peak = k;
                }
            }

            tone[w] = Refine(magnitude, peak) * sampleRateHz / WindowSamples;
            if (clipped > 0)
            {
                why[w] = "clipping";
            }
            else if (SecondTone(magnitude, peak))
            {
                why[w] = "a second tone";
            }
        }

        double[] sorted = rms.OrderBy(r => r).ToArray();
        double typical = sorted[sorted.Length / 2];
        for (int w = 0; w < windows; w++)
        {
            // A window far quieter than the typical one is silence whatever its spectrum: in digital silence (all zeros)
            // or a noise floor every bin is alike, which the second-tone test would otherwise call "a second tone".
            if (why[w] != "clipping" && rms[w] < 0.1 * typical)
            {
                why[w] = "silence";
            }
        }

        var good = Enumerable.Range(0, windows).Where(w => why[w] == null).Select(w => tone[w]).ToList();
        if (good.Count == 0 || typical <= 0)
        {
            throw new WavFormatException($"{sourceName}: no clear tone in any {WindowSamples / sampleRateHz:0.###} s window (silence, clipping or more than one tone throughout)");
        }

        double low = good.Min();
        double high = good.Max();
        double[] filtered = BandPass(samples, sampleRateHz, low / 2, Math.Min(high * 2, sampleRateHz * 0.45));
        double filteredRms = Math.Sqrt(filtered.Average(v => v * v));
        double h = 0.1 * filteredRms;
        var edges = new List<double>();
        bool armed = false;
        for (int i = 1; i < filtered.Length; i++)
        {
            int w = Math.Min(i / WindowSamples, windows - 1);
            if (why[w] != null)
            {
                armed = false;
                continue;
            }

            if (filtered[i] < -h)
            {
                armed = true;
            }
            else if (armed && filtered[i - 1] < 0 && filtered[i] >= 0)
            {
                double fraction = filtered[i - 1] / (filtered[i - 1] - filtered[i]);
                edges.Add((i - 1 + fraction) / sampleRateHz);
                armed = false;
            }
        }

        var lost = new List<LostToneStretch>();
        for (int w = 0; w < windows; w++)
        {
            if (why[w] == null)
            {
                continue;
            }

            int end = w;
            while (end + 1 < windows && why[end + 1] == why[w])
            {
                end++;
            }

            lost.Add(new LostToneStretch(w * WindowSamples / sampleRateHz, (end + 1) * WindowSamples / sampleRateHz, why[w]!));
            w = end;
        }

        return new ToneEdges(edges, low, high, lost);
    }

    private static double Refine(double[] magnitude, int peak)
    {
        if (peak <= 0 || peak >= magnitude.Length - 1 || magnitude[peak - 1] <= 0 || magnitude[peak + 1] <= 0)
        {
            return peak;
        }

        double a = Math.Log(magnitude[peak - 1]);
        double b = Math.Log(magnitude[peak]);
        double c = Math.Log(magnitude[peak + 1]);
        double denominator = a - (2 * b) + c;
        return denominator == 0 ? peak : peak + (0.5 * (a - c) / denominator);
    }

    private static bool SecondTone(double[] magnitude, int peak)
    {
        // The largest bin away from the peak (more than 3 bins) that is not near one of its harmonics.
        double second = 0;
        for (int k = 1; k < magnitude.Length; k++)
        {
            if (Math.Abs(k - peak) <= 3)
            {
                continue;
            }

            double ratio = (double)k / peak;
            if (Math.Abs(ratio - Math.Round(ratio)) * peak <= 3 && Math.Round(ratio) >= 2)
            {
                continue;    // a harmonic: the tone's own shape, not a second tone
            }

            second = Math.Max(second, magnitude[k]);
        }

        return second >= magnitude[peak] / 3;
    }

    private static double[] BandPass(double[] x, double rate, double lowHz, double highHz)
    {
        double centre = Math.Sqrt(lowHz * highHz);
        double q = centre / (highHz - lowHz);
        double w0 = 2 * Math.PI * centre / rate;
        double alpha = Math.Sin(w0) / (2 * q);
        double a0 = 1 + alpha;
        double b0 = alpha / a0;
        double b2 = -alpha / a0;
        double a1 = -2 * Math.Cos(w0) / a0;
        double a2 = (1 - alpha) / a0;
        var y = new double[x.Length];
        double x1 = 0, x2 = 0, y1 = 0, y2 = 0;
        for (int i = 0; i < x.Length; i++)
        {
            double v = (b0 * x[i]) + (b2 * x2) - (a1 * y1) - (a2 * y2);
            x2 = x1;
            x1 = x[i];
            y2 = y1;
            y1 = v;
            y[i] = v;
        }

        return y;
    }
}
