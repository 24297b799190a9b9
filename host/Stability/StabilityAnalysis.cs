namespace FreqReadout.Host.Stability;

/// <summary>
/// Stability of a phase record over averaging times in octave steps (m = 1, 2, 4, ... while 2m + 1 &lt;= N): the
/// overlapping and the modified Allan deviation (<see cref="AllanStatistics"/>), the noise type from the local slope of
/// the modified deviation (log-log slope to the nearest of -3/2 white PM, -1 flicker PM, -1/2 white FM, 0 flicker FM,
/// +1/2 random-walk FM, within 1/4, from m = 2 on; the modified deviation tells white from flicker phase noise, which the Allan
/// deviation cannot: NIST SP 1065 section 5.2, from memory), and the 68.3 % interval of each Allan deviation from the
/// edf of that noise type (<see cref="AllanConfidence"/>).
/// </summary>
public sealed class StabilityAnalysis
{
    /// <summary>Confidence of the intervals: one standard deviation of a normal distribution.</summary>
    public const double Confidence = 0.683;

    private StabilityAnalysis(double tau0Seconds, long points, IReadOnlyList<StabilityPoint> rows)
    {
        Tau0Seconds = tau0Seconds;
        Points = points;
        Rows = rows;
    }

    /// <summary>Spacing of the phase points, s.</summary>
    public double Tau0Seconds { get; }

    /// <summary>Phase points analysed.</summary>
    public long Points { get; }

    /// <summary>One row per averaging time, shortest first.</summary>
    public IReadOnlyList<StabilityPoint> Rows { get; }

    /// <summary>Analyses phase data <paramref name="x"/> (s) spaced <paramref name="tau0Seconds"/>; empty rows when fewer than 3 points.</summary>
    public static StabilityAnalysis Of(IReadOnlyList<double> x, double tau0Seconds)
    {
        var ms = new List<int>();
        for (int m = 1; (2L * m) + 1 <= x.Count; m *= 2)
        {
            ms.Add(m);
        }

        double[] adev = ms.Select(m => AllanStatistics.OverlappingDeviation(x, tau0Seconds, m)).ToArray();
        double[] mdev = ms.Select(m => AllanStatistics.ModifiedDeviation(x, tau0Seconds, m)).ToArray();
        var rows = new List<StabilityPoint>(ms.Count);
        for (int k = 0; k < ms.Count; k++)
        {
            NoiseType noise = Identify(mdev, k, ms, x.Count);
            double edf = AllanConfidence.EquivalentDegreesOfFreedom(noise, x.Count, ms[k]);
            AllanConfidence.Interval(adev[k], edf, Confidence, out double low, out double high);
            rows.Add(new StabilityPoint(ms[k] * tau0Seconds, ms[k], adev[k], low, high, mdev[k], edf, noise));
        }

        return new StabilityAnalysis(tau0Seconds, x.Count, rows);
    }

    /// <summary>The row with the smallest Allan deviation among averaging times at most <paramref name="maxTauSeconds"/>; null when none.</summary>
    public StabilityPoint? Lowest(double maxTauSeconds = double.PositiveInfinity) =>
        Rows.Where(r => r.TauSeconds <= maxTauSeconds && !double.IsNaN(r.Adev)).OrderBy(r => r.Adev).FirstOrDefault();

    /// <summary>
    /// Spans of the longer averaging time the data must hold for its slope to name a noise type. Each deviation is
    /// uncertain by about 1/sqrt(2 edf) relative, so the log2 slope between two octaves by about 1/(ln 2 sqrt(edf));
    /// that stays inside the +-0.25 a type is given only while edf is over about 33, which white FM reaches at about
    /// 1.5 N/m > 24 spans (this derivation is the project's own). With fewer, the type is unknown and the interval uses
    /// white FM's degrees of freedom rather than a guessed type's, which for white PM would be far too many.
    /// </summary>
    public const int MinSpansToIdentify = 24;

    private static NoiseType Identify(double[] mdev, int k, List<int> ms, int points)
    {
        // Slope over the octave to the next point (the last point looks back). At m = 1 the modified deviation equals
        // the Allan deviation, and its ratio to it settles only from m = 2 on: the first point takes the next octave's.
        int a = k + 1 < mdev.Length ? Math.Max(k, 1) : k - 1;
        int b = a + 1;
        if (a < 0 || b >= mdev.Length || !(mdev[a] > 0) || !(mdev[b] > 0) || points / ms[b] < MinSpansToIdentify)
        {
            return NoiseType.Unknown;
        }

        double slope = Math.Log(mdev[b] / mdev[a]) / Math.Log(2);
        (double Slope, NoiseType Type)[] types =
        {
            (-1.5, NoiseType.WhitePhase), (-1.0, NoiseType.FlickerPhase), (-0.5, NoiseType.WhiteFrequency),
            (0.0, NoiseType.FlickerFrequency), (0.5, NoiseType.RandomWalkFrequency),
        };
        foreach ((double s, NoiseType type) in types)
        {
            if (Math.Abs(slope - s) <= 0.25)
            {
                return type;
            }
        }

        return NoiseType.Unknown;
    }
}
