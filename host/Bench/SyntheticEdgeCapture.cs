using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Bench;

/// <summary>
/// Writes an <b>invented</b> edge capture of any length quickly, for the speed bench (the simulator is far slower per
/// edge): a 100 kHz search oscillator, every cycle (or every prescale-th) time-stamped by an 80 MHz 32-bit timer, with
/// a slow drift, a pass of a target every 10 s (alternately raising and lowering the frequency by 60 ppm) and timer
/// quantisation.
/// It is a valid capture, not a model of any real detector: its only use is to time reading and replay.
/// </summary>
public static class SyntheticEdgeCapture
{
    /// <summary>Timer clock, Hz.</summary>
    public const double ClockHz = 80e6;

    /// <summary>Nominal search frequency, Hz.</summary>
    public const double SearchHz = 100e3;

    /// <summary>The metadata of the capture.</summary>
    public static CaptureMetadata Metadata(int prescale) => new()
    {
        ClockHz = ClockHz,
        Prescale = prescale,
        TimerBits = 32,
        SearchHz = SearchHz,
        Note = "invented synthetic capture for the speed bench (drift, a target pass every 10 s)",
    };

    /// <summary>Writes <paramref name="edges"/> recorded edges to <paramref name="path"/> (replacing it).</summary>
    /// <param name="path">The capture file.</param>
    /// <param name="edges">Rows, at least 1.</param>
    /// <param name="format">Text or binary.</param>
    /// <param name="prescale">Cycles per recorded edge, [1, 1024] (1: 100 000 edges per second).</param>
    /// <param name="seed">Seed of the quantisation dither.</param>
    public static void Write(string path, long edges, CaptureFileFormat format, int prescale = 1, int seed = 1)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(edges, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(prescale, 1);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(prescale, 1024);
        var rng = new Random(seed);
        const ulong mask = uint.MaxValue;
        double t = 1000;
        using ICaptureWriter writer = CaptureFile.Create(path, Metadata(prescale), format);
        for (long i = 0; i < edges; i++)
        {
            double seconds = t / ClockHz;
            double driftPpm = (20 * Math.Sin(seconds * 2 * Math.PI / 300)) + (0.01 * seconds);
            double sinceMid = (seconds % 10) - 5;
            double passPpm = ((long)(seconds / 10) % 2 == 0 ? 60 : -60) * Math.Exp(-sinceMid * sinceMid / 0.18);
            double frequency = SearchHz * (1 + ((driftPpm + passPpm) * 1e-6));
            t += (prescale * ClockHz / frequency) + (rng.NextDouble() - 0.5);
            writer.WriteRow(new CaptureRow(i + 1, (ulong)Math.Round(t) & mask, 0, null, null));
        }

        writer.Complete(Array.Empty<KeyValuePair<string, string>>());
    }
}
