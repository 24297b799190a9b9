namespace FreqReadout.Host.Bench;

/// <summary>The timings of one case of the speed bench, all runs.</summary>
public sealed class SpeedCaseResult
{
    /// <summary>Starts an empty result.</summary>
    public SpeedCaseResult(SpeedCase speedCase)
    {
        Case = speedCase;
    }

    /// <summary>The case.</summary>
    public SpeedCase Case { get; }

    /// <summary>Wall-clock seconds of each run, in run order.</summary>
    public List<double> Seconds { get; } = new();

    /// <summary>Peak working set of each run, bytes (as the process itself reported it; 0 when it did not).</summary>
    public List<long> PeakWorkingSetBytes { get; } = new();

    /// <summary>Median of <see cref="Seconds"/> (mean of the middle two for an even count); NaN when empty.</summary>
    public double MedianSeconds => Median(Seconds);

    /// <summary>Largest peak working set over the runs, MiB; 0 when none was reported.</summary>
    public double PeakMiB => PeakWorkingSetBytes.Count == 0 ? 0 : PeakWorkingSetBytes.Max() / 1048576.0;

    /// <summary>Median of a list: the middle value after sorting (mean of the two middle ones for an even count); NaN for none.</summary>
    public static double Median(IReadOnlyList<double> values)
    {
        if (values.Count == 0)
        {
            return double.NaN;
        }

        var sorted = values.OrderBy(v => v).ToArray();
        int n = sorted.Length;
        return n % 2 == 1 ? sorted[n / 2] : 0.5 * (sorted[(n / 2) - 1] + sorted[n / 2]);
    }
}
