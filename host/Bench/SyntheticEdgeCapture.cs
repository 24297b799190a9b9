using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Bench;

/// <summary>
/// Writes an <b>invented</b> edge capture of any length quickly, for the speed bench (the simulator is far slower per
/// edge): a 100 kHz search oscillator behind a prescaler of 32 counted by an 80 MHz 32-bit timer, with a slow drift,
/// a pass of a target every 40 s (alternately raising and lowering the frequency) and timer quantisation.
/// It is a valid capture, not a model of any real detector: its only use is to time reading and replay.
/// </summary>
public static class SyntheticEdgeCapture
{
    /// <summary>Timer clock, Hz.</summary>
    public const double ClockHz = 80e6;

    /// <summary>Nominal search frequency, Hz.</summary>
    public const double SearchHz = 100e3;

    /// <summary>Prescaler before the timer.</summary>
    public const int Prescale = 32;

    /// <summary>The metadata of the capture.</summary>
    public static CaptureMetadata Metadata() => new()
    {
        ClockHz = ClockHz,
        Prescale = Prescale,
        TimerBits = 32,
        SearchHz = SearchHz,
        Note = "invented synthetic capture for the speed bench (drift, a target pass every 40 s)",
    };

    /// <summary>Writes <paramref name="edges"/> recorded edges to <paramref name="path"/> (replacing it).</summary>
    /// <param name="path">The capture file.</param>
    /// <param name="edges">Rows, at least 1.</param>
    /// <param name="format">Text or binary.</param>
    /// <param name="seed">Seed of the quantisation dither.</param>
    public static void Write(string path, long edges, CaptureFileFormat format, int seed = 1)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(edges, 1);
        var rng = new Random(seed);
        const ulong mask = uint.MaxValue;
        double t = 1000;
        using ICaptureWriter writer = CaptureFile.Create(path, Metadata(), format);
        for (long i = 0; i < edges; i++)
        {
            double seconds = t / ClockHz;
            double driftPpm = 20 * Math.Sin(seconds * 2 * Math.PI / 900) + (0.002 * seconds);
            double sinceMid = (seconds % 40) - 20;
            double passPpm = ((long)(seconds / 40) % 2 == 0 ? 60 : -60) * Math.Exp(-sinceMid * sinceMid / 0.18);
            double frequency = SearchHz * (1 + ((driftPpm + passPpm) * 1e-6));
            t += (Prescale * ClockHz / frequency) + (rng.NextDouble() - 0.5);
            writer.WriteRow(new CaptureRow(i + 1, (ulong)Math.Round(t) & mask, 0, null, null));
        }

        writer.Complete(Array.Empty<KeyValuePair<string, string>>());
    }
}
