using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Stability;

/// <summary>
/// The phase record of an edge capture: the time error of each recorded edge against a perfect clock at the capture's
/// mean rate, x_k = (t_k - t_0) - k T with T = (t_K - t_0) / K the mean interval, in seconds, spaced tau0 = T. When the
/// capture has more than <see cref="MaxPoints"/> edges, every d-th edge is kept (tau0 = d T). Ticks are unwrapped at the
/// capture's timer width; the timer's tick quantises x (a white-PM floor of about one tick).
/// </summary>
public sealed class EdgePhase
{
    /// <summary>Most phase points kept (memory: 8 bytes each).</summary>
    public const int MaxPoints = 4_000_000;

    private EdgePhase(double[] x, double tau0Seconds, double countedHz, long edges)
    {
        X = x;
        Tau0Seconds = tau0Seconds;
        CountedHz = countedHz;
        Edges = edges;
    }

    /// <summary>Phase points, s.</summary>
    public double[] X { get; }

    /// <summary>Spacing, s.</summary>
    public double Tau0Seconds { get; }

    /// <summary>Mean frequency of the counted signal (before the prescaler), Hz.</summary>
    public double CountedHz { get; }

    /// <summary>Edges read.</summary>
    public long Edges { get; }

    /// <summary>Reads an edge capture; false with the reason when it is not one or has fewer than 3 edges.</summary>
    public static bool TryRead(ICaptureReader reader, out EdgePhase? phase, out string? error)
    {
        phase = null;
        CaptureMetadata meta = reader.Metadata;
        if (meta.Kind != CaptureKind.Edges)
        {
            error = $"{reader.SourceName}: stability needs edge timestamps; a pulse-counter capture's phase is known only to whole counts at each read, and its regression gates give a different statistic (the parabolic variance), so it is not analysed";
            return false;
        }

        ulong mask = meta.TimerBits >= 64 ? ulong.MaxValue : (1UL << meta.TimerBits) - 1;
        var ticks = new List<long>();
        ulong last = 0;
        long unwrapped = 0;
        bool first = true;
        foreach (CaptureRow row in reader.ReadRows())
        {
            if (!first)
            {
                unwrapped += (long)((row.Tick - last) & mask);
            }

            first = false;
            last = row.Tick;
            ticks.Add(unwrapped);
        }

        if (ticks.Count < 3)
        {
            error = $"{reader.SourceName}: {ticks.Count} edges; stability needs at least 3";
            return false;
        }

        int stride = (int)((ticks.Count + MaxPoints - 1) / MaxPoints);
        int points = ((ticks.Count - 1) / stride) + 1;
        double total = ticks[(points - 1) * stride];
        double meanTicks = total / (points - 1);    // per kept point
        var x = new double[points];
        for (int k = 0; k < points; k++)
        {
            x[k] = (ticks[k * stride] - (k * meanTicks)) / meta.ClockHz;
        }

        double tau0 = meanTicks / meta.ClockHz;
        double countedHz = stride * meta.Prescale / tau0;
        phase = new EdgePhase(x, tau0, countedHz, ticks.Count);
        error = null;
        return true;
    }
}
